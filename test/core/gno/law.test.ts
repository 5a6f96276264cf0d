/**
 * GNO law: independent references and properties.
 * - jstat 1.9.6 lognormal (accurate in its body) through the lognormal link of Hosking & Wallis 1997 App. A.8; values recomputed with mpmath (40 digits) outside the repo:
 *   k < 0: X = g + LN(μ, σ) with σ = −k, g = ξ + α/k, μ = ln(−α/k); k > 0: −X is such a law for (−ξ, α, −k).
 * - Adaptive Simpson integration of the density (total mass, mean, variance, CDF, PWM-based τ3/τ4 computed from
 *   pdf and cdf only, a different route from lmoments.ts which integrates the quantile).
 * - Common-practice facts, edges, invalid input, seeded draws with a KS check (1% asymptotic critical value 1.63/√n,
 *   Smirnov 1948 table, common practice), and fast-check properties over seeded random parameter sets.
 */
import fc from "fast-check";
import * as G from "../../../src/core/gno";
import { normalCdf, normalQuantile } from "../../../src/core/normal";
import { uniformStream } from "../../../src/core/random";
import { jStat } from "../../refs/jstat";
import { P, describeParams, expectAbs, expectRel } from "./helpers";
import { adaptiveSimpson, integratePieces } from "./integration";

const FC = { seed: 20240611, numRuns: 200 };
const shapes = [-2.5, -1, -0.3, -0.04, -1e-6, 0, 1e-6, 0.04, 0.3, 1, 2.5];

describe("GNO ↔ shifted lognormal (jstat, Hosking & Wallis 1997 App. A.8; values recomputed with mpmath (40 digits) outside the repo link)", () => {
  // jstat's lognormal goes through its own erf (~1e-11 relative in the body, see test/core/normal): tolerance 1e-9
  // for F in the body (1e-4 ≤ F ≤ 1 − 1e-4); its density is a plain exp and agrees to 1e-12.
  const cases = [P(0.001, 0.01, -0.3), P(0, 1, -1), P(2, 0.5, -0.04), P(0.001, 0.01, 0.3), P(-1, 3, 1.5), P(0, 1, 0.04)];
  test.each(cases)("cdf, sf, pdf and quantile match the lognormal law at %p", (p) => {
    const k = p.shape;
    const s = Math.abs(k);
    const g = p.location + p.scale / k;
    const mu = Math.log(p.scale / s);
    const sign = k < 0 ? 1 : -1; // X = g + sign·LN
    for (const u of [1e-4, 0.001, 0.01, 0.1, 0.3, 0.5, 0.7, 0.9, 0.99, 0.999, 1 - 1e-4]) {
      const x = G.quantile(u, p);
      const v = sign * (x - g); // the lognormal variable
      const Fln = jStat.lognormal.cdf(v, mu, s);
      const F = sign > 0 ? Fln : 1 - Fln;
      const at = `x=${x} ${describeParams(p)}`;
      expectRel(`cdf ${at}`, G.cdf(x, p), F, 1e-9);
      expectRel(`sf ${at}`, G.sf(x, p), 1 - F, 1e-9);
      expectRel(`pdf ${at}`, G.pdf(x, p), jStat.lognormal.pdf(v, mu, s), 1e-12);
      const lnQ = jStat.lognormal.inv(sign > 0 ? u : 1 - u, mu, s);
      expectAbs(`quantile(${u}) ${describeParams(p)}`, x, g + sign * lnQ, 1e-8 * (Math.abs(x) + p.scale));
    }
  });
  test("mean and variance match jstat's lognormal moments", () => {
    for (const p of cases) {
      const k = p.shape;
      const s = Math.abs(k);
      const g = p.location + p.scale / k;
      const mu = Math.log(p.scale / s);
      const m = G.moments(p);
      // The reference forms g ± E[LN] and so cancels when |g| ≫ |mean|: allow 8ε·|g| absolute.
      const lnMean = jStat.lognormal.mean(mu, s);
      expectAbs(`mean ${describeParams(p)}`, m.mean, g + (k < 0 ? 1 : -1) * lnMean, 8 * 2 ** -52 * (Math.abs(g) + lnMean));
      expectRel(`var ${describeParams(p)}`, m.sd * m.sd, jStat.lognormal.variance(mu, s), 1e-12);
    }
  });
});

describe("GNO density integrated numerically (adaptive Simpson)", () => {
  const cases = [P(0, 1, 0), P(0.001, 0.01, -0.3), P(0.001, 0.01, 0.3), P(0, 1, 1), P(5, 2, -0.8), P(0, 1, 1e-9), P(-0.5, 0.2, 2)];
  // Breakpoints at quantiles; the far ones matter for the variance when |k| is large (x²f peaks at z = −2k).
  const TAIL = [1e-40, 1e-30, 1e-24, 1e-18, 1e-13, 1e-9, 1e-6];
  const U = [...TAIL, 1e-3, 0.02, 0.1, 0.3, 0.5, 0.7, 0.9, 0.98, 0.999];
  const UPPER = [...TAIL].reverse(); // upper-tail probabilities, placed with quantileUpper (1 − 1e-40 is 1 in doubles)
  test.each(cases)("mass 1, mean, variance, CDF and τ3/τ4 by PWMs at %p", (p) => {
    const breaks = [...U.map((u) => G.quantile(u, p)), ...UPPER.map((q) => G.quantileUpper(q, p))];
    const tol = 1e-12 * p.scale;
    const f = (x: number) => G.pdf(x, p);
    const mass = integratePieces(f, breaks, 1e-12);
    expectAbs(`mass ${describeParams(p)}`, mass, 1, 1e-10);
    const m = G.moments(p);
    const mean = integratePieces((x) => x * f(x), breaks, tol);
    expectAbs(`mean ${describeParams(p)}`, mean, m.mean, 1e-9 * (p.scale + Math.abs(m.mean)));
    const variance = integratePieces((x) => (x - m.mean) ** 2 * f(x), breaks, tol * p.scale);
    expectRel(`variance ${describeParams(p)}`, variance, m.sd * m.sd, 1e-8);
    for (const i of [7, 9, 11, 13]) {
      const x = breaks[i];
      expectAbs(`∫f up to quantile(${U[i]}) ${describeParams(p)}`, integratePieces(f, breaks.slice(0, i + 1), 1e-12), G.cdf(x, p), 1e-10);
    }
    // PWMs β_r = ∫ (x − ξ) F(x)^r f(x) dx (Hosking 1990) and λ2 = 2β1 − β0, λ3 = 6β2 − 6β1 + β0,
    // λ4 = 20β3 − 30β2 + 12β1 − β0; computed from pdf and cdf, not from the quantile integral in lmoments.ts.
    const beta = [0, 1, 2, 3].map((r) => integratePieces((x) => (x - p.location) * G.cdf(x, p) ** r * f(x), breaks, tol));
    const l2 = 2 * beta[1] - beta[0];
    const l3 = 6 * beta[2] - 6 * beta[1] + beta[0];
    const l4 = 20 * beta[3] - 30 * beta[2] + 12 * beta[1] - beta[0];
    const lm = G.lMoments(p);
    expectRel(`λ2 ${describeParams(p)}`, lm.l2, l2, 1e-9);
    expectAbs(`τ3 ${describeParams(p)}`, lm.t3, l3 / l2, 1e-9);
    expectAbs(`τ4 ${describeParams(p)}`, lm.t4, l4 / l2, 1e-9);
  });
});

describe("GNO common-practice facts", () => {
  test("shape 0 is the normal law N(ξ, α²)", () => {
    const p = P(0.3, 2, 0);
    for (const x of [-10, -1, 0, 0.3, 1.7, 9]) {
      expect(G.cdf(x, p)).toBe(normalCdf((x - 0.3) / 2));
    }
    for (const u of [1e-10, 0.05, 0.5, 0.975]) expect(G.quantile(u, p)).toBe(0.3 + 2 * normalQuantile(u));
    expect(G.edge(p)).toBeNull();
    const m = G.moments(p);
    expect([m.mean, m.sd, m.skewness, m.excessKurtosis]).toEqual([0.3, 2, 0, 0]);
  });
  test("k > 0: negative skew and an upper edge; k < 0: positive skew and a lower edge", () => {
    for (const k of [0.01, 0.3, 1, 2.5]) {
      const up = P(0, 1, k);
      const down = P(0, 1, -k);
      expect(G.moments(up).skewness).toBeLessThan(0);
      expect(G.lMoments(up).t3).toBeLessThan(0);
      expect(G.edge(up)).toEqual({ value: 1 / k, side: "upper" });
      expect(G.moments(down).skewness).toBeGreaterThan(0);
      expect(G.lMoments(down).t3).toBeGreaterThan(0);
      expect(G.edge(down)).toEqual({ value: -1 / k, side: "lower" });
    }
  });
  test("shape 0.04 → skewness ≈ −0.12 and excess kurtosis ≈ 0.026 (common practice, 2 digits)", () => {
    const m = G.moments(P(0, 1, 0.04));
    expectAbs("skewness", m.skewness, -0.12, 0.005);
    expectAbs("excess kurtosis", m.excessKurtosis, 0.026, 0.001);
  });
  test("moments are continuous through k = 0 and keep relative accuracy for subnormal-adjacent shapes", () => {
    const at0 = G.moments(P(1, 2, 0));
    for (const k of [1e-12, -1e-12, 1e-200, -1e-300]) {
      const m = G.moments(P(1, 2, k));
      expectRel(`sd k=${k}`, m.sd, at0.sd, 1e-15);
      // skewness = −3k + O(k³); mean = ξ − αk/2 + O(k³) (series of the closed forms).
      expectRel(`skewness k=${k}`, m.skewness, -3 * k, 1e-12);
      expectRel(`mean − ξ k=${k}`, G.lMoments(P(0, 2, k)).l1, -k, 1e-12);
    }
  });
});

describe("GNO support, edges and invalid input", () => {
  test("outside the support: density 0, CDF 0 or 1, logs ±Infinity/0, never NaN", () => {
    const up = P(0, 1, 0.5); // upper edge 2
    for (const x of [2, 2.0000000000000004, 3, 1e300, Infinity]) {
      expect([G.pdf(x, up), G.cdf(x, up), G.sf(x, up), G.logPdf(x, up), G.logCdf(x, up), G.logSf(x, up)]).toEqual([
        0, 1, 0, -Infinity, 0, -Infinity,
      ]);
      expect(G.inSupport(x, up)).toBe(false);
    }
    const low = P(0, 1, -0.5); // lower edge −2
    for (const x of [-2, -2.0000000000000004, -3, -1e300, -Infinity]) {
      expect([G.pdf(x, low), G.cdf(x, low), G.sf(x, low), G.logPdf(x, low), G.logCdf(x, low), G.logSf(x, low)]).toEqual([
        0, 0, 1, -Infinity, -Infinity, 0,
      ]);
      expect(G.inSupport(x, low)).toBe(false);
    }
    expect(G.inSupport(1.9999999999999998, up)).toBe(true);
    expect(G.inSupport(-1.9999999999999998, low)).toBe(true);
    expect(G.cdf(-Infinity, up)).toBe(0);
    expect(G.cdf(Infinity, low)).toBe(1);
    expect(G.pdf(Infinity, P(0, 1, 0))).toBe(0);
  });
  test("density is finite and ≥ 0 everywhere on a wide grid, for every shape", () => {
    for (const k of shapes) {
      const p = P(0, 1, k);
      for (let e = -300; e <= 300; e += 7) {
        for (const x of [10 ** e, -(10 ** e)]) {
          const d = G.pdf(x, p);
          if (!(d >= 0 && Number.isFinite(d))) throw new Error(`pdf(${x}) ${describeParams(p)} = ${d}`);
          const F = G.cdf(x, p);
          if (!(F >= 0 && F <= 1)) throw new Error(`cdf(${x}) ${describeParams(p)} = ${F}`);
        }
      }
    }
  });
  test("quantile at 0 and 1 gives the edge or ±Infinity; quantileUpper mirrors it", () => {
    expect(G.quantile(1, P(0, 1, 0.5))).toBe(2);
    expect(G.quantile(0, P(0, 1, 0.5))).toBe(-Infinity);
    expect(G.quantile(0, P(0, 1, -0.5))).toBe(-2);
    expect(G.quantile(1, P(0, 1, -0.5))).toBe(Infinity);
    expect(G.quantile(0, P(0, 1, 0))).toBe(-Infinity);
    expect(G.quantile(1, P(0, 1, 0))).toBe(Infinity);
    expect(G.quantileUpper(0, P(0, 1, 0.5))).toBe(2);
    expect(G.quantileUpper(1, P(0, 1, -0.5))).toBe(-2);
    for (const bad of [-0.1, 1.1, NaN]) expect(G.quantile(bad, P(0, 1, 0.2))).toBeNaN();
  });
  test("invalid parameters (scale ≤ 0, non-finite) give NaN results, no edge, no support", () => {
    for (const p of [P(0, 0, 0.1), P(0, -1, 0.1), P(NaN, 1, 0), P(0, 1, Infinity), P(0, Infinity, 0), P(0, 1, NaN)]) {
      expect(G.isValidParams(p)).toBe(false);
      for (const v of [G.cdf(0, p), G.sf(0, p), G.pdf(0, p), G.logPdf(0, p), G.logCdf(0, p), G.quantile(0.5, p), G.reducedVariate(0, p)]) {
        expect(v).toBeNaN();
      }
      expect(G.edge(p)).toBeNull();
      expect(G.inSupport(0, p)).toBe(false);
      expect(Number.isNaN(G.moments(p).mean) && Number.isNaN(G.lMoments(p).t3)).toBe(true);
      expect(Array.from(G.sample(p, 3, 1)).every(Number.isNaN)).toBe(true);
    }
    expect(G.isValidParams(P(0, 1e-300, -3))).toBe(true);
  });
  test("results are frozen plain objects", () => {
    expect(Object.isFrozen(G.moments(P(0, 1, 0.1)))).toBe(true);
    expect(Object.isFrozen(G.lMoments(P(0, 1, 0.1)))).toBe(true);
    expect(Object.isFrozen(G.edge(P(0, 1, 0.1)))).toBe(true);
  });
});

describe("GNO seeded draws", () => {
  test("same seed → same draws; another seed → different draws", () => {
    const p = P(0.001, 0.01, -0.3);
    expect(Array.from(G.sample(p, 1000, 7))).toEqual(Array.from(G.sample(p, 1000, 7)));
    expect(Array.from(G.sample(p, 10, 7))).not.toEqual(Array.from(G.sample(p, 10, 8)));
    expect(G.sample(p, 0, 1).length).toBe(0);
    expect(G.sample(p, -5, 1).length).toBe(0);
    expect(G.sample(p, 2.7, 1).length).toBe(2);
  });
  test("uniform stream stays strictly inside (0, 1) and draws stay inside the support", () => {
    const next = uniformStream(3);
    for (let i = 0; i < 100000; i++) {
      const u = next();
      if (!(u > 0 && u < 1)) throw new Error(`uniform ${u} at ${i}`);
    }
    const p = P(0, 1, 2.5);
    for (const x of G.sample(p, 100000, 11)) if (!G.inSupport(x, p)) throw new Error(`draw ${x} outside support`);
  });
  test("draws pass a KS test at their own parameters (D < 1.63/√n, the asymptotic 1% critical value)", () => {
    const n = 4000;
    const crit = 1.63 / Math.sqrt(n);
    const seeds = fc.sample(fc.tuple(fc.double({ min: -1, max: 1, noNaN: true }), fc.double({ min: 0.001, max: 5, noNaN: true }), fc.double({ min: -2.5, max: 2.5, noNaN: true })), { seed: 99, numRuns: 12 });
    seeds.forEach(([xi, a, k], i) => {
      const p = P(xi, a, k);
      const xs = Array.from(G.sample(p, n, 1000 + i)).sort((u, v) => u - v);
      let d = 0;
      xs.forEach((x, j) => {
        const F = G.cdf(x, p);
        d = Math.max(d, (j + 1) / n - F, F - j / n);
      });
      if (!(d < crit)) throw new Error(`KS D=${d} ≥ ${crit} for ${describeParams(p)} seed ${1000 + i}`);
    });
  });
});

describe("GNO properties over random parameter sets (fast-check, fixed seed)", () => {
  const paramsArb = fc.tuple(
    fc.double({ min: -100, max: 100, noNaN: true }),
    fc.double({ min: 1e-4, max: 100, noNaN: true }),
    fc.oneof(fc.double({ min: -3, max: 3, noNaN: true }), fc.constantFrom(0, 1e-12, -1e-12, 1e-9, -1e-6)),
  ).map(([xi, a, k]) => P(xi, a, k));

  test("CDF is monotone and inside [0, 1] along the quantile grid", () => {
    fc.assert(
      fc.property(paramsArb, (p) => {
        let prev = -Infinity;
        let prevF = 0;
        for (let u = 1e-6; u < 1; u += 0.01) {
          const x = G.quantile(u, p);
          const F = G.cdf(x, p);
          if (!(x >= prev && F >= prevF && F >= 0 && F <= 1)) return false;
          prev = x;
          prevF = F;
        }
        return true;
      }),
      FC,
    );
  });
  test("cdf(quantile(u)) = u and quantile(cdf(x)) = x in the body", () => {
    fc.assert(
      fc.property(paramsArb, fc.double({ min: 1e-6, max: 1 - 1e-6, noNaN: true }), (p, u) => {
        const x = G.quantile(u, p);
        // x itself is rounded to ~ε·|x|, which moves F by f(x)·ε·|x| (large when |ξ| ≫ α): that plus 1e-12 relative.
        const back = G.cdf(x, p);
        const tail = Math.min(u, 1 - u);
        const representation = 4 * 2 ** -52 * Math.abs(x) * G.pdf(x, p);
        if (!(Math.abs(back - u) <= 1e-12 * Math.max(tail, 1e-3) + representation + 1e-15)) throw new Error(`cdf(quantile(${u})) = ${back} ${describeParams(p)}`);
        const x2 = G.quantile(back, p);
        const scale = Math.abs(x) + p.scale * (1 + Math.abs(x - p.location) / p.scale);
        if (!(Math.abs(x2 - x) <= 1e-9 * scale)) throw new Error(`quantile(cdf(${x})) = ${x2} ${describeParams(p)}`);
        return true;
      }),
      FC,
    );
  });
  test("density ≥ 0 and F(b) − F(a) = ∫_a^b f for random intervals", () => {
    fc.assert(
      fc.property(paramsArb, fc.double({ min: 0.001, max: 0.5, noNaN: true }), fc.double({ min: 0.5, max: 0.999, noNaN: true }), (p, u1, u2) => {
        const a = G.quantile(u1, p);
        const b = G.quantile(u2, p);
        if (!(b > a)) return true;
        const integral = adaptiveSimpson((x) => G.pdf(x, p), a, b, 1e-11);
        return Math.abs(integral - (G.cdf(b, p) - G.cdf(a, p))) <= 1e-9 && G.pdf((a + b) / 2, p) >= 0;
      }),
      { seed: FC.seed, numRuns: 60 },
    );
  });
  test("1 − F and F sum to 1; ln F and ln(1 − F) agree with the logs of F and 1 − F", () => {
    fc.assert(
      fc.property(paramsArb, fc.double({ min: 1e-12, max: 1 - 1e-12, noNaN: true }), (p, u) => {
        const x = G.quantile(u, p);
        const F = G.cdf(x, p);
        const S = G.sf(x, p);
        return (
          Math.abs(F + S - 1) <= 4e-16 &&
          Math.abs(G.logCdf(x, p) - Math.log(F)) <= 1e-15 * Math.max(1, Math.abs(Math.log(F))) &&
          Math.abs(G.logSf(x, p) - Math.log(S)) <= 1e-15 * Math.max(1, Math.abs(Math.log(S)))
        );
      }),
      FC,
    );
  });
});
