/**
 * Parametric bootstrap and the GNO front ends. Outside references: the Monte Carlo p-value of a correctly
 * specified bootstrap is (close to) uniform under the null (Stute et al. 1993; exact for B = 39 when the
 * statistic's law does not depend on the parameters, as for the normal with location-scale fits — Lilliefors
 * 1967); the binomial bands below are 99.9% bands of Binomial(N, 0.1) (computed with jstat-free arithmetic
 * in the test). Simulations are seeded, so the tests are deterministic.
 */
import { DEFAULT_SEED, gnoLaw, runBootstrap, startBootstrap, startGnoBootstrap, testGnoFitted, testGnoSpecified, gofStatistics, type BootstrapModel } from "../../../src/core/gof";
import { sample, cdf, type GnoParams } from "../../../src/core/gno";
import { fitGnoCached } from "../../../src/core/fit";

function binomialBand(n: number, p: number, tail: number): [number, number] {
  const pmf: number[] = [];
  let logC = 0;
  for (let k = 0; k <= n; k++) {
    if (k > 0) logC += Math.log((n - k + 1) / k);
    pmf.push(Math.exp(logC + k * Math.log(p) + (n - k) * Math.log1p(-p)));
  }
  let lo = 0;
  let acc = 0;
  while (acc + pmf[lo] < tail / 2) acc += pmf[lo++];
  let hi = n;
  acc = 0;
  while (acc + pmf[hi] < tail / 2) acc += pmf[hi--];
  return [lo, hi];
}

const normalModel: BootstrapModel<GnoParams> = {
  fit(x) {
    let m = 0;
    for (const v of x) m += v / x.length;
    let ss = 0;
    for (const v of x) ss += (v - m) ** 2;
    return { location: m, scale: Math.sqrt(ss / x.length), shape: 0 };
  },
  law: gnoLaw,
  simulate: sample,
};

describe("parametric bootstrap", () => {
  test("p-values are uniform under the null: 100 normal datasets × 39 resamples, n = 100", () => {
    const datasets = 100;
    const [lo, hi] = binomialBand(datasets, 0.1, 0.001);
    let ksSmall = 0;
    let adSmall = 0;
    for (let i = 0; i < datasets; i++) {
      const x = sample({ location: 0.0003, scale: 0.011, shape: 0 }, 100, 1000 + i);
      const r = runBootstrap(x, normalModel, normalModel.fit(x, { location: 0, scale: 1, shape: 0 })!, { resamples: 39, seed: 77 + i });
      if (r.ksPValue <= 0.1) ksSmall++;
      if (r.adPValue <= 0.1) adSmall++;
    }
    const msg = `KS ${ksSmall}, AD ${adSmall} of ${datasets} with p ≤ 0.1; 99.9% band [${lo}, ${hi}]`;
    if (!(ksSmall >= lo && ksSmall <= hi && adSmall >= lo && adSmall <= hi)) throw new Error(msg);
  });

  test("GNO fitted by MLE: p-values roughly uniform under the null (40 datasets × 39 resamples, n = 100, k = −0.3)", () => {
    const datasets = 40;
    const [lo, hi] = binomialBand(datasets, 0.1, 0.001);
    let ksSmall = 0;
    let adSmall = 0;
    for (let i = 0; i < datasets; i++) {
      const x = sample({ location: 0.001, scale: 0.01, shape: -0.3 }, 100, 5000 + i);
      const r = testGnoFitted(x, { resamples: 39, seed: 900 + i });
      if (r.ksPValue <= 0.1) ksSmall++;
      if (r.adPValue <= 0.1) adSmall++;
    }
    const msg = `KS ${ksSmall}, AD ${adSmall} of ${datasets} with p ≤ 0.1; 99.9% band [${lo}, ${hi}]`;
    if (!(ksSmall >= lo && ksSmall <= hi && adSmall >= lo && adSmall <= hi)) throw new Error(msg);
  });

  test("has power: a Student t(3)-like sample (ratio of normal draws) is rejected by AD as GNO at n = 800", () => {
    const z = sample({ location: 0, scale: 1, shape: 0 }, 3200, 42);
    const x = new Float64Array(800);
    for (let i = 0; i < 800; i++) x[i] = (0.01 * z[4 * i]) / Math.sqrt((z[4 * i + 1] ** 2 + z[4 * i + 2] ** 2 + z[4 * i + 3] ** 2) / 3);
    const r = testGnoFitted(x, { resamples: 39, seed: 3 });
    expect(r.adPValue).toBeLessThanOrEqual(0.05);
  });

  test("same seed → same result; chunking does not change the answer", () => {
    const x = sample({ location: 0, scale: 1, shape: 0.2 }, 60, 8);
    const a = testGnoFitted(x, { resamples: 29, seed: 5 });
    const b = startGnoBootstrap(x, { resamples: 29, seed: 5 });
    const seen: number[] = [];
    while (!b.run.progress.done) seen.push(b.run.step(4).completed);
    expect(seen).toEqual([4, 8, 12, 16, 20, 24, 28, 29]);
    expect(b.result()).toEqual(a);
    expect(a.seed).toBe(5);
    expect(testGnoFitted(x, { resamples: 29 }).seed).toBe(DEFAULT_SEED);
    expect(a.usedResamples + a.failedRefits).toBe(29);
    expect(a.fitMethod).toBe("mle");
    // The Monte Carlo p-value (1 + #{T* ≥ T})/(B + 1) lives on the grid 1/(B+1), 2/(B+1), …, 1 (Davison & Hinkley
    // 1997, Bootstrap Methods and their Application, eq. 4.11; North, Curtis & Sham 2002, Am. J. Hum. Genet. 71:439).
    for (const p of [a.ksPValue, a.adPValue]) {
      const steps = p * (a.usedResamples + 1);
      expect({ p, onGrid: Math.abs(steps - Math.round(steps)) < 1e-9 }).toEqual({ p, onGrid: true });
    }
    expect(a.ksPValue).toBeGreaterThanOrEqual(1 / 30);
    expect(a.ksPValue).toBeLessThanOrEqual(1);
  });

  test("work is bounded: when refits keep failing the run stops early and reports no p-values", () => {
    const x = sample({ location: 0, scale: 1, shape: 0 }, 40, 9);
    let fits = 0;
    const failing: BootstrapModel<GnoParams> = { ...normalModel, fit: () => (fits++, null) };
    const out = runBootstrap(x, failing, { location: 0, scale: 1, shape: 0 }, { resamples: 199, seed: 1 });
    // limit: more than max(10, 20% of 199 = 40) failures
    expect(fits).toBe(41);
    expect(out.stoppedEarly).toBe(true);
    expect(out.used).toBe(0);
    expect(Number.isNaN(out.ksPValue) && Number.isNaN(out.adPValue)).toBe(true);
  });

  test("progress is reported through the run until done", () => {
    const x = sample({ location: 0, scale: 1, shape: 0 }, 40, 9);
    const run = startBootstrap(x, normalModel, normalModel.fit(x, { location: 0, scale: 1, shape: 0 })!, { resamples: 25, seed: 1 });
    expect(run.progress).toEqual({ completed: 0, total: 25, done: false });
    const calls: number[] = [];
    runBootstrap(x, normalModel, { location: 0, scale: 1, shape: 0 }, { resamples: 25, seed: 1 }, (p) => calls.push(p.completed), 10);
    expect(calls).toEqual([10, 20, 25]);
  });
});

describe("fully specified GNO law", () => {
  test("exact p-values are uniform under the null: 300 datasets, n = 50, fraction with p ≤ 0.1 in the 99.9% band", () => {
    const p = { location: 0.001, scale: 0.01, shape: 0.25 };
    const [lo, hi] = binomialBand(300, 0.1, 0.001);
    let ks = 0;
    let ad = 0;
    for (let i = 0; i < 300; i++) {
      const r = testGnoSpecified(sample(p, 50, 30000 + i), p);
      if (r.ksPValue <= 0.1) ks++;
      if (r.adPValue <= 0.1) ad++;
      expect(r.method).toBe("exact");
    }
    if (!(ks >= lo && ks <= hi && ad >= lo && ad <= hi)) throw new Error(`KS ${ks}, AD ${ad} of 300; band [${lo}, ${hi}]`);
  });

  test("data beyond the upper edge: A² = +Infinity, AD p = 0, the count of outside points is reported", () => {
    const p = { location: 0, scale: 1, shape: 0.5 }; // upper edge at 2
    const x = [...sample(p, 30, 4), 2.5, 3];
    const r = testGnoSpecified(x, p);
    expect(r.adStatistic).toBe(Infinity);
    expect(r.adPValue).toBe(0);
    expect(r.outsideSupport).toBe(2);
    expect(r.ksStatistic).toBeGreaterThan(0);
  });

  test("KS D equals the brute-force supremum of |F_n − F| just before and at each observation", () => {
    const p = { location: 0.002, scale: 0.012, shape: -0.4 };
    const x = Array.from(sample(p, 37, 12));
    const s = gofStatistics(x, gnoLaw(p));
    let sup = 0;
    for (const v of x) {
      const at = x.filter((w) => w <= v).length / x.length;
      const before = x.filter((w) => w < v).length / x.length;
      sup = Math.max(sup, Math.abs(at - cdf(v, p)), Math.abs(before - cdf(v, p)));
    }
    expect(Math.abs(s.ks.d - sup)).toBeLessThanOrEqual(1e-15);
  });

  test("bootstrap reuses the cached MLE fit of the same numbers", () => {
    const x = sample({ location: 0, scale: 1, shape: 0.1 }, 50, 2);
    const b = startGnoBootstrap(x, { resamples: 19 });
    expect(b.fit).toBe(fitGnoCached(x, "mle"));
  });
});
