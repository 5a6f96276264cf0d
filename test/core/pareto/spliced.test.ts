/**
 * The spliced law (generalized normal body, generalized Pareto tails): continuity, inversion, VaR/ES against
 * numerical integration, moments against an independent quadrature, seeded draws against the CDF (KS), the
 * tail-free case against the body's closed forms, and the ForecastLaw view.
 * Sources: the defining formulas (module header of src/core/pareto/spliced.ts); ES = (1/a)∫₀^a VaR(1 − s) ds
 * (Acerbi & Tasche 2002, the integral form of expected shortfall); Kolmogorov's asymptotic 1% critical value
 * 1.63/√n (common practice).
 */
import * as gno from "../../../src/core/gno";
import { expectedShortfall, valueAtRisk } from "../../../src/core/risk";
import {
  lowerTailMass,
  splicedCdf,
  splicedEdges,
  splicedExpectedShortfall,
  splicedForecastLaw,
  splicedMoments,
  splicedPdf,
  splicedQuantile,
  splicedQuantileUpper,
  splicedSample,
  splicedSf,
  splicedValueAtRisk,
  upperTailMass,
  type SplicedParams,
} from "../../../src/core/pareto";
import { gaussLegendre } from "../../../src/core/risk/measures/gaussLegendre";
import { expectClose } from "./check";

const body = { location: 0.0005, scale: 0.01, shape: -0.1 };
const both: SplicedParams = {
  body,
  lower: { threshold: gno.quantile(0.08, body), shape: 0.25, scale: 0.006 },
  upper: { threshold: gno.quantile(0.93, body), shape: 0.12, scale: 0.005 },
};
const bounded: SplicedParams = {
  body: { location: 0, scale: 1, shape: 0.2 },
  lower: { threshold: gno.quantile(0.1, { location: 0, scale: 1, shape: 0.2 }), shape: -0.3, scale: 0.8 },
  upper: null,
};
const lossOnly: SplicedParams = { body, lower: both.lower, upper: null };
const LAWS: Array<[string, SplicedParams]> = [
  ["both tails", both],
  ["loss tail only", lossOnly],
  ["bounded loss tail (ξ < 0)", bounded],
  ["gain tail only", { body, lower: null, upper: both.upper }],
];

const RULE = gaussLegendre(20);
/** ∫_a^b f by composite 20-point Gauss–Legendre on `panels` panels (test-side quadrature). */
function integrate(f: (x: number) => number, a: number, b: number, panels: number): number {
  const h = (b - a) / panels;
  let s = 0;
  for (let j = 0; j < panels; j++) {
    for (let i = 0; i < RULE.nodes.length; i++) s += RULE.weights[i] * f(a + j * h + (h / 2) * (1 + RULE.nodes[i]));
  }
  return (s * h) / 2;
}

/**
 * ES(c) for a long position as (1/a)∫₀^a −Q(s) ds with s = a·e^{−v} (removes the tail singularity); the range is
 * split where Q has a kink (the density jumps at a threshold, at tail probability `kinks`).
 */
function esByIntegral(c: number, q: (s: number) => number, xi: number, kinks: number[] = []): number {
  const a = 1 - c;
  const vMax = 60 / Math.max(0.05, 1 - Math.max(xi, 0));
  const cuts = [0, ...kinks.filter((k) => k > 0 && k < a).map((k) => Math.log(a / k)).sort((x, y) => x - y), vMax];
  let s = 0;
  for (let i = 0; i + 1 < cuts.length; i++) s += integrate((v) => -q(a * Math.exp(-v)) * Math.exp(-v), cuts[i], cuts[i + 1], 200);
  return s;
}

describe("spliced law: continuity and inversion", () => {
  for (const [name, p] of LAWS) {
    test(`${name}: the CDF is continuous at each threshold`, () => {
      for (const t of [p.lower, p.upper]) {
        if (!t) continue;
        const u = t.threshold;
        const d = 1e-9 * Math.max(1, Math.abs(u));
        // A jump would show as a gap far above the density × step.
        const gap = Math.abs(splicedCdf(u + d, p) - splicedCdf(u - d, p));
        const fmax = Math.max(splicedPdf(u - d, p), splicedPdf(u + d, p));
        expect(gap).toBeLessThanOrEqual(2 * d * fmax * 1.01 + 1e-15);
        expectClose(`sf + cdf at ${u}`, splicedSf(u - d, p) + splicedCdf(u - d, p), 1, { abs: 2e-16 });
      }
    });

    test(`${name}: the quantile inverts the CDF to 1e-12`, () => {
      const pl = lowerTailMass(p);
      const pu = upperTailMass(p);
      const probs = [1e-12, 1e-6, 1e-3, 0.01, 0.05, 0.2, 0.5, 0.8, 0.95, 0.99, 0.999];
      if (pl > 0) probs.push(pl * (1 - 1e-9), pl, pl * (1 + 1e-9));
      if (pu > 0) probs.push(1 - pu * (1 + 1e-9), 1 - pu * (1 - 1e-9));
      for (const prob of probs) {
        const x = splicedQuantile(prob, p);
        // 1e-12, widened only by F's own conditioning at x (|x|·f(x)/F(x) ulp), which is large near the end of a
        // bounded tail (ξ < 0).
        const conditioning = (Math.abs(x) * splicedPdf(x, p)) / prob;
        expectClose(`F(Q(${prob}))`, splicedCdf(x, p), prob, { rel: 1e-12 + 4e-16 * conditioning });
      }
      for (const q of [1e-12, 1e-7, 1e-3, 0.03]) {
        const x = splicedQuantileUpper(q, p);
        expectClose(`S(Qupper(${q}))`, splicedSf(x, p), q, { rel: 1e-12 });
      }
    });
  }

  test("the density integrates to the CDF across both thresholds", () => {
    const [a, b] = [splicedQuantile(0.001, both), splicedQuantile(0.999, both)];
    const uL = both.lower!.threshold;
    const uU = both.upper!.threshold;
    const mass = integrate((x) => splicedPdf(x, both), a, uL, 50) + integrate((x) => splicedPdf(x, both), uL, uU, 50) + integrate((x) => splicedPdf(x, both), uU, b, 50);
    expectClose("∫f", mass, 0.998, { rel: 1e-12 });
  });

  test("edges: a lower tail with ξ < 0 ends at u + β/ξ; the body's upper edge remains", () => {
    const e = splicedEdges(bounded);
    const t = bounded.lower!;
    expectClose("lower edge", e.lower, t.threshold + t.scale / t.shape, { rel: 1e-15 });
    expectClose("upper edge", e.upper, 0 + 1 / 0.2, { rel: 1e-15 });
    expect(splicedCdf(e.lower - 1e-9, bounded)).toBe(0);
    expect(splicedEdges(both)).toEqual({ lower: -Infinity, upper: Infinity });
  });
});

describe("spliced law: VaR and ES", () => {
  test("ES in the loss tail is (VaR + β + ξ·u)/(1 − ξ) for a return threshold u, and matches the integral", () => {
    const t = lossOnly.lower!;
    for (const c of [0.95, 0.975, 0.99, 0.999, 0.99999]) {
      const v = splicedValueAtRisk(c, lossOnly);
      const es = splicedExpectedShortfall(c, lossOnly);
      expectClose(`closed form at ${c}`, es, (v + t.scale + t.shape * t.threshold) / (1 - t.shape), { rel: 1e-14 });
      expectClose(`ES vs integral at ${c}`, es, esByIntegral(c, (s) => splicedQuantile(s, lossOnly), t.shape), { rel: 1e-10 });
      expectClose(`VaR is −Q(1 − c) at ${c}`, v, -splicedQuantile(1 - c, lossOnly), { rel: 0 });
    }
  });

  for (const [name, p] of LAWS) {
    test(`${name}: long and short ES match the integral in the tails and in the body`, () => {
      const xiL = p.lower?.shape ?? 0;
      const xiU = p.upper?.shape ?? 0;
      for (const c of [0.6, 0.85, 0.9, 0.95, 0.975, 0.99]) {
        const kinks = [lowerTailMass(p), 1 - upperTailMass(p)];
        expectClose(`long ES ${c}`, splicedExpectedShortfall(c, p, "long"), esByIntegral(c, (s) => splicedQuantile(s, p), xiL, kinks), { rel: 1e-10, abs: 1e-14 });
        // short: ES = (1/a)∫₀^a Q(1 − s) ds.
        const shortEs = esByIntegral(c, (s) => -splicedQuantileUpper(s, p), xiU, [upperTailMass(p), 1 - lowerTailMass(p)]);
        expectClose(`short ES ${c}`, splicedExpectedShortfall(c, p, "short"), shortEs, { rel: 1e-10, abs: 1e-14 });
        expectClose(`short VaR ${c}`, splicedValueAtRisk(c, p, "short"), splicedQuantileUpper(1 - c, p), { rel: 1e-13 });
      }
    });
  }

  test("without tails, VaR and ES are the body's (risk/measures/tail.ts)", () => {
    const p: SplicedParams = { body, lower: null, upper: null };
    for (const c of [0.9, 0.99]) {
      for (const side of ["long", "short"] as const) {
        expectClose(`VaR ${c} ${side}`, splicedValueAtRisk(c, p, side), valueAtRisk(c, body, side), { rel: 1e-15 });
        expectClose(`ES ${c} ${side}`, splicedExpectedShortfall(c, p, side), expectedShortfall(c, body, side), { rel: 1e-13 });
      }
    }
  });

  test("ES is infinite for a loss tail with ξ ≥ 1; the ForecastLaw says NaN", () => {
    const heavy: SplicedParams = { body, lower: { ...both.lower!, shape: 1.1 }, upper: null };
    expect(splicedExpectedShortfall(0.99, heavy)).toBe(Infinity);
    expect(splicedExpectedShortfall(0.7, heavy)).toBe(Infinity);
    const law = splicedForecastLaw(heavy);
    expect(law.expectedShortfall(0.99, "long")).toBeNaN();
    expect(Number.isFinite(law.valueAtRisk(0.99, "long"))).toBe(true);
    expect(Number.isFinite(law.expectedShortfall(0.99, "short"))).toBe(true);
  });

  test("the ForecastLaw carries 9 cells and the law's answers", () => {
    const law = splicedForecastLaw(lossOnly);
    expect(law.params).toHaveLength(9);
    expect(law.params!.slice(0, 6)).toEqual([body.location, body.scale, body.shape, lossOnly.lower!.threshold, 0.25, 0.006]);
    expect(law.params!.slice(6).every(Number.isNaN)).toBe(true);
    expect(law.valueAtRisk(0.99, "long")).toBe(splicedValueAtRisk(0.99, lossOnly));
    expect(law.cdf(-0.03)).toBe(splicedCdf(-0.03, lossOnly));
  });
});

describe("spliced law: moments and draws", () => {
  test("without tails, the moments are the body's closed forms", () => {
    for (const b of [body, { location: 1, scale: 2, shape: 0.6 }, { location: 0, scale: 1, shape: 0 }]) {
      const m = splicedMoments({ body: b, lower: null, upper: null });
      const want = gno.moments(b);
      expectClose("mean", m.mean, want.mean, { rel: 1e-12, abs: 1e-15 });
      expectClose("sd", m.sd, want.sd, { rel: 1e-12 });
      expectClose("skewness", m.skewness, want.skewness, { abs: 1e-10 });
      expectClose("excess kurtosis", m.excessKurtosis, want.excessKurtosis, { rel: 1e-9, abs: 1e-10 });
    }
  });

  test("with tails, the moments match ∫ Q(p)^r dp computed on a logit grid", () => {
    // Independent path: the quantile integrated over p (tails with p = p_L·e^{−v}, body on the logit scale).
    const p = both;
    const pl = lowerTailMass(p);
    const pu = upperTailMass(p);
    const raw = (r: number): number => {
      const c = p.body.location;
      const f = (x: number): number => Math.pow(x - c, r);
      const lowerPart = integrate((v) => f(splicedQuantile(pl * Math.exp(-v), p)) * pl * Math.exp(-v), 0, 200, 250);
      const upperPart = integrate((v) => f(splicedQuantileUpper(pu * Math.exp(-v), p)) * pu * Math.exp(-v), 0, 200, 250);
      const logit = (x: number): number => Math.log(x / (1 - x));
      const bodyPart = integrate(
        (s) => {
          const q = 1 / (1 + Math.exp(-s));
          return f(gno.quantile(q, p.body)) * q * (1 - q);
        },
        logit(pl),
        logit(1 - pu),
        400,
      );
      return lowerPart + bodyPart + upperPart;
    };
    const [m1, m2, m3, m4] = [1, 2, 3, 4].map(raw);
    const v = m2 - m1 * m1;
    const m = splicedMoments(p);
    expect(m.order).toBe(3); // upper ξ 0.12 < 1/4 but lower ξ 0.25 = 1/4: the fourth moment does not exist
    expectClose("mean", m.mean, p.body.location + m1, { rel: 1e-10 });
    expectClose("sd", m.sd, Math.sqrt(v), { rel: 1e-10 });
    expectClose("skewness", m.skewness, (m3 - 3 * m1 * m2 + 2 * m1 ** 3) / v ** 1.5, { rel: 1e-8 });
    expect(m.excessKurtosis).toBeNaN();
    const lighter = { ...p, lower: { ...p.lower!, shape: 0.2 } };
    const ml = splicedMoments(lighter);
    expect(ml.order).toBe(4);
    expect(Number.isFinite(ml.excessKurtosis)).toBe(true);
    void m4;
  });

  test("seeded draws follow the CDF (KS at the 1% level) and repeat with the seed", () => {
    for (const [name, p] of LAWS) {
      const n = 4000;
      const x = splicedSample(p, n, 2024).sort();
      let d = 0;
      for (let i = 0; i < n; i++) {
        const u = splicedCdf(x[i], p);
        d = Math.max(d, (i + 1) / n - u, u - i / n);
      }
      if (!(d * Math.sqrt(n) < 1.63)) throw new Error(`${name}: KS √n·D = ${d * Math.sqrt(n)} ≥ 1.63`);
      expect(splicedSample(p, 5, 9)).toEqual(splicedSample(p, 5, 9));
    }
  });
});
