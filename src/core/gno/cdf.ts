/**
 * GNO distribution function F(x) = Φ(y), its complement 1 − F = Φ(−y) (never formed as 1 − F), and their
 * logarithms ln Φ(±y) for Anderson–Darling-type sums (Hosking & Wallis 1997, App. A.8). y from reduced.ts.
 */
import { logNormalCdf, normalCdf } from "../normal";
import type { GnoParams } from "./params";
import { reducedVariate } from "./reduced";

/** F(x): 0 below a lower edge, 1 above an upper edge, NaN for invalid params. */
export function cdf(x: number, p: GnoParams): number {
  return normalCdf(reducedVariate(x, p));
}

/** 1 − F(x), computed as Φ(−y). */
export function sf(x: number, p: GnoParams): number {
  return normalCdf(-reducedVariate(x, p));
}

/** ln F(x): −Infinity below a lower edge; accurate far into the lower tail. */
export function logCdf(x: number, p: GnoParams): number {
  return logNormalCdf(reducedVariate(x, p));
}

/** ln(1 − F(x)) = ln Φ(−y): −Infinity above an upper edge. */
export function logSf(x: number, p: GnoParams): number {
  return logNormalCdf(-reducedVariate(x, p));
}
