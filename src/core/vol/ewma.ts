/**
 * Exponentially weighted moving average variance (RiskMetrics Technical Document, J.P. Morgan/Reuters 1996, §5.2):
 *   σ²ₜ = λσ²ₜ₋₁ + (1 − λ)r²ₜ₋₁,  λ = 0.94 by default, zero mean.
 * Seeding rule: σ²₁ = the mean of r² over the sample the filter runs on (the window in a rolling forecast, the
 * whole column otherwise), the same pre-sample rule as the GARCH fit (garch.ts). With λ = 0.94 the seed's weight
 * λᵗ falls below 1% after 75 returns.
 */

export const DEFAULT_LAMBDA = 0.94;

/** σ²₁…σ²ₙ₊₁ (the last is the next day's variance); r must be finite. */
export function ewmaVariances(r: ArrayLike<number>, lambda = DEFAULT_LAMBDA): Float64Array {
  const n = r.length;
  const h = new Float64Array(n + 1);
  let seed = 0;
  for (let i = 0; i < n; i++) seed += r[i] * r[i];
  let v = n > 0 ? seed / n : NaN;
  for (let t = 0; t < n; t++) {
    h[t] = v;
    v = lambda * v + (1 - lambda) * r[t] * r[t];
  }
  h[n] = v;
  return h;
}
