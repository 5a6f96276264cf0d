/**
 * A start for maximum likelihood on a window that moved on by one observation (rolling forecasts).
 *
 * The previous window's maximum θ₀ has score ≈ 0 and Hessian H₀ there. Dropping x_out and adding x_in changes the
 * score at θ₀ to s(x_in) − s(x_out) and the Hessian to H₀ + h(x_in) − h(x_out), where s and h are one observation's
 * score and Hessian (likelihood.ts). One Newton step with these, θ₁ = θ₀ + (−H)⁻¹ [s(x_in) − s(x_out)], is the
 * first-order (influence-function) update of the estimate; it costs O(1) instead of a pass over the window, and
 * leaves the new window's predicted gain at about the square of the plain warm start's (Newton's quadratic
 * convergence), so the fit usually ends after one pass.
 */
import type { GnoParams } from "../gno";
import { swapDerivatives } from "./likelihood";
import { choleskySolve } from "./newton";

/** The previous window's fit and what changed. `hessian` is in θ = (ξ, ln α, k), row-major 3×3. */
export interface SlideFrom {
  readonly params: GnoParams;
  readonly hessian: ArrayLike<number>;
  readonly removed: number;
  readonly added: number;
}

/** Largest step the update may take (|Δξ|/α, |Δ ln α|, |Δk|); beyond it the plain warm start is used. */
const MAX_STEP = [0.5, 0.5, 0.25];

/** Scratch for slideStart (never re-entered): score change, Hessian change, then −H. */
const G = new Float64Array(3);
const DH = new Float64Array(9);
const A = new Float64Array(9);

/** The updated start, or null when a point lies outside the support at θ₀ or the update is not a clean step. */
export function slideStart(from: SlideFrom): GnoParams | null {
  const { location, scale, shape } = from.params;
  if (!swapDerivatives(from.added, from.removed, location, Math.log(scale), shape, G, DH)) return null;
  for (let i = 0; i < 9; i++) A[i] = -(from.hessian[i] + DH[i]);
  const d = choleskySolve(A, G, 3);
  if (!d || !(Math.abs(d[0]) / scale <= MAX_STEP[0]) || !(Math.abs(d[1]) <= MAX_STEP[1]) || !(Math.abs(d[2]) <= MAX_STEP[2])) return null;
  return { location: location + d[0], scale: scale * Math.exp(d[1]), shape: shape + d[2] };
}
