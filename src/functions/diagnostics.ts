/**
 * Cell functions for goodness of fit and model comparison.
 * Thin adapters: parse (cells.ts) → src/core/gof, src/core/compare → shape (tables/gof.ts, tables/compare.ts).
 */
import { compareFamilies } from "../core/compare";
import { fitGnoCached } from "../core/fit";
import {
  DEFAULT_RESAMPLES,
  MAX_BOOTSTRAP_WORK,
  MAX_RESAMPLES,
  MIN_RESAMPLES,
  testGnoFittedCached,
  testGnoSpecified,
} from "../core/gof";
import { asGrid, fail, guardGrid, isBlank, labelTable, readData, readInteger, readParams, type Grid } from "./cells";
import { compareRows } from "./tables/compare";
import { gofRows } from "./tables/gof";

/**
 * Kolmogorov–Smirnov and Anderson–Darling tests of the generalized normal law on the data.
 * @customfunction GOF
 * @param data Daily returns: a column or range of numbers; blanks are skipped.
 * @param [params] Location, scale and shape to test (3 cells). Omit to test the law fitted to the data.
 * @param [resamples] Bootstrap resamples when params is omitted (19 to 9,999; default 199).
 * @returns A 2-column table: KS D, KS p-value, AD A², AD p-value, how the p-values were obtained, count, note.
 */
export function goodnessOfFit(data: any[][], params?: any[][], resamples?: any): any[][] {
  return guardGrid((): Grid => {
    const x = readData(data);
    const given = asGrid(params).flat().some((c) => !isBlank(c));
    if (given) return labelTable(gofRows(testGnoSpecified(x, readParams(params))));
    const b = readInteger(resamples, "resamples", MIN_RESAMPLES, MAX_RESAMPLES, DEFAULT_RESAMPLES);
    if (b * x.length > MAX_BOOTSTRAP_WORK) {
      const most = Math.floor(MAX_BOOTSTRAP_WORK / x.length);
      fail(`resamples × observations may be at most ${MAX_BOOTSTRAP_WORK.toLocaleString("en-US")}; with ${x.length} observations use at most ${most} resamples.`);
    }
    return labelTable(gofRows(testGnoFittedCached(x, { resamples: b })));
  });
}

/**
 * Compares the normal, Student t, asymmetric Laplace, Johnson SU and generalized normal laws on the data.
 * @customfunction COMPARE
 * @param data Daily returns: a column or range of numbers; blanks are skipped.
 * @returns A table with a header row: family, log-likelihood, parameters, AIC, BIC, ΔAIC, VaR 99%, best first.
 */
export function compareLaws(data: any[][]): any[][] {
  return guardGrid((): Grid => {
    const x = readData(data);
    return compareRows(compareFamilies(x, fitGnoCached(x, "mle")));
  });
}
