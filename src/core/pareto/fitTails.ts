/**
 * Fitting the spliced law to returns. Thresholds first, from the data alone: with n returns, tail share s and
 * m = ⌊s·n⌋, a side's threshold is the (m+1)-th most extreme return and its excesses are the m returns beyond it
 * (the usual peaks-over-threshold choice of an order statistic as threshold; McNeil & Frey 2000). Then the body:
 * maximum likelihood of the spliced law for those thresholds, i.e. the generalized normal with the tail
 * observations censored at the thresholds (censoredBody.ts), started from the full-data fit (maximum likelihood,
 * or L-moments when it has no regular maximum); the full-data fit is kept, with a warning, if the censored one
 * fails. Then each tail: a generalized Pareto law fitted to its excesses. The tail mass in the spliced law is the
 * body's F_b(u), so the CDF is continuous; the empirical share m/n is reported beside it (the censored body makes
 * the two close — a full-data body fit, pulled by the extremes, can put 13% where the data have 10%).
 * fitSplicedWork is the same fit as resumable work: it yields after the sort, inside the full-data fit when one is
 * made (fitGnoWork), after every likelihood pass of the censored body fit (fitCensoredBodyWork) and after each
 * tail fit; fitSpliced runs it to the end.
 */
import { fitGnoWork, type GnoFit } from "../fit";
import { sf as gnoSf, cdf as gnoCdf, type GnoParams } from "../gno";
import { fitCensoredBodyWork } from "./censoredBody";
import { runToEnd, stage, type Work } from "../work";
import { fitGpdWork, type GpdFit, type GpdMethod } from "./estimate";
import { gpdMeanExcess } from "./gpd";
import { isValidSpliced, splicedProblem, type SplicedParams, type TailPiece } from "./spliced";
import { sortedCopy } from "../sort";

export type TailSides = "loss" | "gain" | "both";
export const TAIL_SIDES: readonly TailSides[] = ["loss", "gain", "both"];
export const DEFAULT_TAIL_SHARE = 0.1;
/** Fewest exceedances a tail is fitted to. */
export const MIN_EXCEEDANCES = 10;
/** Largest tail share accepted on a side. */
export const MAX_TAIL_SHARE = 0.45;

export interface TailFitSide {
  readonly side: "lower" | "upper";
  readonly threshold: number;
  /** Number of returns beyond the threshold (the excesses fitted). */
  readonly exceedances: number;
  /** exceedances / n. */
  readonly empiricalShare: number;
  /** The body's mass beyond the threshold, which the tail carries in the spliced law. */
  readonly tailMass: number;
  readonly fit: GpdFit;
  /** Mean excess of the data beyond the threshold. */
  readonly sampleMeanExcess: number;
  /** Mean excess of the fitted tail at the threshold, β/(1 − ξ) (Infinity when ξ ≥ 1). */
  readonly fittedMeanExcess: number;
}

export interface SplicedFit {
  readonly n: number;
  readonly method: GpdMethod;
  readonly tailShare: number;
  readonly params: SplicedParams;
  /** The body's fit; null when the body was given (TailFitOptions.bodyParams). */
  readonly body: GnoFit | null;
  /** Body by maximum likelihood with a regular maximum, or given (else the L-moment fit is used). */
  readonly bodyRegular: boolean;
  /** How the body was estimated: "censored mle" (default), "full-data mle", "lmom" or "given". */
  readonly bodyMethod: string;
  readonly lower: TailFitSide | null;
  readonly upper: TailFitSide | null;
  readonly warnings: readonly string[];
}

export interface TailFitOptions {
  readonly tailShare?: number;
  readonly sides?: TailSides;
  readonly method?: GpdMethod;
  /** Body already fitted to the same data (e.g. from the fit cache). */
  readonly body?: GnoFit;
  /**
   * The body's parameters, given rather than fitted (e.g. the standardized innovation law of a volatility model
   * for its residuals); only the tails are fitted.
   */
  readonly bodyParams?: GnoParams;
  /** Start the censored body fit here instead of at a full-data fit (which is then made only if it fails). */
  readonly bodyStart?: GnoParams;
}

function thresholdOf(sorted: Float64Array, side: "lower" | "upper", share: number): number {
  const n = sorted.length;
  const m = Math.floor(share * n);
  if (m < MIN_EXCEEDANCES) {
    throw new RangeError(`the ${side} tail would have ${m} exceedances (tail share ${share} of ${n} returns); at least ${MIN_EXCEEDANCES} are needed.`);
  }
  return side === "lower" ? sorted[m] : sorted[n - 1 - m];
}

function* fitSide(sorted: Float64Array, side: "lower" | "upper", share: number, method: GpdMethod, body: GnoFit["params"]): Work<TailFitSide> {
  const n = sorted.length;
  const threshold = thresholdOf(sorted, side, share);
  const excess: number[] = [];
  for (let i = 0; i < n; i++) {
    const y = side === "lower" ? threshold - sorted[i] : sorted[i] - threshold;
    if (y > 0) excess.push(y);
  }
  if (excess.length < MIN_EXCEEDANCES) {
    throw new RangeError(`the ${side} tail has ${excess.length} returns strictly beyond its threshold ${threshold} (ties); at least ${MIN_EXCEEDANCES} are needed.`);
  }
  yield 0;
  const fit = yield* fitGpdWork(excess, method);
  const mean = excess.reduce((s, y) => s + y, 0) / excess.length;
  return Object.freeze({
    side,
    threshold,
    exceedances: excess.length,
    empiricalShare: excess.length / n,
    tailMass: side === "lower" ? gnoCdf(threshold, body) : gnoSf(threshold, body),
    fit,
    sampleMeanExcess: mean,
    fittedMeanExcess: gpdMeanExcess(0, fit.params),
  });
}

const piece = (s: TailFitSide | null): TailPiece | null => (s ? { threshold: s.threshold, shape: s.fit.params.shape, scale: s.fit.params.scale } : null);

/** The spliced law fitted to returns; throws RangeError with the reason when it cannot be fitted. */
export function fitSpliced(data: ArrayLike<number>, options: TailFitOptions = {}): SplicedFit {
  return runToEnd(fitSplicedWork(data, options));
}

/** fitSpliced as resumable work (same arithmetic and result); throws the same RangeErrors. */
export function* fitSplicedWork(data: ArrayLike<number>, options: TailFitOptions = {}): Work<SplicedFit> {
  const share = options.tailShare ?? DEFAULT_TAIL_SHARE;
  const sides = options.sides ?? "loss";
  const method = options.method ?? "mle";
  if (!(share > 0 && share <= MAX_TAIL_SHARE)) throw new RangeError(`tail share must lie in (0, ${MAX_TAIL_SHARE}] (got ${share}).`);
  yield 0; // the sort of the data is a step of its own (one native sort, about 0.1 s at 1,000,000 returns)
  const sorted = sortedCopy(data);
  yield 0.05;
  const warnings: string[] = [];
  const lowerU = sides !== "gain" ? thresholdOf(sorted, "lower", share) : null;
  const upperU = sides !== "loss" ? thresholdOf(sorted, "upper", share) : null;
  let body: GnoFit | null = null;
  let bodyParams: GnoParams;
  let bodyRegular = true;
  let bodyMethod = "given";
  const quick = options.bodyStart && !options.body ? yield* stage(fitCensoredBodyWork(sorted, lowerU, upperU, options.bodyStart), 0.05, 0.3) : null;
  if (options.bodyParams) bodyParams = options.bodyParams;
  else if (quick && quick.converged) {
    bodyParams = quick.params;
    bodyMethod = "censored mle";
  } else {
    body = options.body ?? (yield* stage(fitGnoWork(data, { method: "mle" }), 0.3, 0.5));
    bodyRegular = body.method === "mle" && body.regular;
    if (!bodyRegular && body.method === "mle") {
      const reason = body.reason;
      body = yield* stage(fitGnoWork(data, { method: "lmom" }), 0.5, 0.55);
      warnings.push(`Body: no regular maximum-likelihood fit to all the data (${reason || "see the fit report"}); the censored fit starts from the L-moment fit.`);
    }
    const censored = yield* stage(fitCensoredBodyWork(sorted, lowerU, upperU, body.params), 0.55, 0.9);
    if (censored.converged) {
      bodyParams = censored.params;
      bodyMethod = "censored mle";
    } else {
      bodyParams = body.params;
      bodyMethod = bodyRegular ? "full-data mle" : "lmom";
      warnings.push(`Body: the censored maximum-likelihood fit did not converge (${censored.reason}); the fit to all the data is used.`);
    }
  }
  yield 0.9;
  const lower = sides !== "gain" ? yield* stage(fitSide(sorted, "lower", share, method, bodyParams), 0.9, 0.95) : null;
  yield 0.95;
  const upper = sides !== "loss" ? yield* stage(fitSide(sorted, "upper", share, method, bodyParams), 0.95, 1) : null;
  const params: SplicedParams = { body: bodyParams, lower: piece(lower), upper: piece(upper) };
  for (const s of [lower, upper]) {
    if (!s) continue;
    const name = s.side === "lower" ? "Lower (loss) tail" : "Upper (gain) tail";
    if (!s.fit.converged) warnings.push(`${name}: the ${method} estimate did not converge.`);
    for (const w of s.fit.warnings) warnings.push(`${name}: ${w}`);
  }
  if (!isValidSpliced(params)) throw new RangeError(`the fitted pieces do not make a law: ${splicedProblem(params) ?? "invalid parameters"}.`);
  return Object.freeze({ n: sorted.length, method, tailShare: share, params, body, bodyRegular, bodyMethod, lower, upper, warnings: Object.freeze(warnings) });
}
