/**
 * Log-likelihood of generalized Pareto excesses with its analytic score and observed information.
 *
 * With t = y/β and a = ξt: ℓ(ξ, β) = −n ln β − Σ [log1p(a) + t·L(a)], L(a) = log1p(a)/a, because
 * (1 + 1/ξ)·log1p(ξt) = log1p(a) + t·L(a). Differentiating L brings in
 *   D(a) = L′(a) = (a/(1 + a) − log1p(a))/a²   and   D′(a) = −(1/(1 + a)² + 2D(a))/a,
 * whose direct forms cancel catastrophically near a = 0 (ξ → 0): below |a| = 0.1 they are summed from their
 * power series D(a) = Σ_{m≥2} (−1)^{m+1}(m−1)/m·a^{m−2}, D′(a) = Σ_{m≥3} (−1)^{m+1}(m−1)(m−2)/m·a^{m−3}.
 *   ∂ℓ/∂ξ   = −Σ [t/(1 + a) + t²·D(a)]
 *   ∂ℓ/∂β   = (−n + (1 + ξ)·Σ t/(1 + a))/β
 *   ∂²ℓ/∂ξ² = Σ [t²/(1 + a)² − t³·D′(a)]
 *   ∂²ℓ/∂ξ∂β = Σ t(1 − t)/(1 + a)² / β
 *   ∂²ℓ/∂β² = (n − (1 + ξ)·Σ [t/(1 + a) + t/(1 + a)²])/β²
 * (derived here; the ξ = 0 limits are the exponential law's, which the tests check).
 */
import type { GpdParams } from "./gpd";
import { log1pRatio } from "./gpd";

const SERIES_BELOW = 0.1;
const SERIES_TERMS = 24;

/** D(a) = d/da [log1p(a)/a]. */
export function ratioSlope(a: number): number {
  if (Math.abs(a) < SERIES_BELOW) {
    let s = 0;
    let pow = 1;
    for (let m = 2; m < 2 + SERIES_TERMS; m++) {
      s += ((m % 2 === 1 ? 1 : -1) * (m - 1) * pow) / m;
      pow *= a;
    }
    return s;
  }
  return (a / (1 + a) - Math.log1p(a)) / (a * a);
}

/** D′(a). */
export function ratioCurvature(a: number): number {
  if (Math.abs(a) < SERIES_BELOW) {
    let s = 0;
    let pow = 1;
    for (let m = 3; m < 3 + SERIES_TERMS; m++) {
      s += ((m % 2 === 1 ? 1 : -1) * (m - 1) * (m - 2) * pow) / m;
      pow *= a;
    }
    return s;
  }
  return -(1 / ((1 + a) * (1 + a)) + 2 * ratioSlope(a)) / a;
}

/** ℓ(ξ, β); −Infinity when an excess lies beyond the end of a bounded tail, NaN for invalid input. */
export function gpdLogLikelihood(excesses: ArrayLike<number>, p: GpdParams): number {
  const { shape: xi, scale: beta } = p;
  if (!(beta > 0) || !Number.isFinite(xi) || !Number.isFinite(beta)) return NaN;
  const n = excesses.length;
  let s = 0;
  for (let i = 0; i < n; i++) {
    const t = excesses[i] / beta;
    const a = xi * t;
    if (!(a > -1) || t < 0) return -Infinity;
    s += Math.log1p(a) + t * log1pRatio(a);
  }
  return -n * Math.log(beta) - s;
}

export interface GpdDerivatives {
  readonly logLikelihood: number;
  /** (∂ℓ/∂ξ, ∂ℓ/∂β). */
  readonly score: readonly [number, number];
  /** Observed information −∇²ℓ in the order (ξ, β): [[ξξ, ξβ], [ξβ, ββ]]. */
  readonly information: readonly [readonly [number, number], readonly [number, number]];
}

/** ℓ, its score and the observed information at p (NaN entries when an excess lies outside the support). */
export function gpdDerivatives(excesses: ArrayLike<number>, p: GpdParams): GpdDerivatives {
  const { shape: xi, scale: beta } = p;
  const n = excesses.length;
  let s = 0;
  let gXi = 0;
  let sT1 = 0;
  let sT2 = 0;
  let hXiXi = 0;
  let hXiBeta = 0;
  let bad = !(beta > 0);
  for (let i = 0; i < n && !bad; i++) {
    const t = excesses[i] / beta;
    const a = xi * t;
    if (!(a > -1) || t < 0) {
      bad = true;
      break;
    }
    const inv = 1 / (1 + a);
    s += Math.log1p(a) + t * log1pRatio(a);
    gXi -= t * inv + t * t * ratioSlope(a);
    sT1 += t * inv;
    sT2 += t * inv * inv;
    hXiXi += t * t * inv * inv - t * t * t * ratioCurvature(a);
    hXiBeta += t * (1 - t) * inv * inv;
  }
  if (bad) return { logLikelihood: -Infinity, score: [NaN, NaN], information: [[NaN, NaN], [NaN, NaN]] };
  const gBeta = (-n + (1 + xi) * sT1) / beta;
  const dXiBeta = hXiBeta / beta;
  const dBetaBeta = (n - (1 + xi) * (sT1 + sT2)) / (beta * beta);
  return {
    logLikelihood: -n * Math.log(beta) - s,
    score: [gXi, gBeta],
    information: [
      [-hXiXi, -dXiBeta],
      [-dXiBeta, -dBetaBeta],
    ],
  };
}
