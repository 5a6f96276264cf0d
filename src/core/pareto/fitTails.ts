/**
 * Fitting the spliced law to returns: the body by the generalized normal fit to all the data (maximum
 * likelihood, falling back to L-moments when there is no regular maximum), then on each chosen side a
 * generalized Pareto law fitted to the excesses beyond a threshold set by the tail share s: with n returns and
 * m = ⌊s·n⌋, the threshold is the (m+1)-th most extreme return and the excesses are the m returns beyond it (the
 * usual peaks-over-threshold choice of an order statistic as threshold; McNeil & Frey 2000). The tail mass in
 * the spliced law is the body's F_b(u), so the CDF is continuous; the empirical share m/n is reported beside it.
 */
import { fitGno, type GnoFit } from "../fit";
import { sf as gnoSf, cdf as gnoCdf } from "../gno";
import { fitGpd, type GpdFit, type GpdMethod } from "./estimate";
import { gpdMeanExcess } from "./gpd";
import { isValidSpliced, splicedProblem, type SplicedParams, type TailPiece } from "./spliced";

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
  readonly body: GnoFit;
  /** Body by maximum likelihood with a regular maximum (else the L-moment fit is used). */
  readonly bodyRegular: boolean;
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
}

function fitSide(sorted: Float64Array, side: "lower" | "upper", share: number, method: GpdMethod, body: GnoFit["params"]): TailFitSide {
  const n = sorted.length;
  const m = Math.floor(share * n);
  if (m < MIN_EXCEEDANCES) {
    throw new RangeError(`the ${side} tail would have ${m} exceedances (tail share ${share} of ${n} returns); at least ${MIN_EXCEEDANCES} are needed.`);
  }
  const threshold = side === "lower" ? sorted[m] : sorted[n - 1 - m];
  const excess: number[] = [];
  for (let i = 0; i < n; i++) {
    const y = side === "lower" ? threshold - sorted[i] : sorted[i] - threshold;
    if (y > 0) excess.push(y);
  }
  if (excess.length < MIN_EXCEEDANCES) {
    throw new RangeError(`the ${side} tail has ${excess.length} returns strictly beyond its threshold ${threshold} (ties); at least ${MIN_EXCEEDANCES} are needed.`);
  }
  const fit = fitGpd(excess, method);
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
  const share = options.tailShare ?? DEFAULT_TAIL_SHARE;
  const sides = options.sides ?? "loss";
  const method = options.method ?? "mle";
  if (!(share > 0 && share <= MAX_TAIL_SHARE)) throw new RangeError(`tail share must lie in (0, ${MAX_TAIL_SHARE}] (got ${share}).`);
  const sorted = Float64Array.from(data).sort();
  let body = options.body ?? fitGno(data, { method: "mle" });
  const warnings: string[] = [];
  const bodyRegular = body.method === "mle" && body.regular;
  if (!bodyRegular && body.method === "mle") {
    const reason = body.reason;
    body = fitGno(data, { method: "lmom" });
    warnings.push(`Body: no regular maximum-likelihood fit (${reason || "see the fit report"}); the L-moment fit is used.`);
  }
  const lower = sides !== "gain" ? fitSide(sorted, "lower", share, method, body.params) : null;
  const upper = sides !== "loss" ? fitSide(sorted, "upper", share, method, body.params) : null;
  const params: SplicedParams = { body: body.params, lower: piece(lower), upper: piece(upper) };
  for (const s of [lower, upper]) {
    if (!s) continue;
    const name = s.side === "lower" ? "Lower (loss) tail" : "Upper (gain) tail";
    if (!s.fit.converged) warnings.push(`${name}: the ${method} estimate did not converge.`);
    for (const w of s.fit.warnings) warnings.push(`${name}: ${w}`);
  }
  if (!isValidSpliced(params)) throw new RangeError(`the fitted pieces do not make a law: ${splicedProblem(params) ?? "invalid parameters"}.`);
  return Object.freeze({ n: sorted.length, method, tailShare: share, params, body, bodyRegular, lower, upper, warnings: Object.freeze(warnings) });
}
