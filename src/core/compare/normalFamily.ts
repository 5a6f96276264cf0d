/**
 * The normal law as a comparison family: closed-form maximum likelihood (mean, divisor-n variance).
 * Its log-likelihood and VaR are the generalized normal ones at shape 0 (one home: fit/likelihood, risk/tail).
 */
import { logLikelihood, sampleMoments } from "../fit";
import type { GnoParams } from "../gno";

export interface NormalFit {
  readonly params: { readonly mean: number; readonly sd: number };
  readonly asGno: GnoParams;
  readonly logLikelihood: number;
}

export function fitNormal(data: ArrayLike<number>): NormalFit {
  const m = sampleMoments(data);
  const sd = Math.sqrt(m.varianceMle);
  const asGno = { location: m.mean, scale: sd, shape: 0 };
  return { params: { mean: m.mean, sd }, asGno, logLikelihood: logLikelihood(data, asGno) };
}
