/**
 * One-day forecast laws and the models that produce them: the common shape that lets the rolling engine, the
 * backtests and the method comparison treat every VaR method alike (the generalized normal fitted to a window,
 * EWMA/GARCH-filtered laws, historical simulation, Cornish–Fisher, spliced Pareto tails…).
 *
 * A ForecastLaw answers the questions a forecast row needs: VaR and ES at a confidence level for a side (positive
 * losses, as everywhere in Askew), and the probability integral transform F(x) of the realised return (the PIT
 * column of ES backtests). Each method implements it in its own home; none re-implements another's formulas.
 */
import type { RiskSide } from "../risk/measures/side";

export interface ForecastLaw {
  /** VaR at `confidence` for `side`, a positive loss (negative: a gain). */
  valueAtRisk(confidence: number, side: RiskSide): number;
  /** Expected shortfall at `confidence` for `side`, a positive loss; NaN where it does not exist. */
  expectedShortfall(confidence: number, side: RiskSide): number;
  /** P(X ≤ x) under the forecast law (the PIT of a realised return x). */
  cdf(x: number): number;
  /**
   * Why valueAtRisk / expectedShortfall / cdf gives NaN for these arguments (e.g. a modified ES outside its
   * domain), for the cell to show as the row's reason; absent or undefined when the law gives no reason.
   */
  whyNot?(measure: "var" | "es" | "pit", confidence: number, side: RiskSide): string | undefined;
  /** The law's cells when it is a (spliced) generalized normal: 3 (location, scale, shape) or 9; else absent. */
  readonly params?: readonly number[];
}

/** What a model says for one row: the law (null when it cannot forecast) and why not, or a caveat. */
export interface ModelForecast<S> {
  readonly law: ForecastLaw | null;
  /** Carried to the next row's forecast (warm start); null for none. */
  readonly state: S | null;
  /** Why `law` is null, or a caveat that the row's output must flag (e.g. a fallback estimator was used). */
  readonly note?: string;
}

/**
 * A forecasting method for rolling out-of-sample use: the law of the return after `window` (oldest first, no
 * gaps), from the window alone plus the state the previous row left. Row t's forecast never sees row t or later.
 */
export interface ForecastModel<S = unknown> {
  readonly name: string;
  forecast(window: Float64Array, previous: S | null): ModelForecast<S>;
}
