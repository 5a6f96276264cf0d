/**
 * Liquidity-adjusted expected shortfall by horizon buckets, the cascade of the revised market-risk framework
 * (BCBS d457, 2019; MAR33.4; formula as quoted in public secondary sources, the BIS text itself not read here):
 *   ES = √( ES_T(P)² + Σ_{j≥2} ( ES_T(P, j)·√((LHⱼ − LHⱼ₋₁)/T) )² ),
 * with ES_T(P) the base-horizon ES of the whole portfolio, ES_T(P, j) the base-horizon ES with only the risk
 * factors whose liquidity horizon is at least LHⱼ shocked, T = LH₁ the base horizon (10 days), and liquidity
 * horizons 10, 20, 40, 60, 120 days by default.
 */

export const DEFAULT_LIQUIDITY_HORIZONS: readonly number[] = [10, 20, 40, 60, 120];

/** The cascade; NaN for mismatched lengths, non-finite or negative ES, or horizons not strictly increasing from > 0. */
export function liquidityAdjustedEs(es: ArrayLike<number>, horizons: ArrayLike<number> = DEFAULT_LIQUIDITY_HORIZONS): number {
  const n = es.length;
  if (n === 0 || horizons.length < n) return NaN;
  const base = horizons[0];
  if (!(base > 0)) return NaN;
  let s = 0;
  for (let j = 0; j < n; j++) {
    const e = es[j];
    if (!(Number.isFinite(e) && e >= 0)) return NaN;
    if (j === 0) {
      s += e * e;
      continue;
    }
    const gap = horizons[j] - horizons[j - 1];
    if (!(gap > 0) || !Number.isFinite(horizons[j])) return NaN;
    s += e * e * (gap / base);
  }
  return Math.sqrt(s);
}
