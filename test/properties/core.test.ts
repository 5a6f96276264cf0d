/**
 * Property-based tests of the numeric core (fast-check, fixed seed 42 so a failure replays): 10,000+ random cases
 * across the law, tail risk, fitting, backtests and returns. Each property states a fact that holds for every
 * valid input, from the definition of a distribution function or of the statistic (common practice), not from
 * our own numbers. Tolerances are written beside each property; failures print the inputs (fast-check's
 * counterexample) and the got/want/tolerance message.
 */
import fc from "fast-check";
import { cdf, sf, pdf, quantile, type GnoParams } from "../../src/core/gno";
import { valueAtRisk, expectedShortfall, backtestVar, returnsFromPrices } from "../../src/core/risk";
import { fitGno, fitGnoQuick } from "../../src/core/fit";
import { binomialCdf } from "../../src/core/risk";

const SEED = 42;
const runs: Record<string, number> = {};
/** fc.assert with the fixed seed; counts the cases so the total is visible (and asserted) at the end. */
function check<T>(name: string, arb: fc.Arbitrary<T>, numRuns: number, prop: (v: T) => void): void {
  runs[name] = numRuns;
  fc.assert(fc.property(arb, (v) => prop(v)), { seed: SEED, numRuns });
}

function fail(what: string, inputs: unknown, got: number, want: number | string, tol?: number): never {
  throw new Error(`${what}: inputs ${JSON.stringify(inputs)} got ${got} want ${want}${tol === undefined ? "" : ` tolerance ${tol}`}`);
}

/** Params across the documented domain: location in ±1, scale log-uniform 1e-4..10, shape in ±3 with k = 0 and tiny k drawn often. */
const paramsArb: fc.Arbitrary<GnoParams> = fc.record({
  location: fc.double({ min: -1, max: 1, noNaN: true }),
  scale: fc.double({ min: -4, max: 1, noNaN: true }).map((e) => 10 ** e),
  shape: fc.oneof(
    fc.double({ min: -3, max: 3, noNaN: true }),
    fc.constantFrom(0, 1e-9, -1e-9, 1e-5, -1e-5),
  ),
});

/** A point where the law is interesting: location + scale·t, t in ±12 (both tails and beyond any edge). */
const pointArb = fc.double({ min: -12, max: 12, noNaN: true });
const probArb = fc.double({ min: 1e-12, max: 1 - 1e-12, noNaN: true });

describe("the law, for random parameters", () => {
  test("cdf is in [0, 1] and non-decreasing; cdf + sf = 1 (definition of a distribution function)", () => {
    check("cdf monotone", fc.tuple(paramsArb, pointArb, pointArb), 3500, ([p, a, b]) => {
      const [lo, hi] = a <= b ? [a, b] : [b, a];
      const x1 = p.location + p.scale * lo, x2 = p.location + p.scale * hi;
      const F1 = cdf(x1, p), F2 = cdf(x2, p);
      if (!(F1 >= 0 && F1 <= 1)) fail("cdf in [0,1]", { p, x1 }, F1, "[0,1]");
      if (!(F2 >= F1)) fail("cdf non-decreasing", { p, x1, x2 }, F2, `≥ ${F1}`);
      // 1 − F and the separate upper tail agree to a few ulps of 1 (tolerance 4e-16 absolute).
      const s = sf(x1, p);
      if (!(Math.abs(F1 + s - 1) <= 4e-16)) fail("cdf + sf", { p, x1 }, F1 + s, 1, 4e-16);
    });
  });

  test("pdf is finite and ≥ 0 everywhere, and 0 outside the support", () => {
    check("pdf non-negative", fc.tuple(paramsArb, pointArb), 2500, ([p, t]) => {
      const x = p.location + p.scale * t;
      const f = pdf(x, p);
      if (!(f >= 0 && Number.isFinite(f))) fail("pdf ≥ 0 and finite", { p, x }, f, "≥ 0");
      const F = cdf(x, p);
      if ((F === 0 || F === 1) && p.shape !== 0 && f !== 0 && Math.abs(p.shape * (x - p.location)) >= p.scale) {
        fail("pdf outside the support", { p, x }, f, 0);
      }
    });
  });

  test("quantile is increasing in p and cdf(quantile(p)) = p (to its backward error)", () => {
    check("quantile round trip", fc.tuple(paramsArb, probArb, probArb), 2500, ([p, u, v]) => {
      const x = quantile(u, p);
      if (!Number.isFinite(x)) fail("quantile finite", { p, u }, x, "finite");
      const back = cdf(x, p);
      // Tolerance = backward error: the round trip may be off by what moving x by a few ulps does to F
      // (8·ε·(|x|+|ξ|)·f(x): large only near an edge, where F is ill-conditioned in x), plus 1e-10 of the nearer tail.
      const tol = 1e-10 * Math.min(u, 1 - u) + 8 * Number.EPSILON * (Math.abs(x) + Math.abs(p.location)) * pdf(x, p) + 1e-300;
      if (!(Math.abs(back - u) <= tol)) fail("cdf(quantile(u))", { p, u, x }, back, u, tol);
      if (u < v && !(quantile(v, p) >= x)) fail("quantile non-decreasing", { p, u, v }, quantile(v, p), `≥ ${x}`);
    });
  });
});

describe("tail risk", () => {
  const confArb = fc.double({ min: 0.5, max: 0.9999, noNaN: true });
  test("VaR ≤ ES on both sides, and VaR grows with the confidence level (coherence facts, common practice)", () => {
    check("VaR ≤ ES", fc.tuple(paramsArb, confArb, confArb, fc.constantFrom("long", "short") as fc.Arbitrary<"long" | "short">), 1500, ([p, c1, c2, side]) => {
      const v = valueAtRisk(c1, p, side);
      const e = expectedShortfall(c1, p, side);
      if (!Number.isFinite(v) || !Number.isFinite(e)) fail("VaR/ES finite", { p, c1, side }, Number.isFinite(v) ? e : v, "finite");
      // ES is the mean loss beyond VaR: ES ≥ VaR up to rounding (tolerance 1e-12 relative to the scale).
      const tol = 1e-12 * (p.scale + Math.abs(v));
      if (!(e >= v - tol)) fail("ES ≥ VaR", { p, c1, side, v }, e, `≥ ${v}`, tol);
      const [lo, hi] = c1 <= c2 ? [c1, c2] : [c2, c1];
      const vlo = valueAtRisk(lo, p, side), vhi = valueAtRisk(hi, p, side);
      if (!(vhi >= vlo - 1e-12 * (p.scale + Math.abs(vlo)))) fail("VaR monotone in confidence", { p, lo, hi, side }, vhi, `≥ ${vlo}`);
    });
  });
});

/** Random data a user might paste: n in 10..60, mixed scales, possible ties, never constant. */
const dataArb = fc
  .tuple(
    fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: 10, maxLength: 60 }),
    fc.double({ min: -6, max: 2, noNaN: true }),
    fc.integer({ min: 0, max: 3 }),
  )
  .map(([xs, e, ties]) => {
    const s = 10 ** e;
    const out = xs.map((x) => x * s);
    for (let i = 0; i < ties && i + 1 < out.length; i++) out[i + 1] = out[i];
    return Float64Array.from(out);
  })
  .filter((x) => x.some((v) => v !== x[0]));

describe("fitting random data", () => {
  // Data whose spread a double cannot carry (sd underflows to 0, e.g. nine 0s and −5e-324) is outside the fit's
  // documented domain ("n ≥ 4 finite numbers, not all equal" in the sense of a positive sd): the core then throws
  // a RangeError with that message, which the adapters turn into #VALUE!. Anything else must fit.
  const fitOrDomainError = <T>(x: Float64Array, run: () => T): T | null => {
    try {
      return run();
    } catch (e) {
      let mean = 0;
      for (const v of x) mean += v / x.length;
      let ss = 0;
      for (const v of x) ss += (v - mean) * (v - mean);
      if (e instanceof RangeError && !(Math.sqrt(ss) > 0)) return null;
      throw e;
    }
  };

  test("the full fit never gives NaN: finite params with scale > 0, finite log-likelihood, a reason, MLE and L-moments", () => {
    check("fit never NaN", fc.tuple(dataArb, fc.constantFrom("mle", "lmom") as fc.Arbitrary<"mle" | "lmom">), 80, ([x, method]) => {
      const f = fitOrDomainError(x, () => fitGno(x, { method }));
      if (!f) return;
      const { location, scale, shape } = f.params;
      if (![location, scale, shape].every(Number.isFinite) || !(scale > 0)) fail("params finite, scale > 0", { method, n: x.length }, scale, "finite > 0");
      if (Number.isNaN(f.logLikelihood)) fail("log-likelihood not NaN", { method, x: Array.from(x) }, f.logLikelihood, "a number");
      if (typeof f.reason !== "string" || f.reason.length === 0) fail("reason", { method }, NaN, "non-empty reason");
      if (f.standardErrors && !f.standardErrors.every((s) => Number.isNaN(s) === false)) fail("standard errors not NaN", { method }, NaN, "numbers");
    });
  });

  test("the lean fit (rolling windows, bootstrap) never gives NaN either", () => {
    check("quick fit never NaN", dataArb, 60, (x) => {
      const q = fitOrDomainError(x, () => fitGnoQuick(x));
      if (!q) return;
      const { location, scale, shape } = q.params;
      if (![location, scale, shape].every(Number.isFinite) || !(scale > 0)) fail("quick params", { x: Array.from(x) }, scale, "finite > 0");
      if (Number.isNaN(q.logLikelihood)) fail("quick log-likelihood", { x: Array.from(x) }, q.logLikelihood, "a number");
    });
  });
});

describe("backtests and returns", () => {
  const seriesArb = fc
    .array(fc.tuple(fc.option(fc.double({ min: -0.2, max: 0.2, noNaN: true }), { nil: null }), fc.option(fc.double({ min: 0, max: 0.1, noNaN: true }), { nil: null })), { minLength: 1, maxLength: 300 })
    .filter((rows) => rows.some(([r, v]) => r !== null && v !== null));
  test("counts are consistent: observations, exceptions, transitions, zone limits, p-values in [0, 1]", () => {
    check("backtest counts", fc.tuple(seriesArb, fc.double({ min: 0.8, max: 0.999, noNaN: true }), fc.constantFrom("long", "short") as fc.Arbitrary<"long" | "short">), 1500, ([rows, conf, side]) => {
      const r = rows.map(([x]) => (x === null ? NaN : x));
      const v = rows.map(([, y]) => (y === null ? NaN : y));
      const bt = backtestVar(r, v, conf, side);
      if (!bt) return fail("backtest exists", { n: rows.length }, NaN, "a result");
      // Independent count from the definition of an exception (a loss beyond VaR on the position's side).
      const pairs = rows.filter(([x, y]) => x !== null && y !== null) as Array<[number, number]>;
      const hits = pairs.map(([x, y]) => (side === "long" ? x < -y : x > y));
      if (bt.observations !== pairs.length) fail("observations", { side }, bt.observations, pairs.length);
      if (bt.exceptions !== hits.filter(Boolean).length) fail("exceptions", { side }, bt.exceptions, hits.filter(Boolean).length);
      const t = bt.independence.transitions;
      if (t.n00 + t.n01 + t.n10 + t.n11 !== Math.max(0, pairs.length - 1)) fail("transitions sum to T − 1", t, t.n00 + t.n01 + t.n10 + t.n11, pairs.length - 1);
      for (const [name, pv] of [["kupiec", bt.kupiec.pValue], ["independence", bt.independence.pValue], ["cc", bt.conditionalCoverage.pValue]] as const) {
        if (!(pv >= 0 && pv <= 1)) fail(`${name} p-value in [0,1]`, { conf }, pv, "[0,1]");
      }
      if (!(bt.kupiec.statistic >= -1e-12)) fail("Kupiec LR ≥ 0", { conf }, bt.kupiec.statistic, "≥ 0");
      if (!(bt.greenMax < bt.redFrom)) fail("green limit below red limit", { conf }, bt.greenMax, `< ${bt.redFrom}`);
      const zone = bt.exceptions <= bt.greenMax ? "green" : bt.exceptions >= bt.redFrom ? "red" : "yellow";
      if (bt.zone !== zone) fail("zone agrees with its limits", { x: bt.exceptions, green: bt.greenMax, red: bt.redFrom }, NaN, zone);
      const cum = binomialCdf(bt.exceptions, bt.observations, 1 - conf);
      if (bt.cumulativeProbability !== cum) fail("cumulative probability", { conf }, bt.cumulativeProbability, cum);
    });
  });

  test("log returns telescope: their sum is ln(last/first) (to rounding, conditioning included)", () => {
    const pricesArb = fc.array(fc.double({ min: 0.01, max: 1e4, noNaN: true }), { minLength: 2, maxLength: 300 });
    check("returns telescope", pricesArb, 600, (p) => {
      const r = returnsFromPrices(Float64Array.from(p), "log");
      if (r.length !== p.length - 1) fail("length", { n: p.length }, r.length, p.length - 1);
      let s = 0;
      for (const x of r) s += x;
      const want = Math.log(p[p.length - 1] / p[0]);
      // Rounding: each return ln(P_t/P_{t−1}) is formed as log1p(rel) with rel = (P_t − P_{t−1})/P_{t−1}, whose
      // absolute error is about ε·|P_t − P_{t−1}|/P_t (large only for a crash towards 0); plus the n additions.
      let bound = Math.abs(want);
      for (let i = 0; i < r.length; i++) bound += Math.abs(r[i]) + Math.abs(p[i + 1] - p[i]) / p[i + 1];
      const tol = 4 * Number.EPSILON * p.length * bound + 2 * Number.EPSILON; // + the reference ratio's own rounding
      if (!(Math.abs(s - want) <= tol)) fail("sum of log returns", { p0: p[0], pn: p[p.length - 1] }, s, want, tol);
    });
  });
});

// Declared last, so it runs after every property above (jest runs a file's tests in order).
test("the properties above ran 10,000+ random cases in total", () => {
  const total = Object.values(runs).reduce((a, b) => a + b, 0);
  expect({ properties: Object.keys(runs).length, atLeast10k: total >= 10_000, total }).toEqual({ properties: 8, atLeast10k: true, total });
});
