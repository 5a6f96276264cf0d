/**
 * GNO density. Because α − k(x − ξ) = α·e^{−ky}, f(x) = φ(y)/(α − k(x − ξ)) = exp(ky − y²/2)/(α√(2π)),
 * log f = ky − y²/2 − ln α − ½ ln 2π (Hosking & Wallis 1997, App. A.8; identity checked in Hosking & Wallis 1997 App. A.8; values recomputed with mpmath (40 digits) outside the repo).
 * Written as y(k − y/2) the exponent never forms ∞ − ∞; outside the support the density is exactly 0.
 */
import type { GnoParams } from "./params";
import { reducedVariate } from "./reduced";

const HALF_LN_2PI = 0.918938533204672741780329736406;
const INV_SQRT_2PI = 0.398942280401432677939946059934;

/** ln f(x): −Infinity outside the support (and at the edge), NaN for invalid params. */
export function logPdf(x: number, p: GnoParams): number {
  const y = reducedVariate(x, p);
  if (Number.isNaN(y)) return NaN;
  if (!Number.isFinite(y)) return -Infinity;
  return y * (p.shape - y / 2) - Math.log(p.scale) - HALF_LN_2PI;
}

/** f(x): 0 outside the support, never NaN for valid params. */
export function pdf(x: number, p: GnoParams): number {
  const y = reducedVariate(x, p);
  if (Number.isNaN(y)) return NaN;
  if (!Number.isFinite(y)) return 0;
  const e = y * (p.shape - y / 2);
  // Divide after exp unless exp(e) would lose digits to underflow before the 1/α factor lifts it back.
  if (e > -700) return (Math.exp(e) * INV_SQRT_2PI) / p.scale;
  return Math.exp(e - Math.log(p.scale)) * INV_SQRT_2PI;
}
