/**
 * Parameters of Hosking's generalized normal (GNO) law: location ξ, scale α > 0, shape k.
 * y = −ln(1 − k(x − ξ)/α)/k (y = (x − ξ)/α at k = 0), F(x) = Φ(y). k > 0: upper edge ξ + α/k, left skew;
 * k < 0: lower edge, right skew; k = 0: the normal law N(ξ, α²).
 * Reference: J. R. M. Hosking & J. R. Wallis (1997), Regional Frequency Analysis, Cambridge UP, Appendix A.8.
 */

/** GNO parameters (plain read-only value). */
export interface GnoParams {
  readonly location: number;
  readonly scale: number;
  readonly shape: number;
}

/** True when every parameter is finite and the scale is strictly positive. */
export function isValidParams(p: GnoParams): boolean {
  return Number.isFinite(p.location) && Number.isFinite(p.shape) && Number.isFinite(p.scale) && p.scale > 0;
}
