/**
 * Cell functions for goodness of fit and model comparison.
 * Thin adapters: parse (cells.ts) → src/core/gof, src/core/compare → shape (tables/gof.ts, tables/compare.ts).
 */
import { COMPARE_FIT_ROWS, compareFamiliesWork, MAX_COMPARE_ROWS, type ModelComparison } from "../core/compare";
import { ContentCache } from "../core/fit";
import {
  DEFAULT_RESAMPLES,
  MAX_BOOTSTRAP_WORK,
  MAX_RESAMPLES,
  MIN_RESAMPLES,
  testGnoFittedCachedWork,
  testGnoSpecified,
} from "../core/gof";
import { guardGridAsync, runWork } from "./async";
import { asGrid, fail, isBlank, labelTable, readData, readInteger, readParams, type Grid } from "./cells";
import { compareRows } from "./tables/compare";
import { gofRows } from "./tables/gof";

/** The resamples GOF may run on n observations: the bound resamples × n ≤ MAX_BOOTSTRAP_WORK, refused with a message. */
export function checkBootstrapSize(resamples: number, n: number): void {
  if (resamples * n <= MAX_BOOTSTRAP_WORK) return;
  const most = Math.floor(MAX_BOOTSTRAP_WORK / n);
  const bound = `resamples × observations may be at most ${MAX_BOOTSTRAP_WORK.toLocaleString("en-US")}`;
  if (most < MIN_RESAMPLES) {
    fail(
      `${n.toLocaleString("en-US")} observations are too many for the bootstrap (${bound}, and at least ${MIN_RESAMPLES} resamples are needed): ` +
        `test given parameters (the exact laws), or use at most ${Math.floor(MAX_BOOTSTRAP_WORK / MIN_RESAMPLES).toLocaleString("en-US")} observations.`,
    );
  }
  fail(`${bound}; with ${n.toLocaleString("en-US")} observations use at most ${most} resamples.`);
}

/**
 * Kolmogorov–Smirnov and Anderson–Darling tests of the law on the data; bootstrap p-values when params is omitted (resamples × observations ≤ 2,000,000).
 * @customfunction GOF
 * @cancelable
 * @param data Daily returns: a column or range of numbers; blanks are skipped.
 * @param [params] Location, scale and shape to test (3 cells). Omit to test the law fitted to the data.
 * @param [resamples] Bootstrap resamples when params is omitted (19 to 9,999; default 199).
 * @returns A 2-column table: KS D, KS p-value, AD A², AD p-value, how the p-values were obtained, count, note.
 */
export async function goodnessOfFit(data: any[][], params: any[][], resamples: any, invocation: CustomFunctions.CancelableInvocation): Promise<any[][]> {
  return guardGridAsync(async (): Promise<Grid> => {
    const x = readData(data);
    const given = asGrid(params).flat().some((c) => !isBlank(c));
    if (given) return labelTable(gofRows(testGnoSpecified(x, readParams(params))));
    const b = readInteger(resamples, "resamples", MIN_RESAMPLES, MAX_RESAMPLES, DEFAULT_RESAMPLES);
    checkBootstrapSize(b, x.length);
    return labelTable(gofRows(await runWork(testGnoFittedCachedWork(x, { resamples: b }), invocation)));
  });
}

const comparisons = new ContentCache<ModelComparison>(8);

/**
 * Compares the normal, Student t, asymmetric Laplace, Johnson SU and generalized normal laws on the data (up to 1,000,000 rows; t and Johnson SU refined on all rows).
 * @customfunction COMPARE
 * @cancelable
 * @param data Daily returns: a column or range of numbers; blanks are skipped.
 * @returns A table with a header row: family, log-likelihood, parameters, AIC, BIC, ΔAIC, VaR 99%, best first.
 */
export async function compareLaws(data: any[][], invocation: CustomFunctions.CancelableInvocation): Promise<any[][]> {
  return guardGridAsync(async (): Promise<Grid> => {
    const x = readData(data);
    if (x.length > MAX_COMPARE_ROWS) {
      fail(`data has ${x.length.toLocaleString("en-US")} numbers; COMPARE accepts at most ${MAX_COMPARE_ROWS.toLocaleString("en-US")} (its iterative families are started on ${COMPARE_FIT_ROWS.toLocaleString("en-US")} evenly spaced rows above that size, then refined on all rows).`);
    }
    let c = comparisons.get(x, "compare");
    if (!c) {
      c = await runWork(compareFamiliesWork(x), invocation);
      comparisons.set(x, "compare", c);
    }
    return compareRows(c);
  });
}
