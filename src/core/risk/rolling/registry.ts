/**
 * The forecasting models the rolling cell functions offer, by name. A model is a ForecastModel factory taking the
 * cell's options; adding one is a file under models/ plus one line in FORECAST_MODELS.
 */
import type { ForecastModel } from "../../forecast/law";
import { createIidModel } from "./models/iid";
import { createEwmaModel, createGarchModel } from "./models/filtered";
import { createCornishFisherModel, createFilteredHistoricalModel, createHistoricalModel, createNormalModel } from "./models/reference";

/** Options a cell passes to a model factory; each model reads what it needs and refuses what it cannot honour. */
export interface ModelOptions {
  /** The cell's `method` argument (meaning per model: estimator or innovation law). */
  readonly method?: string;
  /** EWMA decay. */
  readonly lambda?: number;
  /** Warm-start each row from the previous one (default true). */
  readonly warmStart?: boolean;
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any
export type ModelFactory = (options: ModelOptions) => ForecastModel<any>;

export const FORECAST_MODELS: Readonly<Record<string, ModelFactory>> = Object.freeze({
  iid: createIidModel,
  ewma: createEwmaModel,
  garch: createGarchModel,
  hs: createHistoricalModel,
  normal: createNormalModel,
  cf: createCornishFisherModel,
  fhs: createFilteredHistoricalModel,
});

/** Model names in registry order (the first is the default). */
export function modelNames(): string[] {
  return Object.keys(FORECAST_MODELS);
}

/** Builds a model; throws RangeError naming the choices when the name or an option is unknown. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
export function createModel(name: string, options: ModelOptions = {}): ForecastModel<any> {
  const factory = FORECAST_MODELS[name];
  if (!factory) throw new RangeError(`model must be one of ${modelNames().map((m) => `"${m}"`).join(", ")} (got "${name}")`);
  return factory(options);
}
