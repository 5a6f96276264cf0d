/**
 * The sample mean-excess function against the generalized Pareto law's own: e(u) = (β + ξ(u − u₀))/(1 − ξ) beyond
 * a threshold u₀ where the tail holds (Davison & Smith 1990), on a large seeded sample; and a hand count.
 */
import { gpdQuantileUpper, sampleMeanExcess } from "../../../src/core/pareto";
import { uniformStream } from "../../../src/core/random";

describe("sample mean excess", () => {
  test("follows (β + ξ·d)/(1 − ξ) for generalized Pareto losses, on the loss side", () => {
    const xi = 0.25;
    const beta = 0.01;
    const next = uniformStream(99);
    const n = 200000;
    // Losses as negative returns beyond −0.02.
    const x = Float64Array.from({ length: n }, () => -0.02 - gpdQuantileUpper(next(), { shape: xi, scale: beta }));
    const pts = sampleMeanExcess(x, "lower", { maxShare: 0.5, minExceedances: 2000, points: 10 });
    expect(pts.length).toBeGreaterThanOrEqual(5);
    for (const p of pts) {
      const d = -0.02 - p.threshold; // distance beyond the tail's start
      const want = (beta + xi * d) / (1 - xi);
      // Sampling error of a mean of p.exceedances excesses (sd of the excess ≈ mean/√(1 − 2ξ)): 5 standard errors.
      const se = want / Math.sqrt(1 - 2 * xi) / Math.sqrt(p.exceedances);
      if (!(Math.abs(p.meanExcess - want) < 5 * se)) throw new Error(`u ${p.threshold}: got ${p.meanExcess}, want ${want} ± ${5 * se}`);
    }
  });

  test("counts the returns strictly beyond each threshold (hand example)", () => {
    const x = [0.03, -0.05, 0.01, -0.02, 0.0, -0.04, 0.02, -0.01, 0.04, -0.03, 0.05, 0.015];
    const lower = sampleMeanExcess(x, "lower", { minExceedances: 2, maxShare: 0.25, points: 2 });
    // Threshold −0.03 (3rd most negative): beyond it −0.05, −0.04 → mean excess 0.015.
    expect(lower[0].threshold).toBe(-0.03);
    expect(lower[0].exceedances).toBe(2);
    expect(lower[0].meanExcess).toBeCloseTo(0.015, 15);
    const upper = sampleMeanExcess(x, "upper", { minExceedances: 2, maxShare: 0.25, points: 2 });
    // Threshold 0.03: beyond it 0.05, 0.04 → 0.015.
    expect(upper[0].threshold).toBe(0.03);
    expect(upper[0].meanExcess).toBeCloseTo(0.015, 15);
  });
});
