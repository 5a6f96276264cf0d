/**
 * Volatility filters as one plain function: σₜ for each return from the returns before it, the standardized
 * residuals zₜ = (rₜ − mean)/σₜ and the next day's σₙ₊₁, for an EWMA (ewma.ts) or a fitted GARCH(1,1) (garch.ts).
 * This is what a filtered method needs (a fitted law of the residuals, filtered historical simulation…):
 * residuals to resample or fit, and the σ to scale them back by.
 */
import { ewmaVariances, DEFAULT_LAMBDA } from "./ewma";
import { garchVariances, type GarchParams } from "./garch";

export type FilterSpec =
  | { readonly kind: "ewma"; readonly lambda?: number }
  | { readonly kind: "garch"; readonly params: GarchParams };

export interface Filtered {
  /** σₜ for each return (from the returns before it and the seed). */
  readonly sigmas: Float64Array;
  /** zₜ = (rₜ − mean)/σₜ. */
  readonly residuals: Float64Array;
  /** σ for the day after the last return. */
  readonly nextSigma: number;
  /** The conditional mean the residuals are taken around (0 for EWMA, μ for GARCH). */
  readonly mean: number;
}

export function filterReturns(returns: ArrayLike<number>, spec: FilterSpec): Filtered {
  const h = spec.kind === "ewma" ? ewmaVariances(returns, spec.lambda ?? DEFAULT_LAMBDA) : garchVariances(returns, spec.params);
  const mean = spec.kind === "ewma" ? 0 : spec.params.mu;
  const n = returns.length;
  const sigmas = new Float64Array(n);
  const residuals = new Float64Array(n);
  for (let t = 0; t < n; t++) {
    sigmas[t] = Math.sqrt(h[t]);
    residuals[t] = (returns[t] - mean) / sigmas[t];
  }
  return { sigmas, residuals, nextSigma: Math.sqrt(h[n]), mean };
}
