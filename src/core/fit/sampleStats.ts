/**
 * Sample summaries used by the fit: moments (two passes) and sample L-moments.
 *
 * Moments: two passes (the mean, then central power sums; see sampleMoments). Skewness and excess kurtosis are the
 * moment estimators g1 = √n·M3/M2^{3/2} and g2 = n·M4/M2² − 3 (no small-sample adjustment); the
 * standard deviation uses the n − 1 divisor. The pass also records the two smallest and two largest
 * observations (the edge diagnostics need the extreme and its neighbour).
 *
 * Sample L-moments: unbiased probability-weighted moments b0..b3 of the sorted sample
 * (Hosking 1990, JRSS-B 52:105-124; Hosking & Wallis 1997, ch. 2):
 *   b_r = (1/n) Σ_{j=r+1..n} [(j−1)…(j−r)] / [(n−1)…(n−r)] x_(j),
 *   l1 = b0, l2 = 2b1 − b0, l3 = 6b2 − 6b1 + b0, l4 = 20b3 − 30b2 + 12b1 − b0.
 */
import { sortedCopy } from "../sort";

/** One-pass summary of a sample. */
export interface SampleMoments {
  readonly n: number;
  readonly mean: number;
  /** Standard deviation with the n − 1 divisor. */
  readonly sd: number;
  /** Biased (divisor n) variance, the normal law's maximum-likelihood variance. */
  readonly varianceMle: number;
  readonly skewness: number;
  readonly excessKurtosis: number;
  readonly min: number;
  /** Second smallest observation (equal to min when tied). */
  readonly secondMin: number;
  readonly max: number;
  readonly secondMax: number;
}

/**
 * Mean, sd, skewness, excess kurtosis and the two extremes on each side. NaN fields for n < 2.
 * Two passes without a division per value: the mean (as Σ x/n, with the running compensation of Neumaier 1974 and
 * 1/n taken out, so no partial sum overflows for finite data), then the central power sums Σ d², Σ d³, Σ d⁴ of
 * d = x − mean (the textbook two-pass algorithm, as accurate as Welford's update and 3× cheaper here).
 */
export function sampleMoments(data: ArrayLike<number>): SampleMoments {
  const n = data.length;
  let min = Infinity;
  let min2 = Infinity;
  let max = -Infinity;
  let max2 = -Infinity;
  const invN = 1 / n;
  let sum = 0;
  let comp = 0;
  for (let i = 0; i < n; i++) {
    const x = data[i];
    const v = x * invN;
    const t = sum + v;
    comp += Math.abs(sum) >= Math.abs(v) ? sum - t + v : v - t + sum;
    sum = t;
    if (x < min) {
      min2 = min;
      min = x;
    } else if (x < min2) min2 = x;
    if (x > max) {
      max2 = max;
      max = x;
    } else if (x > max2) max2 = x;
  }
  let mean = sum + comp;
  // x·(1/n) can lose the last bits of a subnormal-scale or 1/n-inexact sum: keep the mean inside [min, max]
  if (mean < min) mean = min;
  if (mean > max) mean = max;
  if (n < 2) {
    return { n, mean: n === 1 ? data[0] : NaN, sd: NaN, varianceMle: NaN, skewness: NaN, excessKurtosis: NaN, min, secondMin: min2, max, secondMax: max2 };
  }
  let m2 = 0;
  let m3 = 0;
  let m4 = 0;
  for (let i = 0; i < n; i++) {
    const d = data[i] - mean;
    const d2 = d * d;
    m2 += d2;
    m3 += d2 * d;
    m4 += d2 * d2;
  }
  return {
    n,
    mean,
    sd: Math.sqrt(m2 / (n - 1)),
    varianceMle: m2 / n,
    skewness: m2 > 0 ? (Math.sqrt(n) * m3) / Math.pow(m2, 1.5) : NaN,
    excessKurtosis: m2 > 0 ? (n * m4) / (m2 * m2) - 3 : NaN,
    min,
    secondMin: min2,
    max,
    secondMax: max2,
  };
}

/** Sample L-moments l1, l2 and L-moment ratios t3 = l3/l2, t4 = l4/l2. */
export interface SampleLMoments {
  readonly l1: number;
  readonly l2: number;
  readonly t3: number;
  readonly t4: number;
}

/** Sample L-moments of an ascending-sorted sample (n ≥ 4; otherwise all NaN). */
export function sampleLMomentsSorted(sorted: ArrayLike<number>): SampleLMoments {
  const n = sorted.length;
  if (n < 4) return { l1: NaN, l2: NaN, t3: NaN, t4: NaN };
  // b_r = Σ_j c_r(j) x_(j) / [n (n−1)…(n−r)] with the integer weights c_r(j) = (j−1)…(j−r), each updated by one
  // multiplication per element and the divisions done once at the end (a division per weight per element cost
  // more than the rest of the loop)
  let s0 = 0;
  let s1 = 0;
  let s2 = 0;
  let s3 = 0;
  for (let j = 0; j < n; j++) {
    // j here is the 0-based rank: c1 = j, c2 = j (j−1), c3 = j (j−1)(j−2)
    const x = sorted[j];
    const c1 = j;
    const c2 = c1 * (j - 1);
    const c3 = c2 * (j - 2);
    s0 += x;
    s1 += c1 * x;
    s2 += c2 * x;
    s3 += c3 * x;
  }
  if (!Number.isFinite(s3)) return sampleLMomentsScaled(sorted); // |x|·n⁴ beyond the double range
  const b0 = s0 / n;
  const b1 = s1 / (n * (n - 1));
  const b2 = s2 / (n * (n - 1) * (n - 2));
  const b3 = s3 / (n * (n - 1) * (n - 2) * (n - 3));
  const l2 = 2 * b1 - b0;
  const l3 = 6 * b2 - 6 * b1 + b0;
  const l4 = 20 * b3 - 30 * b2 + 12 * b1 - b0;
  return { l1: b0, l2, t3: l3 / l2, t4: l4 / l2 };
}

/** sampleLMomentsSorted with weights kept in [0, 1] (a division per weight per element): for magnitudes near the double range. */
function sampleLMomentsScaled(sorted: ArrayLike<number>): SampleLMoments {
  const n = sorted.length;
  let b0 = 0;
  let b1 = 0;
  let b2 = 0;
  let b3 = 0;
  for (let j = 1; j <= n; j++) {
    const x = sorted[j - 1];
    const w1 = (j - 1) / (n - 1);
    const w2 = (w1 * (j - 2)) / (n - 2);
    const w3 = (w2 * (j - 3)) / (n - 3);
    b0 += x / n;
    b1 += (w1 * x) / n;
    b2 += (w2 * x) / n;
    b3 += (w3 * x) / n;
  }
  const l2 = 2 * b1 - b0;
  const l3 = 6 * b2 - 6 * b1 + b0;
  const l4 = 20 * b3 - 30 * b2 + 12 * b1 - b0;
  return { l1: b0, l2, t3: l3 / l2, t4: l4 / l2 };
}

/** Sample L-moments of any sample: sorts one copy (the only copy of the data the fit makes; src/core/sort.ts). */
export function sampleLMoments(data: ArrayLike<number>): SampleLMoments {
  // a typed array is copied with slice (a block copy); Float64Array.from would walk its iterator
  return sampleLMomentsSorted(sortedCopy(data));
}
