/**
 * Product moments of the GNO law. With e = exp(k²) (lognormal with σ = |k|; Johnson, Kotz & Balakrishnan 1994,
 * ch. 14; restated in Hosking & Wallis 1997 App. A.8; values recomputed with mpmath (40 digits) outside the repo):
 *   mean = ξ − α·expm1(k²/2)/k,  var = α²·e·(e − 1)/k²,
 *   skewness = −sign(k)(e + 2)√(e − 1),  excess kurtosis = e⁴ + 2e³ + 3e² − 6 = d(16 + d(15 + d(6 + d))), d = e − 1.
 * Every difference is carried by d = expm1(k²) or by series in k, so |k| = 1e-12 and k = 0 keep full accuracy
 * (the textbook forms lose all digits there).
 */
import type { GnoParams } from "./params";
import { isValidParams } from "./params";

/** Mean, standard deviation, skewness and excess kurtosis (plain read-only object). */
export interface GnoMoments {
  readonly mean: number;
  readonly sd: number;
  readonly skewness: number;
  readonly excessKurtosis: number;
}

/** expm1(u)/u, continuous through 0. */
function expm1Ratio(u: number): number {
  if (Math.abs(u) < 1e-8) return 1 + u / 2 + (u * u) / 6;
  return Math.expm1(u) / u;
}

/** (λ1 − ξ)/α = −expm1(k²/2)/k: the mean in reduced units (shared with the L-moments). */
export function reducedMean(k: number): number {
  return (-k / 2) * expm1Ratio((k * k) / 2);
}

/** Product moments; NaN fields for invalid params. */
export function moments(p: GnoParams): GnoMoments {
  if (!isValidParams(p)) return Object.freeze({ mean: NaN, sd: NaN, skewness: NaN, excessKurtosis: NaN });
  const { location: xi, scale: a, shape: k } = p;
  const k2 = k * k;
  const r = expm1Ratio(k2); // (e − 1)/k²
  const d = k2 * r; // e − 1
  const e = 1 + d;
  const sd = a * Math.sqrt(e * r);
  // sign(k)·√(e − 1) = k·√r keeps digits when k² underflows.
  const skewness = -(e + 2) * k * Math.sqrt(r);
  const excessKurtosis = d * (16 + d * (15 + d * (6 + d)));
  return Object.freeze({ mean: xi + a * reducedMean(k), sd, skewness: skewness === 0 ? 0 : skewness, excessKurtosis });
}
