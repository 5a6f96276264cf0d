/**
 * The reference methods of src/core/methods as rolling models: "hs" (historical simulation; age-weighted with the
 * decay in `lambda` when a cell passes one), "normal", "cf" (Cornish–Fisher VaR with modified ES; a window outside
 * the expansion's valid domain gets no forecast and the reason) and "fhs" (filtered historical simulation:
 * method "ewma" — default, EWMA filter with `lambda`, default 0.94 — or "garch", a Gaussian GARCH(1,1) fitted to
 * each window, warm-started from the previous row's estimate, at least MIN_GARCH_WINDOW returns).
 * The formulas live in src/core/methods and src/core/vol; this file only wires options to them.
 */
import type { ForecastModel } from "../../../forecast/law";
import { cornishFisherModel, filteredHistoricalModel, historicalModel, normalModel, type VolatilityFilter } from "../../../methods";
import { DEFAULT_LAMBDA, filterReturns, fitGarch, type GarchParams } from "../../../vol";
import type { ModelOptions } from "../registry";
import { MIN_GARCH_WINDOW } from "./filtered";

export const FHS_METHODS = ["ewma", "garch"] as const;

function noMethod(name: string, options: ModelOptions): void {
  if (options.method !== undefined) throw new RangeError(`model "${name}" takes no method (got "${options.method}")`);
}

export function createHistoricalModel(options: ModelOptions = {}): ForecastModel<null> {
  noMethod("hs", options);
  const decay = options.lambda ?? 1;
  if (!(decay > 0 && decay <= 1)) throw new RangeError(`the age-weight decay for model "hs" must lie in (0, 1] (got ${decay})`);
  return historicalModel(decay);
}

export function createNormalModel(options: ModelOptions = {}): ForecastModel<null> {
  noMethod("normal", options);
  return normalModel();
}

export function createCornishFisherModel(options: ModelOptions = {}): ForecastModel<null> {
  noMethod("cf", options);
  return cornishFisherModel();
}

export function createFilteredHistoricalModel(options: ModelOptions = {}): ForecastModel<null> {
  const method = options.method ?? "ewma";
  if (!(FHS_METHODS as readonly string[]).includes(method)) throw new RangeError(`method for model "fhs" must be "ewma" (default) or "garch"`);
  if (method === "ewma") {
    const lambda = options.lambda ?? DEFAULT_LAMBDA;
    if (!(lambda > 0 && lambda < 1)) throw new RangeError(`lambda must lie strictly between 0 and 1 (got ${lambda})`);
    const ewma: VolatilityFilter = (window) => {
      const f = filterReturns(window, { kind: "ewma", lambda });
      return { residuals: f.residuals, nextSigma: f.nextSigma, nextMean: f.mean };
    };
    return filteredHistoricalModel(ewma);
  }
  // The previous row's converged estimate warm-starts the next window's fit (rows run in order within one call).
  let last: GarchParams | undefined;
  const warm = options.warmStart !== false;
  const garch: VolatilityFilter = (window) => {
    if (window.length < MIN_GARCH_WINDOW) return `a GARCH window needs at least ${MIN_GARCH_WINDOW} returns (got ${window.length})`;
    const est = fitGarch(window, { innovations: "normal", start: warm ? last : undefined });
    if (!est.converged) {
      last = undefined;
      return `the GARCH fit of this window did not converge (${est.reason})`;
    }
    last = est.params;
    const f = filterReturns(window, { kind: "garch", params: est.params });
    return { residuals: f.residuals, nextSigma: f.nextSigma, nextMean: f.mean };
  };
  return filteredHistoricalModel(garch);
}
