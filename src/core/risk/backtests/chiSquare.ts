/**
 * Chi-square survival functions with 1 and 2 degrees of freedom, the reference laws of the likelihood-ratio
 * backtests (Kupiec 1995; Christoffersen 1998).
 *
 * - 1 degree of freedom: if X = Z², P(X > x) = P(|Z| > √x) = erfc(√(x/2)).
 * - 2 degrees of freedom: the exponential law with mean 2, P(X > x) = exp(−x/2).
 *
 * Total: NaN for NaN, 1 for x ≤ 0, 0 at +Infinity.
 */
import { erfc } from "../../normal";

/** P(χ²₁ > x) = erfc(√(x/2)). */
export function chiSquare1Sf(x: number): number {
  if (Number.isNaN(x)) return NaN;
  if (x <= 0) return 1;
  return erfc(Math.sqrt(x / 2));
}

/** P(χ²₂ > x) = exp(−x/2). */
export function chiSquare2Sf(x: number): number {
  if (Number.isNaN(x)) return NaN;
  if (x <= 0) return 1;
  return Math.exp(-x / 2);
}
