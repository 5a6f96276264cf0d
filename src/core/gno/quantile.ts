/**
 * GNO quantile x(F) = ξ − α·expm1(−kz)/k, z = Φ⁻¹(F) (Hosking & Wallis 1997, App. A.8; lmom QUAGNO), with
 * the small-k series in reduced.ts. Probability 0/1 give the edge or ±Infinity.
 */
import { normalQuantile, normalQuantileUpper } from "../normal";
import type { GnoParams } from "./params";
import { isValidParams } from "./params";
import { reducedQuantile } from "./reduced";

function fromNormal(z: number, p: GnoParams): number {
  if (!isValidParams(p) || Number.isNaN(z)) return NaN;
  return p.location + p.scale * reducedQuantile(z, p.shape);
}

/** Quantile at probability `prob` ∈ [0, 1]; NaN outside [0, 1] or for invalid params. */
export function quantile(prob: number, p: GnoParams): number {
  return fromNormal(normalQuantile(prob), p);
}

/** Quantile at 1 − q without forming 1 − q: full accuracy for tiny upper-tail probabilities q. */
export function quantileUpper(q: number, p: GnoParams): number {
  return fromNormal(normalQuantileUpper(q), p);
}
