/**
 * Bounded worst cases and small work units in the core (no wall clock: iterations and yields are counted).
 * Data are simulated with the core sampler (seeded); the outlier is planted by hand.
 */
import { sample } from "../../../src/core/gno";
import { fitGno } from "../../../src/core/fit";
import { SEARCH_WORK_BOUND } from "../../../src/core/fit/maximise";
import { bootstrapWork, gnoBootstrapModel, testGnoFittedWork } from "../../../src/core/gof";
import { compareFamiliesWork, evenSubsample } from "../../../src/core/compare";
import { varProfileIntervalWork } from "../../../src/core/risk";

const law = { location: 0.0003, scale: 0.011, shape: -0.12 };

function drive<T>(work: Generator<number, T, void>): { value: T; yields: number } {
  let yields = 0;
  for (;;) {
    const r = work.next();
    if (r.done) return { value: r.value, yields };
    yields++;
  }
}

describe("a fit with one wild outlier stays within the search bound", () => {
  test("one 1e10 among 20,000 returns: irregular with the bound in the reason, iterations × n near the bound", () => {
    const n = 20_000;
    const x = sample(law, n, 7);
    x[n >> 1] = 1e10;
    const f = fitGno(x);
    expect(f.regular).toBe(false);
    // the last profile point may run up to 200 iterations past the bound; before the bound this took ~4,000 iterations
    expect({ iterationsTimesN: f.iterations * n, reason: f.reason }).toEqual({
      iterationsTimesN: expect.any(Number),
      reason: expect.stringMatching(/work bound|no interior maximum/),
    });
    expect(f.iterations * n).toBeLessThanOrEqual(SEARCH_WORK_BOUND + 200 * n);
  });
});

describe("Work units are small", () => {
  test("the bootstrap yields once per replicate", () => {
    const x = sample(law, 200, 3);
    const fit = fitGno(x);
    const r = drive(bootstrapWork(x, gnoBootstrapModel("mle"), fit.params, { resamples: 25, seed: 1 }));
    expect(r.yields).toBe(25);
    expect(r.value.used + r.value.failedRefits).toBe(25);
  });

  test("GOF on data whose fit is irregular runs no replicate and says so (detected once)", () => {
    const x = sample(law, 500, 11);
    x[0] = 1e10;
    const fit = fitGno(x);
    expect(fit.regular).toBe(false);
    const r = drive(testGnoFittedWork(x, { fit, resamples: 199 }));
    expect(r.yields).toBe(0);
    expect(r.value.refused).toBe(true);
    expect(r.value.usedResamples).toBe(0);
    expect(Number.isNaN(r.value.ksPValue)).toBe(true);
  });

  test("COMPARE yields after each of its five families", () => {
    const x = sample(law, 300, 5);
    const r = drive(compareFamiliesWork(x));
    // at least one yield per family; the families themselves yield per pass too (Johnson SU, Student t)
    expect(r.yields).toBeGreaterThanOrEqual(5);
    expect(r.value.rows).toHaveLength(5);
  });

  test("the profile interval yields once per profile point", () => {
    const x = sample(law, 400, 9);
    const fit = fitGno(x);
    const r = drive(varProfileIntervalWork(x, fit, 0.99, "long", 0.95));
    expect(r.value.reason).toBeUndefined();
    // one yield before the end searches, then one per evaluation (evaluations counts the maximum as 1)
    expect(r.yields).toBe(r.value.evaluations);
  });
});

describe("COMPARE's subsample rule", () => {
  test("every m-th row from the first, m = ⌈n / most⌉", () => {
    const x = Float64Array.from({ length: 25 }, (_, i) => i);
    const s = evenSubsample(x, 10);
    expect(s.every).toBe(3);
    expect(Array.from(s.values)).toEqual([0, 3, 6, 9, 12, 15, 18, 21, 24]);
    expect(evenSubsample(x, 25).values).toBe(x);
  });
});
