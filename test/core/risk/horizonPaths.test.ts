/**
 * Simulated horizons (src/core/risk/horizons/paths.ts) and the liquidity cascade (liquidity.ts):
 * - GARCH(1,1): variance of the simulated h-day sum against the analytic h-step forecast Σⱼ E[σ²ₜ₊ⱼ] with
 *   E[σ²ₜ₊ⱼ] = σ̄² + (α + β)^{j−1}(σ²ₜ₊₁ − σ̄²) (Bollerslev 1986; standard forecast recursion, common practice),
 *   written out here as a closed geometric sum; EWMA: E[σ²ₜ₊ⱼ] = σ²ₜ₊₁ (a martingale; RiskMetrics 1996);
 * - i.i.d.: simulated VaR / ES against the exact h-day law within 4 Monte Carlo standard errors;
 * - reproducibility for a seed;
 * - the cascade: buckets 100, 80, 50, 30, 20 at horizons 10, 20, 40, 60, 120 give 160 (worked by hand from the
 *   MAR33.4 formula: √(100² + 80²·1 + 50²·2 + 30²·2 + 20²·6) = √25600), one bucket returns itself.
 * Paths: 2·10⁴ – 4·10⁴ per case (the jest sandbox is slow); standard errors are batch means.
 */
import { runToEnd } from "../../../src/core/work";
import {
  BATCHES,
  garchSumVariance,
  horizonLaw,
  liquidityAdjustedEs,
  simulatedTail,
  simulateSums,
  type PathModel,
} from "../../../src/core/risk/horizons";
import { expectClose } from "./check";

/** Sample variance of the sums and its batch-means standard error (antithetic twins stay in one batch). */
function varianceWithError(sums: Float64Array): [number, number] {
  const per = Math.floor(sums.length / BATCHES / 2) * 2;
  const batchVar: number[] = [];
  for (let b = 0; b < BATCHES; b++) {
    const x = sums.subarray(b * per, (b + 1) * per);
    const m = x.reduce((s, v) => s + v, 0) / x.length;
    batchVar.push(x.reduce((s, v) => s + (v - m) ** 2, 0) / (x.length - 1));
  }
  const mean = batchVar.reduce((s, v) => s + v, 0) / BATCHES;
  const sd = Math.sqrt(batchVar.reduce((s, v) => s + (v - mean) ** 2, 0) / (BATCHES - 1));
  return [mean, sd / Math.sqrt(BATCHES)];
}

describe("GARCH(1,1) and EWMA paths against the analytic h-step variance", () => {
  const garch = (shape: number, nextVariance: number): PathModel => ({
    kind: "garch",
    mu: 0.0003,
    omega: 2e-6,
    alpha: 0.08,
    beta: 0.9,
    shape,
    nextVariance,
  });
  test("the recursion equals the closed geometric sum", () => {
    const [w, a, b, v1, h] = [2e-6, 0.08, 0.9, 4e-4, 10];
    const bar = w / (1 - a - b);
    const phi = a + b;
    const closed = h * bar + ((v1 - bar) * (1 - phi ** h)) / (1 - phi);
    expectClose("geometric sum", garchSumVariance(w, a, b, v1, h), closed, { rel: 1e-13 });
  });
  test.each([
    [0, 4e-4, true],
    [0.3, 4e-4, true],
    [-0.3, 5e-5, false],
  ])("shape %d, σ²ₜ₊₁ = %d, antithetic %s: variance of the 10-day sum within 4 standard errors", (k, v1, anti) => {
    const m = garch(k, v1) as Extract<PathModel, { kind: "garch" }>;
    const sim = runToEnd(simulateSums(m, { horizon: 10, paths: 40_000, seed: 77, antithetic: anti }));
    const [v, se] = varianceWithError(sim.sums);
    const want = garchSumVariance(m.omega, m.alpha, m.beta, m.nextVariance, 10);
    expectClose(`GARCH variance k=${k}`, v, want, { abs: 4 * se });
    // And far from the constant-variance answer when σ²ₜ₊₁ is far from σ̄² (the test can fail).
    expect(Math.abs(want - 10 * v1)).toBeGreaterThan(4 * se);
  });
  test("EWMA: variance of the h-day sum is h·σ²ₜ₊₁", () => {
    const m: PathModel = { kind: "ewma", lambda: 0.94, shape: 0.2, nextVariance: 1.5e-4 };
    const sim = runToEnd(simulateSums(m, { horizon: 20, paths: 30_000, seed: 5 }));
    const [v, se] = varianceWithError(sim.sums);
    expectClose("EWMA variance", v, 20 * 1.5e-4, { abs: 4 * se });
  });
  test("same seed gives the same paths; another seed does not", () => {
    const m = garch(0.2, 3e-4);
    const a = runToEnd(simulateSums(m, { horizon: 5, paths: 1000, seed: 9 }));
    const b = runToEnd(simulateSums(m, { horizon: 5, paths: 1000, seed: 9 }));
    const c = runToEnd(simulateSums(m, { horizon: 5, paths: 1000, seed: 10 }));
    expect(Array.from(a.sums)).toEqual(Array.from(b.sums));
    expect(a.sums[0]).not.toBe(c.sums[0]);
  });
});

describe("i.i.d. simulation agrees with the exact h-day law", () => {
  test.each([
    [-0.3, "long"],
    [0.3, "long"],
    [0.3, "short"],
  ] as const)("shape %d, %s side, 10 days: VaR and ES within 4 standard errors", (k, side) => {
    const law = { location: 0.0003, scale: 0.01, shape: k };
    const sim = runToEnd(simulateSums({ kind: "iid", law }, { horizon: 10, paths: 40_000, seed: 31 }));
    const t = simulatedTail(sim, 0.99, side);
    const exact = horizonLaw(law, 10);
    expect(t.valueAtRiskError).toBeGreaterThan(0);
    expectClose(`VaR k=${k} ${side}`, t.valueAtRisk, exact.valueAtRisk(0.99, side), { abs: 4 * t.valueAtRiskError });
    expectClose(`ES k=${k} ${side}`, t.expectedShortfall, exact.expectedShortfall(0.99, side), { abs: 4 * t.expectedShortfallError });
  });
});

describe("liquidity-horizon cascade", () => {
  test("buckets 100, 80, 50, 30, 20 give 160; one bucket returns itself", () => {
    expectClose("cascade", liquidityAdjustedEs([100, 80, 50, 30, 20]), 160, { rel: 1e-15 });
    expect(liquidityAdjustedEs([42.5])).toBe(42.5);
  });
  test("custom horizons use the first as the base; bad input gives NaN", () => {
    // √(10² + 10²·(20 − 10)/10) by hand.
    expectClose("two buckets", liquidityAdjustedEs([10, 10], [10, 20]), Math.sqrt(200), { rel: 1e-15 });
    expect(liquidityAdjustedEs([10, 10], [20, 20])).toBeNaN();
    expect(liquidityAdjustedEs([10, -1])).toBeNaN();
    expect(liquidityAdjustedEs([1, 2, 3, 4, 5, 6])).toBeNaN();
  });
});
