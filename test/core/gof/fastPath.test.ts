/**
 * The bootstrap's fast path: replicates drawn already sorted, both statistics from one tail evaluation per point,
 * and a refit stopped by the one-step rule. Each piece is checked against the plain computation it replaces
 * (draws of gno.sample then a sort; ln F and ln(1 − F) from gno.logCdf/logSf with the KS and AD formulas of
 * ks.ts/ad.ts, themselves checked against Marsaglia et al. in ks.test.ts/ad.test.ts), and the refit against the
 * uniformity of p-values under the null (Stute, González Manteiga & Presedo Quindimil 1993).
 */
import {
  adStatistic,
  gnoBootstrapModel,
  gnoLaw,
  gofStatistics,
  gofStatisticsSorted,
  ksStatistic,
  runBootstrap,
  type BootstrapModel,
} from "../../../src/core/gof";
import { logCdf, logSf, sample, sampleSortedInto, type GnoParams } from "../../../src/core/gno";
import { fitGno, fusedPassCount } from "../../../src/core/fit";
import { sortUniforms } from "../../../src/core/gno/random";
import { uniformsInto, uniformStream } from "../../../src/core/random";
import { normalQuantile } from "../../../src/core/normal";
import { normalQuantilesAscendingInPlace } from "../../../src/core/normal/quantile";

const LAWS: GnoParams[] = [
  { location: 0.0004, scale: 0.011, shape: -0.12 },
  { location: 0, scale: 1, shape: 0 },
  { location: 1, scale: 2, shape: 1.5 },
  { location: -3, scale: 0.5, shape: -2.5 },
  { location: 0, scale: 1, shape: 1e-9 },
];

describe("sorted draws", () => {
  test.each(LAWS)("sampleSortedInto gives exactly the draws of sample() with the same seed, in ascending order (%o)", (p) => {
    for (const [n, seed] of [[1, 3], [7, 11], [1000, 2026]] as const) {
      const want = sample(p, n, seed).sort();
      const got = sampleSortedInto(p, seed, new Float64Array(n));
      let ascending = true;
      for (let i = 1; i < n; i++) if (!(got[i] >= got[i - 1])) ascending = false;
      expect({ n, seed, ascending, same: got.every((v, i) => Object.is(v, want[i])) }).toEqual({ n, seed, ascending: true, same: true });
    }
  });

  test("the bucket sort of uniforms agrees with the built-in sort, also when the values are far from uniform", () => {
    const cases: [string, Float64Array][] = [
      ["uniform", Float64Array.from({ length: 5000 }, (_, i) => ((i * 0.6180339887498949) % 1) || 0.5)],
      ["one bucket, descending (a crowded bucket: introsort)", Float64Array.from({ length: 2000 }, (_, i) => 0.5 + (2000 - i) * 1e-9)],
      ["two clusters with ties", Float64Array.from({ length: 700 }, (_, i) => (i % 3 === 0 ? 0.25 : 0.75 - (i % 5) * 1e-12))],
      ["short", Float64Array.from([0.9, 0.1, 0.5])],
    ];
    for (const [name, v] of cases) {
      const want = Float64Array.from(v).sort();
      const got = Float64Array.from(v);
      sortUniforms(got);
      expect({ name, same: got.every((x, i) => x === want[i]) }).toEqual({ name, same: true });
    }
  });

  test("uniformsInto gives exactly the values of uniformStream with the same seed", () => {
    for (const seed of [0, 1, -7, 2 ** 31 - 1, 20240611]) {
      const next = uniformStream(seed);
      const want = Float64Array.from({ length: 3000 }, () => next());
      const got = uniformsInto(seed, new Float64Array(3000));
      expect({ seed, same: got.every((v, i) => v === want[i]) }).toEqual({ seed, same: true });
    }
  });

  test("the in-place normal quantile equals normalQuantile value by value, sorted or not (tails, centre, 0, 1, NaN)", () => {
    const sorted = Float64Array.from([0, 1e-300, 0.01, 0.075, 0.0750000001, 0.3, 0.5, 0.7, 0.925, 0.93, 0.999999, 1]);
    const unsorted = Float64Array.from([0.5, 0.01, 0.7, 0.999, NaN, 0.2, 0.96, 0.3]);
    for (const v of [sorted, unsorted]) {
      const want = Array.from(v, normalQuantile);
      const got = Array.from(normalQuantilesAscendingInPlace(Float64Array.from(v)));
      expect(got.every((g, i) => Object.is(g, want[i]))).toBe(true);
    }
  });

  test("invalid parameters fill the buffer with NaN, as sample() does", () => {
    const out = sampleSortedInto({ location: 0, scale: -1, shape: 0 }, 1, new Float64Array(4));
    expect(Array.from(out).every(Number.isNaN)).toBe(true);
  });
});

/** KS and AD from the plain per-point logCdf/logSf and the array formulas of ks.ts/ad.ts. */
function reference(x: ArrayLike<number>, p: GnoParams) {
  const s = Float64Array.from(x).sort();
  const lf = s.map((v) => logCdf(v, p));
  const ls = s.map((v) => logSf(v, p));
  return { ks: ksStatistic(lf.map(Math.exp)), ad: adStatistic(lf, ls) };
}

describe("statistics from one tail evaluation per point", () => {
  test.each(LAWS)("KS within 1e-15 absolute and A² within 1e-12 relative of the per-point reference (%o)", (p) => {
    for (const seed of [1, 2, 3]) {
      const x = sample(p, 500, seed);
      // the law fitted to other data: statistics away from their null values too
      const q = { ...p, location: p.location + 0.1 * p.scale, scale: p.scale * 1.05 };
      for (const law of [p, q]) {
        const want = reference(x, law);
        const got = gofStatistics(x, gnoLaw(law));
        const info = { law, seed, got: [got.ks.d, got.ad], want: [want.ks.d, want.ad] };
        expect({ ...info, ks: Math.abs(got.ks.d - want.ks.d) <= 1e-15, ad: got.ad === want.ad || Math.abs(got.ad - want.ad) <= 1e-12 * Math.abs(want.ad) }).toEqual({ ...info, ks: true, ad: true });
        expect(Math.abs(got.ks.dPlus - want.ks.dPlus) <= 1e-15 && Math.abs(got.ks.dMinus - want.ks.dMinus) <= 1e-15).toBe(true);
      }
    }
  });

  test("far tails and points outside the support: same A² (+Infinity), same count outside, KS from F = 0 or 1", () => {
    const p = { location: 0, scale: 1, shape: 0.5 }; // upper edge at 2
    const x = [-1e6, -40, -3, 0, 0.5, 1.9, 2.5, 3];
    const got = gofStatistics(x, gnoLaw(p));
    const want = reference(x, p);
    expect(got.ad).toBe(Infinity);
    expect(got.outsideSupport).toBe(2);
    expect(Math.abs(got.ks.d - want.ks.d)).toBeLessThanOrEqual(1e-15);
    // a law without the normal-variate hook goes through logCdf/logSf and agrees
    const plain = gofStatistics(x, { logCdf: (v) => logCdf(v, p), logSf: (v) => logSf(v, p) });
    expect([plain.ad, plain.outsideSupport, plain.ks.d]).toEqual([got.ad, got.outsideSupport, got.ks.d]);
  });

  test("a sorted sample gives the same statistics without the copy; NaN input gives NaN", () => {
    const p = LAWS[0];
    const x = sampleSortedInto(p, 9, new Float64Array(300));
    expect(gofStatisticsSorted(x, gnoLaw(p))).toEqual(gofStatistics(Array.from(x).reverse(), gnoLaw(p)));
    const bad = gofStatistics([0.01, NaN, 0.02], gnoLaw(p));
    expect(Number.isNaN(bad.ks.d) && Number.isNaN(bad.ad)).toBe(true);
  });
});

describe("the bootstrap's fast path", () => {
  test("sorted draws in a reused buffer give the same p-values as fresh unsorted draws (same refits)", () => {
    const x = sample({ location: 0.0004, scale: 0.011, shape: -0.2 }, 300, 4);
    const fit = fitGno(x).params;
    const fast = gnoBootstrapModel("mle");
    const plain: BootstrapModel<GnoParams> = { fit: fast.fit, law: fast.law, simulate: fast.simulate };
    const a = runBootstrap(x, fast, fit, { resamples: 39, seed: 8 });
    const b = runBootstrap(x, plain, fit, { resamples: 39, seed: 8 });
    expect([a.ksPValue, a.adPValue, a.used]).toEqual([b.ksPValue, b.adPValue, b.used]);
  });

  test.each([
    ["started at the fitted parameters", false],
    ["started at the one-step prediction from the draws' score", true],
  ])("a refit %s, stopped by the one-step rule, leaves the statistics within 1e-2 relative of a fully converged refit", (_, predicted) => {
    // Newton's quadratic convergence (Nocedal & Wright 2006, Thm 3.5): the step taken unevaluated from a point
    // whose predicted gain is below 1e-2 lands within O(gain²) of the maximum; measured ≤ 3e-3 relative at n = 50
    const p = { location: 0.001, scale: 0.01, shape: 0.3 };
    const x = sample(p, 50, 77);
    const fitted = fitGno(x);
    const fit = fitted.params;
    const model = predicted ? gnoBootstrapModel("mle", fitted) : gnoBootstrapModel("mle");
    const buf = new Float64Array(50);
    let worst = 0;
    for (let b = 0; b < 40; b++) {
      const s = model.simulateSorted!(fit, 1000 + b, buf);
      const quick = model.fit(s, fit)!;
      const full = fitGno(s, { start: fit }).params;
      const tq = gofStatistics(s, gnoLaw(quick));
      const tf = gofStatistics(s, gnoLaw(full));
      worst = Math.max(worst, Math.abs(tq.ad - tf.ad) / tf.ad, Math.abs(tq.ks.d - tf.ks.d) / tf.ks.d);
    }
    expect({ worst, within: worst <= 1e-2 }).toEqual({ worst, within: true });
  });

  test("the model that predicts starts draws exactly sampleSortedInto's values, and its refits take fewer passes", () => {
    const x = sample({ location: 0.0004, scale: 0.011, shape: -0.12 }, 1000, 2026);
    const fitted = fitGno(x);
    const plain = gnoBootstrapModel("mle");
    const predicting = gnoBootstrapModel("mle", fitted);
    const a = new Float64Array(1000);
    const b = new Float64Array(1000);
    let passesPlain = 0;
    let passesPredicted = 0;
    for (let r = 0; r < 20; r++) {
      plain.simulateSorted!(fitted.params, r, a);
      predicting.simulateSorted!(fitted.params, r, b);
      expect(a.every((v, i) => Object.is(v, b[i]))).toBe(true);
      let p0 = fusedPassCount();
      const qa = plain.fit(a, fitted.params)!;
      passesPlain += fusedPassCount() - p0;
      p0 = fusedPassCount();
      const qb = predicting.fit(b, fitted.params)!;
      passesPredicted += fusedPassCount() - p0;
      // both are the same maximum up to the stopping rule: parameters within 1e-2 standard errors in all (a hundredth
      // of the sampling error; measured up to 1.2e-3)
      const se = fitted.standardErrors!;
      expect(Math.abs(qa.location - qb.location) / se[0] + Math.abs(qa.scale - qb.scale) / se[1] + Math.abs(qa.shape - qb.shape) / se[2]).toBeLessThan(1e-2);
    }
    // likelihood passes per refit: about 2.3 from the fitted parameters, about 1.3 from the prediction (n = 1,000)
    expect({ passesPlain, passesPredicted, fewer: passesPredicted <= 0.75 * passesPlain }).toEqual({ passesPlain, passesPredicted, fewer: true });
  });

  test("without a usable covariance (L-moment fit) the model starts every refit at the fitted parameters", () => {
    const x = sample({ location: 0, scale: 1, shape: 0.2 }, 200, 5);
    const lm = fitGno(x, { method: "lmom" });
    const model = gnoBootstrapModel("lmom", lm);
    const out = model.simulateSorted!(lm.params, 3, new Float64Array(200));
    expect(Array.from(out)).toEqual(Array.from(sampleSortedInto(lm.params, 3, new Float64Array(200))));
    expect(model.fit(out, lm.params)).not.toBeNull();
  });
});
