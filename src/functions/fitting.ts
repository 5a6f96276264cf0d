/**
 * Cell functions for fitting the law to data: FIT, FITREPORT, LOGLIK.
 * Thin adapters: parse (cells.ts) → src/core/fit (cached by data content) → shape.
 * FIT and FITREPORT are asynchronous and cancelable: they drive fitGnoCachedWork with runWork (async.ts), which
 * returns to the host's event loop after about 40 ms of work (one step is at most 131,072 observations of one
 * likelihood pass, or one sort of the data). LOGLIK is one pass over the data and stays synchronous.
 */
import { fitGnoCachedWork, logLikelihood, countOutsideSupport, type FitMethod } from "../core/fit";
import { fitReportRows } from "./tables/fitReport";
import { guard, labelTable, notAvailable, fail, readChoice, readData, readParams, type Grid } from "./cells";
import { guardGridAsync, runWork } from "./async";

const METHODS: readonly FitMethod[] = ["mle", "lmom"];

/**
 * Fits the generalized normal law to returns and gives its location, scale and shape. Runs in the background, cancelable.
 * @customfunction FIT
 * @cancelable
 * @param data Returns: a column or range of numbers (at least 10, not all equal); blanks are skipped.
 * @param [method] "mle" (maximum likelihood, the default) or "lmom" (method of L-moments).
 * @returns A 3×1 column: location, scale, shape; #N/A with the reason when there is no regular maximum or the search hits its bound (1e7 iterations × observations).
 */
export async function fit(data: any[][], method: any, invocation: CustomFunctions.CancelableInvocation): Promise<any[][]> {
  return guardGridAsync(async (): Promise<Grid> => {
    const x = readData(data, "data");
    const f = await runWork(fitGnoCachedWork(x, readChoice(method, "method", METHODS, "mle")), invocation);
    if (f.method === "mle" && !f.regular) {
      notAvailable(`No regular maximum-likelihood fit (${f.reason}). ASKEW.FITREPORT shows why; method "lmom" gives the L-moment estimate.`);
    }
    return [[f.params.location], [f.params.scale], [f.params.shape]];
  });
}

/**
 * Fitting report as a 2-column table (label, value): estimates, standard errors, intervals, fit quality, skew
 * test, support-edge checks and moments; the row list is on the help page.
 * @customfunction FITREPORT
 * @cancelable
 * @param data Returns: a column or range of numbers (at least 10, not all equal); blanks are skipped.
 * @param [method] "mle" (maximum likelihood, the default) or "lmom" (method of L-moments).
 * @returns A 32×2 table of labels and values.
 */
export async function fitReport(data: any[][], method: any, invocation: CustomFunctions.CancelableInvocation): Promise<any[][]> {
  return guardGridAsync(async (): Promise<Grid> => {
    const x = readData(data, "data");
    const f = await runWork(fitGnoCachedWork(x, readChoice(method, "method", METHODS, "mle")), invocation);
    return labelTable(fitReportRows(f));
  });
}

/**
 * Log-likelihood of returns under given parameters (for comparing fits on the same data). One pass over the data, so not cancelable.
 * @customfunction LOGLIK
 * @param data Returns: a column or range of numbers (at least 1); blanks are skipped.
 * @param params Location, scale, shape: 3 cells in a row or a column (e.g. from ASKEW.FIT).
 * @returns The log-likelihood; #N/A when some returns lie outside the law's support.
 */
export function loglik(data: any[][], params: any[][]): any {
  return guard(() => {
    // the likelihood of given parameters is defined for any number of observations (no fit is made)
    const x = readData(data, "data", { min: 1, requireSpread: false });
    const p = readParams(params);
    const ll = logLikelihood(x, p);
    if (ll === -Infinity) {
      const out = countOutsideSupport(x, p);
      notAvailable(`${out} of ${x.length} observation${x.length === 1 ? "" : "s"} lie outside the support of these parameters (likelihood 0).`);
    }
    if (!Number.isFinite(ll)) fail("The log-likelihood is not a finite number for these parameters.");
    return ll;
  });
}
