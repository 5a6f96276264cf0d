/**
 * ES backtests, the duration test and the chi-square tail, each against an independent computation written here
 * from the published formula and, where a general library computes the same thing, against it: jstat 1.9.6 and
 * scipy 1.17 values kept in test/fixtures/backtests (runner.py beside them). fmin 0.0.4's Nelder–Mead is the
 * outside optimiser for the likelihood-ratio tests.
 */
import { jStat } from "../../../refs/jstat";
import { nelderMead } from "../../../refs/fmin";
import { expectClose } from "../check";
import fixture from "../../../fixtures/backtests/scipy_values.json";
import { normalCdf, normalQuantile } from "../../../../src/core/normal";
import { chiSquareSf } from "../../../../src/core/special/incompleteGamma";
import {
  shortfallZ,
  z2PValueFromLaws,
  z2PValueMatchedTails,
  Z2_CRITICAL_5,
} from "../../../../src/core/risk/backtests/shortfallZ";
import { exceedanceResiduals, exceedanceResidualTest } from "../../../../src/core/risk/backtests/exceedanceResiduals";
import { multinomialLevels, multinomialTest } from "../../../../src/core/risk/backtests/multinomial";
import { tailLikelihoodTest } from "../../../../src/core/risk/backtests/tailLikelihood";
import { shortfallTrafficLight } from "../../../../src/core/risk/backtests/shortfallLight";
import { durationSpells, durationTest } from "../../../../src/core/risk/backtests/duration";
import { backtestVar } from "../../../../src/core/risk/backtests/backtest";
import { runToEnd } from "../../../../src/core/work";
import { uniformStream } from "../../../../src/core/random";
import type { ForecastLaw } from "../../../../src/core/forecast/law";

describe("normal tails used by the ES traffic light and the tail LR", () => {
  test("Φ and Φ⁻¹ against scipy.stats.norm (fixture), 1e-14 relative / 1e-12 absolute", () => {
    for (const c of fixture.normal) {
      expectClose(`norm.cdf(${c.x})`, normalCdf(c.x), c.cdf, { rel: 1e-14 });
      expectClose(`norm.ppf(cdf(${c.x}))`, normalQuantile(c.cdf), c.ppf, { abs: 1e-12 });
    }
  });
});

describe("chi-square tail for any degrees of freedom", () => {
  test("against scipy.stats.chi2.sf (fixture) to 1e-12 relative", () => {
    for (const c of fixture.chi2) {
      if (c.sf < 1e-300) continue;
      expectClose(`chi2.sf(${c.x}, ${c.df})`, chiSquareSf(c.x, c.df), c.sf, { rel: 1e-12, abs: 1e-300 });
    }
  });
  test("against jstat.chisquare.cdf in the body (1 − cdf, 1e-9 absolute)", () => {
    for (const df of [1, 3, 4, 5.5, 10]) {
      for (const x of [0.2, 1, 3, 8, 12]) expectClose(`1-jstat(${x},${df})`, chiSquareSf(x, df), 1 - jStat.chisquare.cdf(x, df), { abs: 1e-9 });
    }
  });
  test("edges", () => {
    expect(chiSquareSf(0, 3)).toBe(1);
    expect(chiSquareSf(-1, 3)).toBe(1);
    expect(Number.isNaN(chiSquareSf(1, 0))).toBe(true);
    expect(chiSquareSf(Infinity, 3)).toBe(0);
  });
});

/** Z1, Z2 written from Acerbi & Szekely (2014), eqs. for Z1 and Z2, with returns X and positive VaR/ES. */
function zByHand(x: number[], v: number[], e: number[], alpha: number): { z1: number; z2: number } {
  let hits = 0;
  let s = 0;
  for (let t = 0; t < x.length; t++) {
    if (x[t] + v[t] < 0) {
      hits++;
      s += x[t] / e[t];
    }
  }
  return { z1: s / hits + 1, z2: s / (x.length * alpha) + 1 };
}

describe("Acerbi–Szekely Z1 and Z2", () => {
  const next = uniformStream(11);
  const T = 300;
  const x = Array.from({ length: T }, () => 2.2 * (next() - 0.5) * (next() < 0.1 ? 3 : 1));
  const v = Array.from({ length: T }, (_, t) => 1 + 0.2 * Math.sin(t / 9));
  const e = v.map((q) => 1.3 * q);
  test("match the paper's formulas written independently", () => {
    const got = shortfallZ(x, v, e, 0.975, "long")!;
    const want = zByHand(x, v, e, 0.025);
    expect(got.exceptions).toBeGreaterThan(3);
    expectClose("Z1", got.z1, want.z1, { rel: 1e-12 });
    expectClose("Z2", got.z2, want.z2, { rel: 1e-12 });
    expect(got.z2Reject5).toBe(want.z2 < -0.7);
  });
  test("short side is the long side of the negated returns; NaN rows are skipped", () => {
    const shortSide = shortfallZ(x.map((r) => -r), v, e, 0.975, "short")!;
    const longSide = shortfallZ(x, v, e, 0.975, "long")!;
    expect(shortSide.z2).toBe(longSide.z2);
    const gappy = shortfallZ([...x, NaN, 5], [...v, 1, NaN], [...e, 1, 1], 0.975)!;
    expect(gappy.observations).toBe(T);
    expect(gappy.z2).toBe(longSide.z2);
  });
  test("worked example: 10 rows, two exceptions", () => {
    // Losses 2 and 3 beyond VaR 1 with ES 1.5: Z1 = 1 − (2/1.5 + 3/1.5)/2 = −2/3; Z2 = 1 − (10/3)/(10·0.1).
    const r = shortfallZ([0, -2, 0, 0, -3, 0, 0, 0, 0, 0.5], Array(10).fill(1), Array(10).fill(1.5), 0.9)!;
    expectClose("Z1", r.z1, -2 / 3, { rel: 1e-14 });
    expectClose("Z2", r.z2, 1 - 10 / 3, { rel: 1e-14 });
    expect(Z2_CRITICAL_5).toBe(-0.7);
  });
  test("no exception: Z1 undefined (NaN), Z2 = 1", () => {
    const r = shortfallZ([0.1, 0.2], [1, 1], [2, 2], 0.975)!;
    expect(Number.isNaN(r.z1)).toBe(true);
    expect(r.z2).toBe(1);
  });
});

/** A Laplace(0, b) law: its lower tail is exactly exponential, so the matched-tail simulation is exact for it. */
function laplaceLaw(b: number): ForecastLaw {
  return {
    valueAtRisk: (c) => -b * Math.log(2 * (1 - c)),
    expectedShortfall: (c) => -b * Math.log(2 * (1 - c)) + b,
    cdf: (x) => (x < 0 ? 0.5 * Math.exp(x / b) : 1 - 0.5 * Math.exp(-x / b)),
  };
}

describe("simulated Z2 p-value", () => {
  const T = 250;
  const laws = Array.from({ length: T }, (_, t) => laplaceLaw(0.01 * (1 + 0.3 * Math.cos(t / 15))));
  const vars = laws.map((l) => l.valueAtRisk(0.975, "long"));
  const ess = laws.map((l) => l.expectedShortfall(0.975, "long"));
  test("exponential-tail laws: the matched-tail simulation reproduces the law-based one draw for draw", () => {
    const a = runToEnd(z2PValueFromLaws(-0.4, laws, 0.975, "long", 300, 7));
    const b = runToEnd(z2PValueMatchedTails(-0.4, vars, ess, 0.975, 300, 7));
    expect(b.pValue).toBe(a.pValue);
  });
  test("agrees with an independent simulation of Z2 under the laws (inverse cdf by bisection), ±3 MC s.e.", () => {
    const B = 2000;
    const got = runToEnd(z2PValueFromLaws(-0.4, laws, 0.975, "long", B, 3)).pValue;
    // Independent: draw returns from each law by bisection on its cdf, with an LCG stream (Numerical Recipes).
    let state = 12345;
    const lcg = () => {
      state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
      return (state + 0.5) / 4294967296;
    };
    let below = 0;
    for (let k = 0; k < B; k++) {
      let s = 0;
      for (let t = 0; t < T; t++) {
        const u = lcg();
        if (u >= 0.025) continue;
        let lo = -10;
        let hi = 0;
        for (let it = 0; it < 60; it++) {
          const mid = (lo + hi) / 2;
          if (laws[t].cdf(mid) < u) lo = mid;
          else hi = mid;
        }
        s += -lo / ess[t];
      }
      if (1 - s / (T * 0.025) <= -0.4) below++;
    }
    const want = below / B;
    const se = Math.sqrt((want * (1 - want)) / B);
    expectClose("p", got, want, { abs: 3 * Math.SQRT2 * se + 2 / B });
  });
});

describe("McNeil–Frey exceedance residuals", () => {
  test("residuals are (loss − ES)/(ES − VaR) on exception rows; an explicit scale replaces ES − VaR", () => {
    const r = exceedanceResiduals([-3, 0, -1.5, -0.5], [1, 1, 1, 1], [2, 2, 1, 2], "long");
    expect(Array.from(r.residuals)).toEqual([(3 - 2) / 1]);
    expect(r.unscaled).toBe(1);
    const s = exceedanceResiduals([-3, 0, -1.5], [1, 1, 1], [2, 2, 1], "long", [0.5, 1, 2]);
    expect(Array.from(s.residuals)).toEqual([2, 0.25]);
  });
  test("t-statistic by formula; bootstrap p-value near the Student-t one for normal residuals (n = 40)", () => {
    const next = uniformStream(5);
    const res = Array.from({ length: 40 }, () => jStat.normal.inv(next(), 0.25, 1));
    const got = runToEnd(exceedanceResidualTest(res, 4000, 9));
    const m = res.reduce((a, b) => a + b, 0) / res.length;
    const sd = Math.sqrt(res.reduce((a, b) => a + (b - m) ** 2, 0) / (res.length - 1));
    const t = m / (sd / Math.sqrt(res.length));
    expectClose("t", got.tStatistic, t, { rel: 1e-12 });
    // Student t with 39 df (jstat), one-sided; the bootstrap-t agrees to within a few hundredths at n = 40 (common practice).
    expectClose("p", got.pValue, 1 - jStat.studentt.cdf(t, 39), { abs: 0.03 });
  });
  test("reproducible from the seed; fewer than 2 residuals is not informative", () => {
    const res = [0.3, -0.2, 1.1, 0.4, 0.9];
    expect(runToEnd(exceedanceResidualTest(res, 500, 1)).pValue).toBe(runToEnd(exceedanceResidualTest(res, 500, 1)).pValue);
    expect(Number.isNaN(runToEnd(exceedanceResidualTest([1], 500, 1)).pValue)).toBe(true);
  });
});

describe("Kratz–Lok–McNeil multinomial test", () => {
  test("levels at α = 0.975 are 0.975, 0.98125, 0.9875, 0.99375 (KLM 2018, N = 4)", () => {
    const l = multinomialLevels(0.975);
    [0.975, 0.98125, 0.9875, 0.99375].forEach((w, j) => expectClose(`level ${j}`, l[j], w, { abs: 1e-15 }));
  });
  test("counts, Pearson statistic and both p-values by formula, jstat χ² and the exact variance of S", () => {
    const next = uniformStream(21);
    const pit = Array.from({ length: 500 }, () => next() * (next() < 0.05 ? 0.02 : 1));
    const got = multinomialTest(pit, 0.975, "long")!;
    const levels = [0.975, 0.98125, 0.9875, 0.99375];
    const counts = [0, 0, 0, 0, 0];
    for (const u of pit) counts[levels.filter((a) => 1 - u > a).length]++;
    expect([...got.counts]).toEqual(counts);
    const theta = [0.975, 0.00625, 0.00625, 0.00625, 0.00625];
    const s = counts.reduce((acc, o, j) => acc + (o - 500 * theta[j]) ** 2 / (500 * theta[j]), 0);
    expectClose("S", got.pearson, s, { rel: 1e-12 });
    expectClose("p", got.pValue, 1 - jStat.chisquare.cdf(s, 4), { abs: 1e-10 });
    const varS = 8 - 33 / 500 + theta.reduce((a, p) => a + 1 / p, 0) / 500;
    const c = 8 / varS;
    expectClose("Nass c", got.nassScale, c, { rel: 1e-12 });
    expectClose("Nass p", got.nassPValue, 1 - jStat.chisquare.cdf(c * s, 4 * c), { abs: 1e-9 });
  });
  test("the variance used by Nass's correction equals the exact variance of Pearson's S (enumeration, n = 7)", () => {
    // Exact moments of S over every multinomial outcome with n = 7 and the five cell probabilities.
    const theta = [0.6, 0.1, 0.1, 0.1, 0.1];
    const n = 7;
    const lf = (k: number) => jStat.gammaln(k + 1);
    let e1 = 0;
    let e2 = 0;
    for (let a = 0; a <= n; a++)
      for (let b = 0; a + b <= n; b++)
        for (let c = 0; a + b + c <= n; c++)
          for (let d = 0; a + b + c + d <= n; d++) {
            const o = [a, b, c, d, n - a - b - c - d];
            const lp = lf(n) + o.reduce((acc, k, j) => acc + k * Math.log(theta[j]) - lf(k), 0);
            const s = o.reduce((acc, k, j) => acc + (k - n * theta[j]) ** 2 / (n * theta[j]), 0);
            e1 += Math.exp(lp) * s;
            e2 += Math.exp(lp) * s * s;
          }
    const exactVar = e2 - e1 * e1;
    expectClose("E S", e1, 4, { rel: 1e-10 });
    // Same θ through the implementation: confidence 0.6, N = 4 gives θ = (0.6, 0.1, 0.1, 0.1, 0.1).
    const pit = Array.from({ length: n }, (_, i) => (i + 0.5) / n);
    const got = multinomialTest(pit, 0.6, "short", 4)!;
    expectClose("Var S", (2 * 4) / got.nassScale, exactVar, { rel: 1e-10 });
  });
});

/** Berkowitz's censored log-likelihood in (μ, σ), written directly with jstat's normal law. */
function berkowitzLogLik(z: number[], c: number, mu: number, sigma: number): number {
  let ll = 0;
  for (const v of z) ll += v < c ? Math.log(jStat.normal.pdf(v, mu, sigma)) : Math.log(1 - jStat.normal.cdf(c, mu, sigma));
  return ll;
}

describe("Berkowitz tail likelihood ratio", () => {
  test("LR, μ̂ and σ̂ against Nelder–Mead (fmin) on the likelihood written from the paper", () => {
    const next = uniformStream(31);
    // Returns whose tail is 1.4× too wide for the forecast: PIT = Φ(1.4·z) below the VaR level.
    const pit = Array.from({ length: 800 }, () => {
      const z = jStat.normal.inv(next(), 0, 1);
      return jStat.normal.cdf(z < -1 ? 1.4 * z + 0.4 : z, 0, 1);
    });
    const got = tailLikelihoodTest(pit, 0.95, "long")!;
    const c = jStat.normal.inv(0.05, 0, 1);
    const z = pit.map((u) => jStat.normal.inv(u, 0, 1));
    const nm = nelderMead((p) => -berkowitzLogLik(z, c, p[0], Math.exp(p[1])), [0, 0], { maxIterations: 4000, minErrorDelta: 1e-12 });
    const lr = 2 * (-nm.fx - berkowitzLogLik(z, c, 0, 1));
    expect(got.informative).toBe(true);
    expectClose("mu", got.mean, nm.x[0], { abs: 2e-4 });
    expectClose("sigma", got.sd, Math.exp(nm.x[1]), { abs: 2e-4 });
    expectClose("LR", got.statistic, lr, { abs: 1e-6, rel: 1e-6 });
    expectClose("p", got.pValue, Math.exp(-lr / 2), { abs: 1e-6 });
    expect(got.pValue).toBeLessThan(0.01);
  });
  test("short side mirrors the long side; too few tail points is not informative", () => {
    const next = uniformStream(2);
    const pit = Array.from({ length: 300 }, () => next());
    const a = tailLikelihoodTest(pit, 0.975, "long")!;
    const b = tailLikelihoodTest(pit.map((u) => 1 - u), 0.975, "short")!;
    expectClose("mirror", b.statistic, a.statistic, { rel: 1e-9, abs: 1e-12 });
    expect(tailLikelihoodTest([0.5, 0.6, 0.01], 0.975)!.informative).toBe(false);
  });
});

describe("Costanzino–Curran ES traffic light", () => {
  test("E H and Var H by numerical integration over a uniform PIT; Z and zone by formula", () => {
    const a = 0.025;
    let m1 = 0;
    let m2 = 0;
    const K = 200000;
    for (let i = 0; i < K; i++) {
      const v = (i + 0.5) / K;
      const h = v < a ? (a - v) / a : 0;
      m1 += h / K;
      m2 += (h * h) / K;
    }
    const next = uniformStream(8);
    const pit = Array.from({ length: 250 }, () => next() * (next() < 0.03 ? 0.01 : 1));
    const got = shortfallTrafficLight(pit, 0.975, "long")!;
    expectClose("E H", got.expectedRate, m1, { rel: 1e-8 });
    const hbar = pit.reduce((s, u) => s + (u < a ? (a - u) / a : 0), 0) / pit.length;
    const z = (Math.sqrt(250) * (hbar - m1)) / Math.sqrt(m2 - m1 * m1);
    expectClose("Z", got.z, z, { rel: 1e-6 });
    expectClose("Phi(Z)", got.cumulativeProbability, jStat.normal.cdf(z, 0, 1), { abs: 1e-9 });
    const want = got.cumulativeProbability >= 0.9999 ? "red" : got.cumulativeProbability >= 0.95 ? "yellow" : "green";
    expect(got.zone).toBe(want);
  });
});

/** The Weibull log-likelihood of Christoffersen & Pelletier (2004, eq. for ln L(D; Θ)) with censored first/last spells. */
function weibullLogLik(spells: Array<{ d: number; censored: boolean }>, a: number, b: number): number {
  let ll = 0;
  for (const s of spells) {
    const h = Math.pow(a * s.d, b);
    ll += s.censored ? -h : b * Math.log(a) + Math.log(b) + (b - 1) * Math.log(s.d) - h;
  }
  return ll;
}

describe("Christoffersen–Pelletier duration test", () => {
  test("spells: censored first and last spells, complete ones between", () => {
    const hits = [false, false, true, false, true, true, false];
    expect(durationSpells(hits)).toEqual([
      { d: 3, censored: true },
      { d: 2, censored: false },
      { d: 1, censored: false },
      { d: 1, censored: true },
    ]);
  });
  test("LR and Weibull shape against Nelder–Mead (fmin) on the full two-parameter likelihood", () => {
    const next = uniformStream(41);
    // Clustered exceptions: bursts after a hit.
    const hits: boolean[] = [];
    let hot = 0;
    for (let t = 0; t < 1500; t++) {
      const h = next() < (hot > 0 ? 0.25 : 0.01);
      hits.push(h);
      hot = h ? 5 : Math.max(0, hot - 1);
    }
    const got = durationTest(hits);
    const spells = durationSpells(hits);
    const full = nelderMead((p) => -weibullLogLik(spells, Math.exp(p[0]), Math.exp(p[1])), [Math.log(0.05), 0], { maxIterations: 5000, minErrorDelta: 1e-13 });
    const expo = nelderMead((p) => -weibullLogLik(spells, Math.exp(p[0]), 1), [Math.log(0.05), 0], { maxIterations: 5000, minErrorDelta: 1e-13 });
    const lr = 2 * (expo.fx - full.fx);
    expectClose("b", got.shape, Math.exp(full.x[1]), { rel: 1e-3 });
    expectClose("LR", got.statistic, lr, { abs: 1e-5, rel: 1e-5 });
    expectClose("p", got.pValue, 1 - jStat.chisquare.cdf(lr, 1), { abs: 1e-6 });
    expect(got.shape).toBeLessThan(1);
    expect(got.pValue).toBeLessThan(0.01);
  });
  test("fewer than 2 complete durations is not informative; BACKTEST carries the rows", () => {
    expect(durationTest([false, true, false, false, true]).informative).toBe(false);
    const bt = backtestVar([0, -3, 0, -3, 0, -3, 0, 0], Array(8).fill(1), 0.99)!;
    expect(bt.duration.durations).toBe(2);
    expect(bt.duration.informative).toBe(true);
  });
});
