/**
 * The generalized Pareto law (GPD) of an excess y ≥ 0 over a threshold: shape ξ, scale β > 0
 * (Pickands 1975; Hosking & Wallis 1987, Technometrics 29:339–349, who write k = −ξ):
 *   survival S(y) = (1 + ξy/β)^(−1/ξ),  S(y) = e^(−y/β) at ξ = 0;  support [0, ∞) for ξ ≥ 0, [0, −β/ξ] for ξ < 0.
 *
 * Every formula goes through the cumulative hazard H(y) = −ln S(y) = log1p(ξy/β)/ξ, which keeps full relative
 * accuracy as ξ → 0 (log1p of a tiny argument is exact to rounding), so |ξ| = 1e-12 agrees with the exponential
 * limit to the last digits and ξ = 0 is an ordinary point, not a special case with a jump. The quantile uses
 * expm1 for the same reason: y(q) = β·expm1(−ξ ln q)/ξ for an exceedance probability q.
 * Total on its domain: NaN for invalid parameters; 0 / 1 / the end of the support outside it.
 */

/** Shape ξ and scale β > 0 of a generalized Pareto law of excesses. */
export interface GpdParams {
  readonly shape: number;
  readonly scale: number;
}

export function isValidGpd(p: GpdParams): boolean {
  return Number.isFinite(p.shape) && Number.isFinite(p.scale) && p.scale > 0;
}

/** log1p(a)/a, continuous through a = 0. */
export function log1pRatio(a: number): number {
  return a === 0 ? 1 : Math.log1p(a) / a;
}

/** expm1(a)/a, continuous through a = 0. */
export function expm1Ratio(a: number): number {
  return a === 0 ? 1 : Math.expm1(a) / a;
}

/** The largest possible excess: −β/ξ for ξ < 0, Infinity otherwise. */
export function gpdUpperEnd(p: GpdParams): number {
  if (!isValidGpd(p)) return NaN;
  return p.shape < 0 ? -p.scale / p.shape : Infinity;
}

/** Cumulative hazard H(y) = −ln S(y): 0 for y ≤ 0, Infinity at or beyond the end of a bounded tail. */
export function gpdHazard(y: number, p: GpdParams): number {
  if (!isValidGpd(p) || Number.isNaN(y)) return NaN;
  if (y <= 0) return 0;
  const t = y / p.scale;
  const a = p.shape * t;
  if (a <= -1) return Infinity;
  return t * log1pRatio(a);
}

/** S(y) = P(Y > y). */
export function gpdSf(y: number, p: GpdParams): number {
  return Math.exp(-gpdHazard(y, p));
}

/** ln S(y). */
export function gpdLogSf(y: number, p: GpdParams): number {
  return -gpdHazard(y, p);
}

/** G(y) = P(Y ≤ y) = −expm1(−H(y)). */
export function gpdCdf(y: number, p: GpdParams): number {
  const h = gpdHazard(y, p);
  return Number.isNaN(h) ? NaN : -Math.expm1(-h);
}

/** ln g(y) = −ln β − H(y) − log1p(ξy/β); −Infinity outside the support. */
export function gpdLogPdf(y: number, p: GpdParams): number {
  if (!isValidGpd(p) || Number.isNaN(y)) return NaN;
  if (y < 0) return -Infinity;
  const t = y / p.scale;
  const a = p.shape * t;
  if (a <= -1) return p.shape < -1 && a === -1 ? Infinity : -Infinity;
  return -Math.log(p.scale) - t * log1pRatio(a) - Math.log1p(a);
}

/** Density g(y). */
export function gpdPdf(y: number, p: GpdParams): number {
  return Math.exp(gpdLogPdf(y, p));
}

/** The excess exceeded with probability q ∈ [0, 1]: β·expm1(−ξ ln q)/ξ (−β ln q at ξ = 0). */
export function gpdQuantileUpper(q: number, p: GpdParams): number {
  if (!isValidGpd(p) || !(q >= 0 && q <= 1)) return NaN;
  if (q === 1) return 0;
  if (q === 0) return gpdUpperEnd(p);
  const lnq = Math.log(q);
  return -p.scale * lnq * expm1Ratio(-p.shape * lnq);
}

/** The excess below which a draw falls with probability prob ∈ [0, 1] (ln(1 − prob) via log1p). */
export function gpdQuantile(prob: number, p: GpdParams): number {
  if (!isValidGpd(p) || !(prob >= 0 && prob <= 1)) return NaN;
  if (prob === 0) return 0;
  if (prob === 1) return gpdUpperEnd(p);
  const lnq = Math.log1p(-prob);
  return -p.scale * lnq * expm1Ratio(-p.shape * lnq);
}

/**
 * Mean excess beyond an excess y already reached: E[Y − y | Y > y] = (β + ξy)/(1 − ξ) for ξ < 1 (the GPD's
 * mean-excess function is linear in y); Infinity for ξ ≥ 1 (infinite mean).
 */
export function gpdMeanExcess(y: number, p: GpdParams): number {
  if (!isValidGpd(p) || Number.isNaN(y)) return NaN;
  if (p.shape >= 1) return Infinity;
  const z = Math.max(y, 0);
  return (p.scale + p.shape * z) / (1 - p.shape);
}

/**
 * E[min(Y, y)] = ∫₀^y S(t) dt = β·(1 − e^{−(1−ξ)H(y)})/(1 − ξ), finite for every ξ (β·H(y) at ξ = 1).
 */
export function gpdLimitedMean(y: number, p: GpdParams): number {
  if (!isValidGpd(p) || Number.isNaN(y)) return NaN;
  if (y <= 0) return 0;
  const h = gpdHazard(y, p);
  const c = 1 - p.shape;
  if (h === Infinity) return c > 0 ? p.scale / c : Infinity;
  return p.scale * h * expm1Ratio(-c * h);
}

/**
 * Raw moment E[Y^r] = β^r·r!/∏_{i=1..r}(1 − iξ) for ξ < 1/r (r = 1…4); Infinity when ξ ≥ 1/r (the moment
 * does not exist). Hosking & Wallis (1987), section 2.
 */
export function gpdRawMoment(r: number, p: GpdParams): number {
  if (!isValidGpd(p)) return NaN;
  if (p.shape * r >= 1) return Infinity;
  let m = 1;
  for (let i = 1; i <= r; i++) m *= (i * p.scale) / (1 - i * p.shape);
  return m;
}
