/**
 * Cell functions for generalized Pareto tails spliced onto the law: TAILFIT (the 9 params) and TAILREPORT.
 * Thin adapters: parse (cells.ts) → src/core/pareto (body from the content-keyed fit cache) → shape.
 * Cost: one body fit (as ASKEW.FIT) plus, per tail, a likelihood scan of about 100 points over the exceedances;
 * the same data limits as ASKEW.FIT apply. Both are asynchronous and cancelable: they drive the cached full-data
 * fit and fitSplicedWork with runWork (async.ts); a step is one likelihood pass (the censored body fit stops at
 * 300 passes, each tail's scan at about 100 profile passes plus at most 200 root-search passes) or one sort.
 */
import { fitGnoCachedWork } from "../core/fit";
import type { Work } from "../core/work";
import { DEFAULT_TAIL_SHARE, fitSplicedWork, GPD_METHODS, MAX_TAIL_SHARE, MIN_EXCEEDANCES, splicedCells, TAIL_SIDES, type SplicedFit } from "../core/pareto";
import { guardGridAsync, runWork } from "./async";
import { fail, labelTable, notAvailable, readChoice, readData, readOptionalNumber, type Grid } from "./cells";
import { tailReportRows } from "./tables/tailReport";

function readShare(v: unknown): number {
  const s = readOptionalNumber(v, "tail", DEFAULT_TAIL_SHARE);
  if (!(s > 0 && s <= MAX_TAIL_SHARE)) fail(`tail must be a share of the observations above 0 and at most ${MAX_TAIL_SHARE} (got ${s}); e.g. 0.1 for 10%.`);
  return s;
}

async function fitFrom(data: unknown, tail: unknown, sides: unknown, method: unknown, invocation: CustomFunctions.CancelableInvocation): Promise<{ fit: SplicedFit; sides: string }> {
  const x = readData(data, "data");
  const share = readShare(tail);
  const s = readChoice(sides, "sides", TAIL_SIDES, "loss");
  const m = readChoice(method, "method", GPD_METHODS, "mle");
  const perSide = Math.floor(share * x.length);
  if (perSide < MIN_EXCEEDANCES) {
    fail(`A tail share of ${share} of ${x.length} observations leaves ${perSide} exceedances; at least ${MIN_EXCEEDANCES} are needed (more data or a larger share).`);
  }
  function* work(): Work<SplicedFit> {
    const body = yield* fitGnoCachedWork(x, "mle");
    return yield* fitSplicedWork(x, { tailShare: share, sides: s, method: m, body });
  }
  try {
    return { fit: await runWork(work(), invocation), sides: s };
  } catch (e) {
    if (e instanceof RangeError) fail(`Cannot fit the tails: ${e.message}`);
    throw e;
  }
}

/**
 * Fits the law with generalized Pareto tails: the body to all returns, each tail to the returns beyond a threshold; runs in the background. Statistical estimates, not advice.
 * @customfunction TAILFIT
 * @cancelable
 * @param data Returns: a column or range of numbers; blanks are skipped.
 * @param [tail] Share of the observations treated as tail on each side (default 0.1; at most 0.45; at least 10 exceedances).
 * @param [sides] "loss" (default: the lower tail of returns), "gain" or "both".
 * @param [method] "mle" (maximum likelihood, default) or "pwm" (probability-weighted moments).
 * @returns A 9×1 column: location, scale, shape, lower threshold, ξ, β, upper threshold, ξ, β (blank side without a tail). Work bound: the body fit as ASKEW.FIT, then at most 300 censored passes and about 300 per tail.
 */
export async function tailFit(data: any[][], tail: any, sides: any, method: any, invocation: CustomFunctions.CancelableInvocation): Promise<any[][]> {
  return guardGridAsync(async (): Promise<Grid> => {
    const { fit } = await fitFrom(data, tail, sides, method, invocation);
    for (const s of [fit.lower, fit.upper]) {
      if (s && !s.fit.converged) {
        const name = s.side === "lower" ? "loss" : "gain";
        notAvailable(`The ${name} tail has no ${fit.method} estimate (${(s.fit.warnings[0] ?? "no interior maximum").replace(/\.$/, "")}). ASKEW.TAILREPORT shows why; try another tail share or method.`);
      }
    }
    return splicedCells(fit.params).map((v) => [Number.isNaN(v) ? "" : v]);
  });
}

/**
 * Report of a tail fit as a two-column table (label, value): thresholds, exceedances, ξ and β with standard errors, tail mass, mean-excess check, warnings. Cancelable.
 * @customfunction TAILREPORT
 * @cancelable
 * @param data Returns: a column or range of numbers; blanks are skipped.
 * @param [tail] Share of the observations treated as tail on each side (default 0.1; at most 0.45; at least 10 exceedances).
 * @param [sides] "loss" (default: the lower tail of returns), "gain" or "both".
 * @param [method] "mle" (maximum likelihood, default) or "pwm" (probability-weighted moments).
 * @returns A 37×2 table of labels and values; rows of a side without a tail are blank. Work bound as ASKEW.TAILFIT.
 */
export async function tailReport(data: any[][], tail: any, sides: any, method: any, invocation: CustomFunctions.CancelableInvocation): Promise<any[][]> {
  return guardGridAsync(async (): Promise<Grid> => {
    const { fit, sides: s } = await fitFrom(data, tail, sides, method, invocation);
    return labelTable(tailReportRows(fit, s));
  });
}
