/**
 * Generalized Pareto tails for a filtered volatility model's standardized residuals (McNeil & Frey 2000: filter,
 * then peaks over threshold on the residuals): the spliced law is fitted to the residuals as by fitSpliced (body
 * by censored maximum likelihood, started at the model's standardized innovation law `body`; each tail fitted to the residuals beyond the share `tailShare` on each side), and the next return's law is
 * μ + σₙ₊₁·Z with Z that spliced law. When a tail cannot be fitted (too few exceedances, no interior likelihood
 * maximum) the caller gets the reason and keeps the body alone.
 */
import type { GnoParams } from "../gno";
import { fitSpliced, type SplicedFit } from "./fitTails";
import { scaleSpliced, type SplicedParams } from "./spliced";

export const RESIDUAL_TAIL_SHARE = 0.1;

export type ResidualTails = { readonly law: SplicedParams; readonly fit: SplicedFit; readonly note?: string } | { readonly law: null; readonly reason: string };

/** The spliced next-day law from residuals z, the standardized body, the mean μ and the next σ. */
export function residualTailLaw(residuals: ArrayLike<number>, body: GnoParams, mu: number, sigma: number, tailShare = RESIDUAL_TAIL_SHARE): ResidualTails {
  let fit: SplicedFit;
  try {
    fit = fitSpliced(residuals, { sides: "both", tailShare, method: "mle", bodyStart: body });
  } catch (e) {
    return { law: null, reason: e instanceof Error ? e.message : String(e) };
  }
  for (const s of [fit.lower, fit.upper]) {
    if (s && !s.fit.converged) return { law: null, reason: `the ${s.side} tail of the residuals has no interior likelihood maximum` };
  }
  const heavy = [fit.lower, fit.upper].filter((s) => s && s.fit.infiniteMean).map((s) => s!.side);
  const note = heavy.length > 0 ? `the ${heavy.join(" and ")} residual tail has ξ ≥ 1: ES does not exist there` : undefined;
  return { law: scaleSpliced(fit.params, mu, sigma), fit, note };
}
