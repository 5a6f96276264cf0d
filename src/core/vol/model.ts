/**
 * Fitting a volatility model to a return sample and reading its next-day law: "ewma" (two-step: the filter, then
 * the innovation shape by maximum likelihood on rₜ/σₜ) or "garch" (joint maximum likelihood), with generalized
 * normal ("gno") or normal innovations. Under either model the next return is again a generalized normal law,
 * GNO(mean + σₙ₊₁ξ(k), σₙ₊₁α(k), k) (innovation.ts), so every law function applies to it unchanged.
 */
import type { GnoParams } from "../gno";
import { DEFAULT_LAMBDA } from "./ewma";
import { filterReturns } from "./filter";
import { fitGarch, type GarchEstimate, type GarchParams, type Innovations } from "./garch";
import { scaledLaw } from "./innovation";
import { fitInnovationShape } from "./shapeFit";

export type VolModelKind = "ewma" | "garch";

export interface VolFitOptions {
  readonly innovations?: Innovations;
  /** EWMA decay λ in (0, 1); default 0.94. */
  readonly lambda?: number;
  /** GARCH warm start. */
  readonly start?: GarchParams;
  /** EWMA warm start for the shape search. */
  readonly startShape?: number;
}

export interface VolEstimate {
  readonly model: VolModelKind;
  readonly innovations: Innovations;
  readonly n: number;
  /** Conditional mean (0 for EWMA). */
  readonly mean: number;
  readonly lambda: number | null;
  readonly garch: GarchEstimate | null;
  /** Innovation shape k (0 for normal innovations). */
  readonly shape: number;
  /** Log-likelihood of the returns under the model (EWMA: given its filter). */
  readonly logLikelihood: number;
  readonly sigmas: Float64Array;
  readonly residuals: Float64Array;
  readonly nextSigma: number;
  /** The next return's law. */
  readonly nextDay: GnoParams;
  readonly converged: boolean;
  /** Likelihood passes spent (GARCH) or shape-likelihood evaluations (EWMA). */
  readonly passes: number;
  /** Non-empty when a parameter sits on a constraint. */
  readonly boundary: string;
  readonly reason: string;
}

export function fitVolatility(returns: ArrayLike<number>, model: VolModelKind, options: VolFitOptions = {}): VolEstimate {
  const innovations = options.innovations ?? "gno";
  if (model === "garch") {
    const est = fitGarch(returns, { innovations, start: options.start });
    const f = filterReturns(returns, { kind: "garch", params: est.params });
    return Object.freeze({
      model, innovations, n: returns.length, mean: est.params.mu, lambda: null, garch: est, shape: est.params.shape,
      logLikelihood: est.logLikelihood, sigmas: f.sigmas, residuals: f.residuals, nextSigma: f.nextSigma,
      nextDay: scaledLaw(est.params.mu, f.nextSigma, est.params.shape),
      converged: est.converged, passes: est.passes, boundary: est.boundary, reason: est.reason,
    });
  }
  const lambda = options.lambda ?? DEFAULT_LAMBDA;
  const f = filterReturns(returns, { kind: "ewma", lambda });
  let shape = 0;
  let atCap = false;
  let evaluations = 0;
  if (innovations === "gno") {
    const s = fitInnovationShape(f.residuals, options.startShape ?? 0);
    shape = s.shape;
    atCap = s.atCap;
    evaluations = s.evaluations;
  }
  let logLik = 0;
  const law = scaledLaw(0, 1, shape);
  for (let t = 0; t < returns.length; t++) {
    // ln f(rₜ) = ln f_k(zₜ) − ln σₜ
    const z = f.residuals[t];
    const y = shape === 0 ? (z - law.location) / law.scale : -Math.log1p((-shape * (z - law.location)) / law.scale) / shape;
    logLik += shape * y - 0.5 * y * y - Math.log(law.scale) - 0.9189385332046728 - Math.log(f.sigmas[t]);
  }
  return Object.freeze({
    model, innovations, n: returns.length, mean: 0, lambda, garch: null, shape, logLikelihood: logLik,
    sigmas: f.sigmas, residuals: f.residuals, nextSigma: f.nextSigma, nextDay: scaledLaw(0, f.nextSigma, shape),
    converged: !atCap, passes: evaluations, boundary: atCap ? "innovation shape at the cap" : "",
    reason: atCap ? "the innovation shape has no interior maximum" : "converged",
  });
}
