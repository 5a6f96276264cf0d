/**
 * slideStart (src/core/fit/slideStart.ts): the previous window's maximum moved by one Newton step for the value
 * dropped and the value added. Its error is second order (Newton's quadratic convergence, e.g. Nocedal & Wright
 * 2006, Thm 3.5), so against the new window's own maximum it must be far closer than the plain warm start (the
 * previous maximum unchanged). Distances are measured in standard errors (the inverse of −H at the new maximum).
 * Data: invented, simulated series (seeded).
 */
import { sample } from "../../../src/core/gno";
import { fitGno, fitGnoQuick, likelihoodDerivatives, slideStart } from "../../../src/core/fit";
import { swapDerivatives } from "../../../src/core/fit/likelihood";

/** Mahalanobis distance of p from the fit's estimate, in θ = (ξ, ln α, k), with the fit's covariance. */
function distance(fit: ReturnType<typeof fitGno>, p: { location: number; scale: number; shape: number }): number {
  const c = fit.covariance!;
  // covariance is in (ξ, α, k): take (ξ, α, k) differences directly
  const d = [p.location - fit.params.location, p.scale - fit.params.scale, p.shape - fit.params.shape];
  // solve c x = d by Gaussian elimination (3×3)
  const a = c.map((row, i) => [...row, d[i]]);
  for (let i = 0; i < 3; i++) {
    for (let r = i + 1; r < 3; r++) {
      const f = a[r][i] / a[i][i];
      for (let q = i; q < 4; q++) a[r][q] -= f * a[i][q];
    }
  }
  const x = [0, 0, 0];
  for (let i = 2; i >= 0; i--) {
    let s = a[i][3];
    for (let q = i + 1; q < 3; q++) s -= a[i][q] * x[q];
    x[i] = s / a[i][i];
  }
  return Math.sqrt(d[0] * x[0] + d[1] * x[1] + d[2] * x[2]);
}

describe("slideStart", () => {
  test.each([
    [-0.12, 250, 31],
    [0.25, 120, 32],
    [0, 60, 33],
  ])("shape %p, window %p: the updated start's error is second order (≤ the plain warm start's squared, in standard errors) and typically 10× smaller", (k, w, seed) => {
    const r = sample({ location: 0.0004, scale: 0.011, shape: k }, w + 40, seed);
    const ratios: number[] = [];
    for (let j = w; j < r.length - 1; j++) {
      const prev = fitGnoQuick(r.subarray(j - w, j));
      if (!prev.converged || !prev.hessian) continue;
      const next = fitGno(r.subarray(j - w + 1, j + 1));
      if (!next.regular || !next.covariance) continue;
      const slid = slideStart({ params: prev.params, hessian: prev.hessian, removed: r[j - w], added: r[j] });
      expect(slid).not.toBeNull();
      const plain = distance(next, prev.params);
      const moved = distance(next, slid!);
      if (!(moved <= plain * plain + 1e-9)) throw new Error(`row ${j}: slid start ${moved} SE from the maximum, plain warm start ${plain}`);
      ratios.push(plain / Math.max(moved, 1e-300));
    }
    expect(ratios.length).toBeGreaterThan(30);
    ratios.sort((a, b) => a - b);
    expect(ratios[Math.floor(ratios.length / 2)]).toBeGreaterThanOrEqual(10);
  });
  test("swapDerivatives equals the difference of two one-point passes (likelihoodDerivatives), to rounding", () => {
    const g = new Float64Array(3);
    const h = new Float64Array(9);
    for (const [xin, xout, k] of [[0.013, -0.02, -0.12], [-0.03, 0.001, 0.3], [0.002, 0.002, 0], [0.01, -0.01, 1e-9]]) {
      const a = Math.log(0.011);
      expect(swapDerivatives(xin, xout, 0.0004, a, k, g, h)).toBe(true);
      const p = likelihoodDerivatives([xin], 0.0004, a, k)!;
      const q = likelihoodDerivatives([xout], 0.0004, a, k)!;
      for (let i = 0; i < 3; i++) expect(Math.abs(g[i] - (p.gradient[i] - q.gradient[i]))).toBeLessThanOrEqual(1e-12 * (1 + Math.abs(p.gradient[i]) + Math.abs(q.gradient[i])));
      for (let i = 0; i < 9; i++) expect(Math.abs(h[i] - (p.hessian[i] - q.hessian[i]))).toBeLessThanOrEqual(1e-12 * (1 + Math.abs(p.hessian[i]) + Math.abs(q.hessian[i])));
    }
    // outside the support (upper edge 0.0004 + 0.011/0.3 ≈ 0.037 for k = 0.3)
    expect(swapDerivatives(0.05, 0, 0.0004, Math.log(0.011), 0.3, g, h)).toBe(false);
  });
  test("a value outside the support at the previous maximum gives null (the caller falls back)", () => {
    const r = sample({ location: 0, scale: 1, shape: 0.3 }, 100, 5);
    const prev = fitGnoQuick(r);
    const edge = prev.params.location + prev.params.scale / prev.params.shape; // upper edge for shape > 0
    expect(slideStart({ params: prev.params, hessian: prev.hessian!, removed: r[0], added: edge + 1 })).toBeNull();
  });
});
