/**
 * Diebold & Mariano (1995, J. Business & Economic Statistics 13:253-263) test of equal expected loss of two
 * forecast columns: d_t = L_a,t − L_b,t, DM = d̄ / sqrt(LRV/T), asymptotically N(0, 1) under equal expected loss.
 *
 * Long-run variance: Newey & West (1987) with Bartlett weights 1 − j/(m + 1),
 *   LRV = γ0 + 2 Σ_{j=1..m} (1 − j/(m + 1)) γ_j,   γ_j = (1/T) Σ_{t>j} (d_t − d̄)(d_{t−j} − d̄),
 * non-negative by construction. Lag rule m = ⌊4 (T/100)^{2/9}⌋ (the Bartlett rule of thumb of Newey & West 1994,
 * Review of Economic Studies 61:631-653 — from memory); a caller may fix m instead.
 *
 * Small-sample version (Harvey, Leybourne & Newbold 1997, Int. J. Forecasting 13:281-291): for one-step forecasts
 * (h = 1) DM* = DM·sqrt((T + 1 − 2h + h(h − 1)/T)/T) = DM·sqrt((T − 1)/T), compared with Student t, T − 1 degrees
 * of freedom. Both p-values are two-sided. A negative statistic means column a has the lower mean loss.
 */
import { studentTStandardCdf } from "../compare/studentT";
import { normalCdf } from "../normal";

/** Newey–West lag for T observations: ⌊4 (T/100)^{2/9}⌋. */
export function neweyWestLag(observations: number): number {
  return observations > 0 ? Math.floor(4 * Math.pow(observations / 100, 2 / 9)) : 0;
}

/** Bartlett-weighted long-run variance of a series (mean removed), with `lag` autocovariances. */
export function longRunVariance(d: ArrayLike<number>, lag: number): number {
  const T = d.length;
  if (T < 1) return NaN;
  let mean = 0;
  for (let t = 0; t < T; t++) mean += d[t];
  mean /= T;
  const autocovariance = (j: number) => {
    let s = 0;
    for (let t = j; t < T; t++) s += (d[t] - mean) * (d[t - j] - mean);
    return s / T;
  };
  let lrv = autocovariance(0);
  const m = Math.min(lag, T - 1);
  for (let j = 1; j <= m; j++) lrv += 2 * (1 - j / (m + 1)) * autocovariance(j);
  return lrv;
}

export interface DieboldMarianoTest {
  readonly observations: number;
  readonly lag: number;
  readonly meanLossA: number;
  readonly meanLossB: number;
  /** Mean of L_a − L_b (negative: a is better). */
  readonly meanDifference: number;
  readonly longRunVariance: number;
  readonly statistic: number;
  /** Two-sided p-value from N(0, 1). */
  readonly pValue: number;
  /** Harvey–Leybourne–Newbold statistic and its two-sided Student-t(T − 1) p-value. */
  readonly smallSampleStatistic: number;
  readonly smallSamplePValue: number;
}

/**
 * DM test on paired losses; pairs where either loss is NaN are skipped. Statistic NaN when fewer than 2 pairs
 * remain or the differences have no variance (e.g. identical columns).
 */
export function dieboldMariano(lossA: ArrayLike<number>, lossB: ArrayLike<number>, lag?: number): DieboldMarianoTest {
  const d: number[] = [];
  let sumA = 0;
  let sumB = 0;
  const n = Math.min(lossA.length, lossB.length);
  for (let t = 0; t < n; t++) {
    const a = lossA[t];
    const b = lossB[t];
    if (!Number.isFinite(a) || !Number.isFinite(b)) continue;
    d.push(a - b);
    sumA += a;
    sumB += b;
  }
  const T = d.length;
  const m = lag === undefined ? neweyWestLag(T) : Math.max(0, Math.floor(lag));
  const meanDifference = T > 0 ? d.reduce((s, x) => s + x, 0) / T : NaN;
  const lrv = T > 1 ? longRunVariance(d, m) : NaN;
  const scale = Math.max(Math.abs(sumA), Math.abs(sumB)) / Math.max(T, 1);
  const degenerate = !(lrv > 1e-28 * scale * scale);
  const statistic = T > 1 && !degenerate ? meanDifference / Math.sqrt(lrv / T) : NaN;
  const pValue = Number.isFinite(statistic) ? 2 * normalCdf(-Math.abs(statistic)) : NaN;
  const small = Number.isFinite(statistic) ? statistic * Math.sqrt((T - 1) / T) : NaN;
  const smallP = Number.isFinite(small) ? 2 * studentTStandardCdf(-Math.abs(small), T - 1) : NaN;
  return {
    observations: T,
    lag: m,
    meanLossA: T > 0 ? sumA / T : NaN,
    meanLossB: T > 0 ? sumB / T : NaN,
    meanDifference,
    longRunVariance: lrv,
    statistic,
    pValue,
    smallSampleStatistic: small,
    smallSamplePValue: smallP,
  };
}
