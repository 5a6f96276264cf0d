/**
 * The standardized innovation law: Hosking's generalized normal with mean 0 and variance 1 for a shape k, and the
 * per-observation log-density kernel with its analytic derivatives that the volatility likelihoods chain through.
 *
 * From the product moments of the law (lognormal link with σ = |k|; Johnson, Kotz & Balakrishnan 1994, ch. 14):
 *   mean = ξ + α·m(k), m(k) = −expm1(k²/2)/k;   variance = α²·e^{k²}·expm1(k²)/k².
 * Mean 0 and variance 1 give the closed forms
 *   α(k) = [e^{k²}·expm1(k²)/k²]^{−1/2},   ξ(k) = −α(k)·m(k),
 * with derivatives d ln α/dk = −k(1 + c(k²)), c(u) = 1/(1 − e^{−u}) − 1/u (series ½ + u/12 for small u), and
 * m′(k) = −e^{k²/2} + ½·expm1(k²/2)/(k²/2), so ξ′ = −α(m·d ln α/dk + m′). Every difference is carried by expm1 or a
 * series, so k = 0 (the standard normal: ξ = 0, α = 1) and |k| down to 1e-12 keep full accuracy.
 *
 * Kernel (as in src/core/fit/likelihood.ts, per observation): x ~ GNO(L, A = e^a, k), t = (x − L)/A, w = 1 − kt,
 * y = −ln(w)/k, E = 1/w, z = ky, g(z) = (e^z − 1 − z)/z²:
 *   ℓ = ky − y²/2 − a − ½ ln 2π,  ∂ℓ/∂L = (k − y)(−E/A),  ∂ℓ/∂a = −(k − y)tE − 1,  ∂ℓ/∂k = (k − y)y²g + y.
 */
import type { GnoParams } from "../gno";

export const HALF_LOG_2PI = 0.9189385332046728;

/** Largest |k| a volatility model's innovation law may take (standardized skewness about ∓6 at the cap). */
export const INNOVATION_SHAPE_CAP = 1;

function expm1Ratio(u: number): number {
  if (Math.abs(u) < 1e-8) return 1 + u / 2 + (u * u) / 6;
  return Math.expm1(u) / u;
}

/** Location ξ(k) and scale α(k) of the mean-0, variance-1 law, and their derivatives in k. */
export interface StandardizedShape {
  readonly shape: number;
  readonly location: number;
  readonly scale: number;
  /** d ξ/dk */
  readonly dLocation: number;
  /** d ln α/dk */
  readonly dLogScale: number;
}

export function standardizedShape(k: number): StandardizedShape {
  const u = k * k;
  const logScale = -0.5 * (u + Math.log(expm1Ratio(u)));
  const scale = Math.exp(logScale);
  const c = u < 1e-4 ? 0.5 + u / 12 : 1 / -Math.expm1(-u) - 1 / u;
  const dLogScale = -k * (1 + c);
  const v = u / 2;
  const m = (-k / 2) * expm1Ratio(v);
  const dm = -Math.exp(v) + 0.5 * expm1Ratio(v);
  const location = -scale * m;
  const dLocation = -scale * (m * dLogScale + dm);
  return { shape: k, location: location === 0 ? 0 : location, scale, dLocation, dLogScale };
}

/** The standardized innovation law as GNO parameters (mean 0, variance 1). */
export function innovationLaw(k: number): GnoParams {
  const s = standardizedShape(k);
  return { location: s.location, scale: s.scale, shape: k };
}

/** The law of μ + σ·Z with Z the standardized law of shape k: GNO(μ + σξ(k), σα(k), k). */
export function scaledLaw(mean: number, sigma: number, k: number): GnoParams {
  const s = standardizedShape(k);
  return { location: mean + sigma * s.location, scale: sigma * s.scale, shape: k };
}

/** Upper (k > 0) or lower (k < 0) edge of the standardized law in σ units; null at k = 0. */
export function innovationEdge(k: number): number | null {
  if (k === 0) return null;
  const s = standardizedShape(k);
  return s.location + s.scale / k;
}

// g(z) = Σ zⁿ/(n+2)!, coefficients for n = 0..15
const G_COEF: number[] = [];
{
  let f = 2;
  for (let n = 0; n < 16; n++) {
    G_COEF.push(1 / f);
    f *= n + 3;
  }
}

/** One observation's log-density and derivatives; `value` is −Infinity outside the support. */
export interface PointScore {
  value: number;
  dLocation: number;
  dLogScale: number;
  dShape: number;
}

/** Fills `out` with ℓ and ∂ℓ/∂(L, a, k) for x ~ GNO(L, e^a, k), A = e^a given; returns false outside the support. */
export function pointScore(x: number, location: number, scale: number, logScale: number, k: number, out: PointScore): boolean {
  const t = (x - location) / scale;
  const u = k * t;
  const w = 1 - u;
  if (!(w > 0)) {
    out.value = -Infinity;
    return false;
  }
  const y = u === 0 ? t : -Math.log1p(-u) / k;
  const E = 1 / w;
  const z = k * y;
  let g: number;
  if (Math.abs(z) < 0.5) {
    g = G_COEF[15];
    for (let j = 14; j >= 0; j--) g = g * z + G_COEF[j];
  } else g = (u / w - z) / (z * z);
  const r = k - y;
  out.value = k * y - 0.5 * y * y - logScale - HALF_LOG_2PI;
  out.dLocation = (-r * E) / scale;
  out.dLogScale = -r * t * E - 1;
  out.dShape = r * y * y * g + y;
  return true;
}
