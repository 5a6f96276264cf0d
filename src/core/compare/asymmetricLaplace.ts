/**
 * Asymmetric Laplace law in the Kozubowski–Podgórski form used by scipy's laplace_asymmetric
 * (textbook densities; log-likelihoods recomputed with scipy 1.17 outside the repo): location m, scale s > 0, asymmetry κ > 0, z = (x − m)/s,
 *   log f = −ln s − ln(κ + 1/κ) − κ z  (z ≥ 0),   + z/κ  (z < 0).
 * κ = 1 is the Laplace law; κ > 1 gives the heavier LEFT tail (the loss side of returns).
 * CDF: F = κ²/(1+κ²) e^{z/κ} for z < 0 and 1 − e^{−κz}/(1+κ²) for z ≥ 0, so the quantile is closed form.
 *
 * Maximum likelihood, exact. With A(m) = mean (x−m)⁺ and B(m) = mean (m−x)⁺, the score in s gives
 * s = κA + B/κ, then the one in κ gives κ⁴ = B/A, and the profile is ln L(m) = −n − 2n ln(√A + √B)
 * (derived here; cf. Kotz, Kozubowski & Podgórski 2001, "The Laplace distribution and generalizations",
 * ch. 3, from memory). A and B are linear between order statistics, so √A + √B is concave there and its
 * minimum sits at an observation: the search scans the order statistics with prefix sums, O(n log n), no
 * iteration. The two extremes are excluded (A or B would vanish and the law degenerate).
 */
import { sortedCopy } from "../sort";

export interface AsymmetricLaplaceParams {
  readonly location: number;
  readonly scale: number;
  readonly kappa: number;
}

function valid(p: AsymmetricLaplaceParams): boolean {
  return Number.isFinite(p.location) && p.scale > 0 && Number.isFinite(p.scale) && p.kappa > 0 && Number.isFinite(p.kappa);
}

/** Log-likelihood of the data; NaN for invalid parameters. */
export function asymmetricLaplaceLogLikelihood(data: ArrayLike<number>, p: AsymmetricLaplaceParams): number {
  if (!valid(p)) return NaN;
  const n = data.length;
  let above = 0;
  let below = 0;
  for (let i = 0; i < n; i++) {
    const z = (data[i] - p.location) / p.scale;
    if (z >= 0) above += z;
    else below -= z;
  }
  return -n * Math.log(p.scale) - n * Math.log(p.kappa + 1 / p.kappa) - p.kappa * above - below / p.kappa;
}

/** Quantile; ±Infinity at 1 and 0, NaN outside [0, 1] or for invalid parameters. */
export function asymmetricLaplaceQuantile(prob: number, p: AsymmetricLaplaceParams): number {
  if (!valid(p) || !(prob >= 0 && prob <= 1)) return NaN;
  if (prob === 0) return -Infinity;
  if (prob === 1) return Infinity;
  const k2 = p.kappa * p.kappa;
  const split = k2 / (1 + k2);
  const z = prob < split ? p.kappa * Math.log((prob * (1 + k2)) / k2) : -Math.log1p(-prob) / p.kappa - Math.log1p(k2) / p.kappa;
  return p.location + p.scale * z;
}

export interface AsymmetricLaplaceFit {
  readonly params: AsymmetricLaplaceParams;
  readonly logLikelihood: number;
}

/** Exact maximum-likelihood fit (n ≥ 3 with at least 3 distinct values); NaN parameters otherwise. */
export function fitAsymmetricLaplace(data: ArrayLike<number>): AsymmetricLaplaceFit {
  const n = data.length;
  const x = sortedCopy(data);
  let total = 0;
  for (let i = 0; i < n; i++) total += x[i];
  let best = Infinity;
  let bestJ = -1;
  let bestA = NaN;
  let bestB = NaN;
  let prefix = x[0];
  for (let j = 1; j < n - 1; j++) {
    const m = x[j];
    // prefix = Σ_{i<j} x_i; observations tied with m contribute 0 to both sides whichever side counts them.
    const a = (total - prefix - m - (n - j - 1) * m) / n;
    const b = (j * m - prefix) / n;
    prefix += m;
    if (!(a > 0 && b > 0)) continue;
    const h = Math.sqrt(a) + Math.sqrt(b);
    if (h < best) {
      best = h;
      bestJ = j;
      bestA = a;
      bestB = b;
    }
  }
  if (bestJ < 0) return { params: { location: NaN, scale: NaN, kappa: NaN }, logLikelihood: NaN };
  const kappa = Math.pow(bestB / bestA, 0.25);
  const params = { location: x[bestJ], scale: kappa * bestA + bestB / kappa, kappa };
  return { params, logLikelihood: asymmetricLaplaceLogLikelihood(data, params) };
}
