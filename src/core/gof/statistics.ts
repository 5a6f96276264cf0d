/**
 * KS and AD statistics of a sample against a fully specified continuous law. The law supplies ln F and
 * ln(1 − F) (computed directly, so far tails keep their digits: Marsaglia, Tsang & Wang 2003 (KS) and Marsaglia & Marsaglia 2004 (AD), J. Stat. Software; values recomputed with scipy 1.17 / mpmath outside the repo); KS uses F = exp(ln F), whose
 * absolute error is far below the KS statistic's resolution of 1/n.
 */
import { adStatistic } from "./ad";
import { ksStatistic, type KsStatistic } from "./ks";

/** What the statistics need from a law. */
export interface ContinuousLaw {
  logCdf(x: number): number;
  logSf(x: number): number;
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
  const n = data.length;
  const x = Float64Array.from(data).sort();
  const u = new Float64Array(n);
  const lf = new Float64Array(n);
  const ls = new Float64Array(n);
  let outside = 0;
  for (let i = 0; i < n; i++) {
    lf[i] = law.logCdf(x[i]);
    u[i] = Math.exp(lf[i]);
    ls[i] = law.logSf(x[i]);
    if (lf[i] === -Infinity || ls[i] === -Infinity) outside++;
  }
  return { n, ks: ksStatistic(u), ad: adStatistic(lf, ls), outsideSupport: outside };
}
