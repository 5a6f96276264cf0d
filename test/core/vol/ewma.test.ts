/**
 * The standardized innovation law, EWMA, the next-day law and Ljung–Box against outside references:
 *  - innovation law: mean 0 and variance 1 by numerical integration of the published quantile
 *    (Hosking & Wallis 1997, App. A.8) over the normal variate (trapezoid on y ∈ [−12, 12], step 1e-3); continuity
 *    at k = 1e-12 against k = 0 (the standard normal);
 *  - EWMA against the RiskMetrics (1996) recursion written out by hand with the documented seed;
 *  - next-day law against σₙ₊₁ and the innovation law;
 *  - χ² survival against jstat 1.9.6; Ljung–Box statistic against its formula written out by hand.
 */
import { quantile } from "../../../src/core/gno";
import { valueAtRisk } from "../../../src/core/risk";
import { chiSquareSf, ewmaVariances, filterReturns, fitVolatility, innovationLaw, ljungBox, standardizedShape } from "../../../src/core/vol";
import { jStatChiSquare } from "../../refs/jstat";
import { simulateGarch, standardized } from "./simulate";

describe("standardized innovation law", () => {
  test.each([0, 0.2, -0.5, 0.9])("shape %p has mean 0 and variance 1 (numerical integration, 1e-9)", (k) => {
    const p = innovationLaw(k);
    let m = 0;
    let v = 0;
    const h = 1e-3;
    for (let y = -12; y <= 12; y += h) {
      const w = Math.exp(-0.5 * y * y) / Math.sqrt(2 * Math.PI) * h;
      const x = k === 0 ? p.location + p.scale * y : p.location + (p.scale * (1 - Math.exp(-k * y))) / k;
      m += w * x;
      v += w * x * x;
    }
    expect(Math.abs(m)).toBeLessThan(1e-9);
    expect(Math.abs(v - 1)).toBeLessThan(1e-9);
  });
  test("agrees with the textbook moment formulas away from 0, and is continuous at k = 1e-12", () => {
    for (const k of [0.3, -0.7]) {
      const a = standardizedShape(k);
      const b = standardized(k);
      expect(Math.abs(a.scale - b.alpha)).toBeLessThan(1e-14);
      expect(Math.abs(a.location - b.xi)).toBeLessThan(1e-14);
    }
    const t = standardizedShape(1e-12);
    expect(Math.abs(t.scale - 1)).toBeLessThan(1e-15);
    expect(Math.abs(t.location - 5e-13)).toBeLessThan(1e-20); // ξ(k) ≈ k/2 for small k (series of −α m(k))
  });
  test("derivatives in k match central differences", () => {
    for (const k of [0, 0.3, -0.6]) {
      const h = 1e-6;
      const a = standardizedShape(k);
      const up = standardizedShape(k + h);
      const dn = standardizedShape(k - h);
      expect(Math.abs(a.dLocation - (up.location - dn.location) / (2 * h))).toBeLessThan(1e-8);
      expect(Math.abs(a.dLogScale - (Math.log(up.scale) - Math.log(dn.scale)) / (2 * h))).toBeLessThan(1e-8);
    }
  });
});

describe("EWMA", () => {
  const r = simulateGarch({ mu: 0, omega: 2e-6, alpha: 0.08, beta: 0.9, k: 0.2 }, 300, 5).returns;
  test("σ² follows λσ²ₜ₋₁ + (1 − λ)r²ₜ₋₁ from the mean-square seed (by hand, λ = 0.94 and 0.97)", () => {
    for (const lambda of [0.94, 0.97]) {
      const h = ewmaVariances(r, lambda);
      let seed = 0;
      for (const x of r) seed += x * x;
      let v = seed / r.length;
      for (let t = 0; t <= r.length; t++) {
        expect(Math.abs(h[t] - v)).toBeLessThanOrEqual(1e-15 * v);
        if (t < r.length) v = lambda * v + (1 - lambda) * r[t] * r[t];
      }
    }
  });
  test("the filter's residuals are r/σ and the next-day law is GNO(σξ(k), σα(k), k)", () => {
    const f = filterReturns(r, { kind: "ewma" });
    const h = ewmaVariances(r);
    expect(f.residuals[7]).toBe(r[7] / Math.sqrt(h[7]));
    const est = fitVolatility(r, "ewma", { innovations: "gno" });
    const s = standardizedShape(est.shape);
    expect(est.nextDay.location).toBeCloseTo(est.nextSigma * s.location, 15);
    expect(est.nextDay.scale).toBeCloseTo(est.nextSigma * s.scale, 15);
    // VaR of the next-day law = −σ·(1% quantile of the innovation law)
    const want = -est.nextSigma * quantile(0.01, innovationLaw(est.shape));
    expect(Math.abs(valueAtRisk(0.99, est.nextDay) - want)).toBeLessThan(1e-12 * Math.abs(want));
  });
});

describe("Ljung–Box and χ²", () => {
  test.each([[3.2, 1], [9.1, 10], [27.2, 10], [150, 20], [0.5, 4]])("P(χ² > %p), %p dof, agrees with jstat within 1e-10", (x, df) => {
    expect(Math.abs(chiSquareSf(x, df) - (1 - jStatChiSquare.cdf(x, df)))).toBeLessThan(1e-10);
  });
  test("Q = n(n+2) Σ ρ̂ⱼ²/(n − j) by hand", () => {
    const x = simulateGarch({ mu: 0, omega: 1, alpha: 0.2, beta: 0.5, k: 0 }, 200, 9).returns.map((v) => v * v);
    const n = x.length;
    const m = x.reduce((a, b) => a + b, 0) / n;
    const c = (j: number) => {
      let s = 0;
      for (let i = j; i < n; i++) s += (x[i] - m) * (x[i - j] - m);
      return s;
    };
    let q = 0;
    for (let j = 1; j <= 5; j++) q += (c(j) / c(0)) ** 2 / (n - j);
    q *= n * (n + 2);
    expect(Math.abs(ljungBox(x, 5).statistic - q)).toBeLessThan(1e-10 * q);
  });
});
