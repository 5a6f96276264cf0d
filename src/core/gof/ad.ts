/**
 * Anderson–Darling statistic and its null distribution for a fully specified continuous law.
 *
 * Statistic: A² = −n − (1/n) Σ_i (2i − 1)[ln u_(i) + ln(1 − u_(n+1−i))], fed with ln F and ln(1 − F) computed
 * directly by the law (so far tails keep their digits). A value u = 0 or 1 gives A² = +Infinity.
 * Distribution: Marsaglia & Marsaglia (2004), "Evaluating the Anderson–Darling distribution", Journal of
 * Statistical Software 9(2): ADinf(z) for the limit law (two fitted pieces, split at z = 2) plus the finite-n
 * correction errfix(n, ADinf(z)). Stated accuracy about 6 decimals of P(A² < z).
 */

/**
 * A² from ln F(x_(i)) and ln(1 − F(x_(i))) in ascending order of x. NaN if lengths differ, n = 0 or any NaN.
 */
export function adStatistic(logCdfSorted: ArrayLike<number>, logSfSorted: ArrayLike<number>): number {
  const n = logCdfSorted.length;
  if (n === 0 || logSfSorted.length !== n) return NaN;
  let sum = 0;
  let comp = 0;
  for (let i = 0; i < n; i++) {
    const lf = logCdfSorted[i];
    const ls = logSfSorted[n - 1 - i];
    if (Number.isNaN(lf) || Number.isNaN(ls)) return NaN;
    if (lf === -Infinity || ls === -Infinity) return Infinity;
    // Kahan-compensated sum: the terms grow with i and n may be large.
    const term = (2 * i + 1) * (lf + ls) - comp;
    const t = sum + term;
    comp = t - sum - term;
    sum = t;
  }
  return -n - sum / n;
}

/** Limit law P(A² < z) as n → ∞ (Marsaglia & Marsaglia 2004, ADinf). */
export function adLimitCdf(z: number): number {
  if (Number.isNaN(z)) return NaN;
  if (z <= 0) return 0;
  if (z === Infinity) return 1;
  if (z < 2) {
    return (
      (Math.exp(-1.2337141 / z) / Math.sqrt(z)) *
      (2.00012 + (0.247105 - (0.0649821 - (0.0347962 - (0.011672 - 0.00168691 * z) * z) * z) * z) * z)
    );
  }
  return Math.exp(-Math.exp(1.0776 - (2.30695 - (0.43424 - (0.082433 - (0.008056 - 0.0003146 * z) * z) * z) * z) * z));
}

function errfix(n: number, v: number): number {
  const c = 0.01265 + 0.1757 / n;
  if (v < c) {
    const t = v / c;
    const g1 = Math.sqrt(t) * (1 - t) * (49 * t - 102);
    return ((0.0037 / (n * n) + 0.00078 / n + 0.00006) * g1) / n;
  }
  if (v < 0.8) {
    const t = (v - c) / (0.8 - c);
    const g2 = -0.00022633 + (6.54034 - (14.6538 - (14.458 - (8.259 - 1.91864 * t) * t) * t) * t) * t;
    return ((0.04213 + 0.01365 / n) * g2) / n;
  }
  const g3 = -130.2137 + (745.2337 - (1705.091 - (1950.646 - (1116.36 - 255.7844 * v) * v) * v) * v) * v;
  return g3 / n;
}

export interface AdProbability {
  /** P(A²_n < z). */
  readonly cdf: number;
  /** P(A²_n ≥ z), the p-value. */
  readonly pValue: number;
}

/** Null distribution of A² for sample size n at z (Marsaglia & Marsaglia 2004). NaN for invalid input. */
export function adProbability(n: number, z: number): AdProbability {
  if (!(Number.isInteger(n) && n >= 1) || Number.isNaN(z)) return { cdf: NaN, pValue: NaN };
  if (z === Infinity) return { cdf: 1, pValue: 0 };
  if (z <= 0) return { cdf: 0, pValue: 1 };
  const v = adLimitCdf(z);
  const cdf = Math.min(1, Math.max(0, v + errfix(n, v)));
  return { cdf, pValue: 1 - cdf };
}
