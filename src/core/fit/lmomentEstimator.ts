/**
 * Method of L-moments for the generalized normal law.
 *
 * Published algorithm: Hosking's PELGNO (LMOMENTS Fortran package v3, 1996; Hosking & Wallis 1997,
 * "Regional Frequency Analysis", Appendix A.8). The shape follows from the sample L-skewness t3 by a
 * rational approximation
 *   k = −t3 (E0 + E1 t3² + E2 t3⁴ + E3 t3⁶) / (1 + F1 t3² + F2 t3⁴ + F3 t3⁶),
 * then, with e = exp(k²/2), scale α = l2·k / (e·erf(k/2)) and location ξ = l1 + α(e − 1)/k.
 * For |t3| ≤ 1e-8 the law is the normal: k = 0, α = l2·√π, ξ = l1.
 * Domain: l2 > 0 and |t3| < 0.95 (Hosking's limit, |k| ≲ 3.04). Beyond it this module truncates t3 to
 * ±0.95 and says so (`truncated`), rather than refusing; the caller turns that into a warning.
 */
import { erf } from "../normal";
import type { GnoParams } from "../gno";
import type { SampleLMoments } from "./sampleStats";

const E0 = 2.0466534;
const E1 = -3.6544371;
const E2 = 1.8396733;
const E3 = -0.20360244;
const F1 = -2.0182173;
const F2 = 1.2420401;
const F3 = -0.21741801;

/** Largest |t3| the estimator accepts (Hosking's PELGNO limit). */
export const MAX_ABS_LSKEW = 0.95;

export interface LMomentEstimate {
  readonly params: GnoParams;
  /** True when |t3| ≥ 0.95 and was pulled back to ±0.95. */
  readonly truncated: boolean;
}

/** Shape k from the L-skewness t3 (the PELGNO rational approximation); NaN outside |t3| < 1. */
export function shapeFromLSkewness(t3: number): number {
  if (!(Math.abs(t3) < 1)) return NaN;
  if (Math.abs(t3) <= 1e-8) return 0;
  const t2 = t3 * t3;
  return (-t3 * (E0 + t2 * (E1 + t2 * (E2 + t2 * E3)))) / (1 + t2 * (F1 + t2 * (F2 + t2 * F3)));
}

/** Parameters from (l1, l2, t3); null when l2 ≤ 0 or an input is not finite. */
export function estimateFromLMoments(lm: SampleLMoments): LMomentEstimate | null {
  const { l1, l2 } = lm;
  let t3 = lm.t3;
  if (!(l2 > 0) || !Number.isFinite(l1) || !Number.isFinite(l2) || !Number.isFinite(t3)) return null;
  let truncated = false;
  if (Math.abs(t3) >= MAX_ABS_LSKEW) {
    t3 = Math.sign(t3) * MAX_ABS_LSKEW * (1 - 1e-12);
    truncated = true;
  }
  const k = shapeFromLSkewness(t3);
  if (k === 0) return { params: { location: l1, scale: l2 * Math.sqrt(Math.PI), shape: 0 }, truncated };
  const e = Math.exp((k * k) / 2);
  const scale = (l2 * k) / (e * erf(k / 2));
  const location = l1 + (scale * Math.expm1((k * k) / 2)) / k;
  return { params: { location, scale, shape: k }, truncated };
}
