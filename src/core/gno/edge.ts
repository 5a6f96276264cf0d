/**
 * The finite edge of the GNO support: ξ + α/k, an upper edge for k > 0 and a lower edge for k < 0
 * (Hosking & Wallis 1997, App. A.8). The normal case k = 0 has no edge.
 */
import type { GnoParams } from "./params";
import { isValidParams } from "./params";
import { reducedVariate } from "./reduced";

export type EdgeSide = "upper" | "lower";

/** A finite support edge and which side of the law it bounds. */
export interface GnoEdge {
  readonly value: number;
  readonly side: EdgeSide;
}

/** ξ + α/k with its side; null when k = 0 (no edge) or the parameters are invalid. */
export function edge(p: GnoParams): GnoEdge | null {
  if (!isValidParams(p) || p.shape === 0) return null;
  return Object.freeze({ value: p.location + p.scale / p.shape, side: p.shape > 0 ? "upper" : "lower" });
}

/** True when x lies in the open support, i.e. where the reduced variate is finite (false for invalid params). */
export function inSupport(x: number, p: GnoParams): boolean {
  return Number.isFinite(reducedVariate(x, p));
}
