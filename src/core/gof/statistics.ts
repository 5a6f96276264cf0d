/**
 * KS and AD statistics of a sample against a fully specified continuous law. The law supplies ln F and
 * ln(1 − F) (computed directly, so far tails keep their digits: Marsaglia, Tsang & Wang 2003 (KS) and Marsaglia & Marsaglia 2004 (AD), J. Stat. Software; values recomputed with scipy 1.17 / mpmath outside the repo); KS uses F = exp(ln F), whose
 * absolute error is far below the KS statistic's resolution of 1/n.
 *
 * A law defined through the normal, F(x) = Φ(y(x)), may instead supply y for all points at once (`normalVariates`):
 * then each point costs one tail evaluation instead of two. With a = |y| and the smaller tail q = Φ(−a):
 * ln q = ln(½ − ½ erf(a/√2)) for a/√2 ≤ 0.46875 and ln(½ erfcx(a/√2)) − a²/2 beyond (Cody's intervals, as in
 * normal/cdf.ts, so ln q stays accurate far below the underflow of q), q = exp(ln q), the other tail's log is
 * log1p(−q), and F is 1 − q or q by the sign of y.
 *
 * Both statistics come from one pass over the sorted points, with no array per call: D⁺ = max(i/n − u_(i)),
 * D⁻ = max(u_(i) − (i−1)/n), and A² = −n − (1/n) Σ_i [(2i − 1) ln u_(i) + (2n + 1 − 2i) ln(1 − u_(i))], the usual
 * A² sum with its second half re-indexed (Σ (2i − 1) ln(1 − u_(n+1−i)) over i equals the second term), summed
 * with Kahan compensation.
 */
import { erfCentral, ERF_SERIES_LIMIT, erfcxTail } from "../normal/erfc";
import type { KsStatistic } from "./ks";
import { sortedCopy } from "../sort";

/** What the statistics need from a law. */
export interface ContinuousLaw {
  logCdf(x: number): number;
  logSf(x: number): number;
  /**
   * Optional, for laws defined through the normal: writes y_i with F(x_i) = Φ(y_i) (±Infinity outside the
   * support, NaN for NaN) into out[i] for every point of x (out.length ≥ x.length).
   */
  normalVariates?(x: ArrayLike<number>, out: Float64Array): void;
}

export interface GofStatistics {
  readonly n: number;
  readonly ks: KsStatistic;
  /** Anderson–Darling A²; +Infinity when some observation has F = 0 or F = 1 (outside the support). */
  readonly ad: number;
  /** Observations with F = 0 or 1 exactly (outside the support, or beyond double precision). */
  readonly outsideSupport: number;
}

/** Statistics of `data` (any order; a sorted copy is made) against `law`. */
export function gofStatistics(data: ArrayLike<number>, law: ContinuousLaw): GofStatistics {
  return gofStatisticsSorted(sortedCopy(data), law);
}

const NAN_KS: KsStatistic = Object.freeze({ d: NaN, dPlus: NaN, dMinus: NaN });

/**
 * Scratch for the normal variates, kept between calls up to SCRATCH_MAX points (statistics run to completion, never
 * interleaved, so one buffer serves all); a larger sample gets a temporary array, so no big buffer stays alive.
 */
const SCRATCH_MAX = 1 << 17;
let scratch = new Float64Array(0);

function variateBuffer(n: number): Float64Array {
  if (n > SCRATCH_MAX) return new Float64Array(n);
  if (scratch.length < n) scratch = new Float64Array(Math.min(SCRATCH_MAX, Math.max(n, 2 * scratch.length)));
  return scratch;
}

/**
 * Statistics of `sorted` (ascending; the caller guarantees the order, no copy is made) against `law`.
 * KS is NaN for an empty sample or when some F is NaN; A² is NaN when some ln F or ln(1 − F) is NaN, else
 * +Infinity when some point has F = 0 or 1.
 */
export function gofStatisticsSorted(sorted: ArrayLike<number>, law: ContinuousLaw): GofStatistics {
  const n = sorted.length;
  if (n === 0) return { n, ks: NAN_KS, ad: NaN, outsideSupport: 0 };
  let ys: Float64Array | null = null;
  if (law.normalVariates) {
    ys = variateBuffer(n);
    law.normalVariates(sorted, ys);
  }
  let dPlus = -Infinity;
  let dMinus = -Infinity;
  let sum = 0;
  let comp = 0;
  let outside = 0;
  let nanU = false;
  let nan = false;
  let infinite = false;
  for (let i = 0; i < n; i++) {
    let lf: number;
    let ls: number;
    let u: number;
    if (ys) {
      const y = ys[i];
      const a = y < 0 ? -y : y;
      const t = a * Math.SQRT1_2;
      let lq: number;
      let q: number;
      if (t <= ERF_SERIES_LIMIT) {
        q = 0.5 - 0.5 * erfCentral(t);
        lq = Math.log(q);
      } else {
        // a = Infinity (outside the support): erfcx → 0, so ln q = −Infinity and q = 0; NaN stays NaN
        lq = Math.log(0.5 * erfcxTail(t)) - 0.5 * a * a;
        q = Math.exp(lq);
      }
      const lc = Math.log1p(-q);
      if (y >= 0) {
        lf = lc;
        ls = lq;
        u = 1 - q;
      } else {
        lf = lq;
        ls = lc;
        u = q;
      }
    } else {
      lf = law.logCdf(sorted[i]);
      ls = law.logSf(sorted[i]);
      u = Math.exp(lf);
    }
    if (u !== u) nanU = true;
    if (lf !== lf || ls !== ls) nan = true;
    if (lf === -Infinity || ls === -Infinity) {
      outside++;
      infinite = true;
    }
    const up = (i + 1) / n - u;
    const um = u - i / n;
    if (up > dPlus) dPlus = up;
    if (um > dMinus) dMinus = um;
    if (!infinite && !nan) {
      const term = (2 * i + 1) * lf + (2 * (n - i) - 1) * ls - comp;
      const t = sum + term;
      comp = t - sum - term;
      sum = t;
    }
  }
  const ks: KsStatistic = nanU ? NAN_KS : { d: Math.max(dPlus, dMinus), dPlus, dMinus };
  const ad = nan ? NaN : infinite ? Infinity : -n - sum / n;
  return { n, ks, ad, outsideSupport: outside };
}
