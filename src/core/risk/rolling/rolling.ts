/**
 * Rolling out-of-sample forecasts: for each row t, a ForecastModel (registry.ts) forecasts the law of row t's
 * return from the `window` most recent usable returns strictly before row t, plus the state the previous forecast
 * row left (warm start). Row t's forecast never sees row t or later (out-of-sample identity).
 *
 * Missing returns (NaN) are skipped: they are not part of any window and their row gets no forecast. A row gets a
 * forecast once `window` usable returns precede it, so without gaps the first `window` rows have none. A model
 * may decline a row (law null, with a note saying why: the row is "failed") or forecast it with a caveat (law and
 * note: the row is "flagged"; a cell must show the caveat, never the bare number).
 *
 * The run is a Work (src/core/work.ts): one unit per forecast row (one window fit), yielding the fraction done,
 * so a cell drives it in time slices and can cancel it. Its total units are (usable returns − window), known in
 * advance.
 */
import type { ForecastLaw } from "../../forecast/law";
import { runToEnd, type Work } from "../../work";
import type { RiskSide } from "../measures/side";
import { createIidModel } from "./models/iid";
import { createModel, type ModelOptions } from "./registry";

export interface RollingForecasts {
  /** Per input row: the forecast law, or null (too little history, a missing return, or a declined row). */
  readonly laws: readonly (ForecastLaw | null)[];
  /** Per input row: why the law is null (declined rows), or the caveat of a flagged row; undefined otherwise. */
  readonly notes: readonly (string | undefined)[];
  /** Rows with a law. */
  readonly forecasts: number;
  /** Rows the model declined (law null, note says why). */
  readonly failedRows: readonly number[];
  /** Rows with a law and a caveat. */
  readonly flaggedRows: readonly number[];
  /** Usable (finite) returns in the input. */
  readonly usable: number;
  /** Rows that had a full window before them (forecast, declined or flagged). */
  readonly attempted: number;
}

/** Usable returns and the input row of each. */
function compact(returns: ArrayLike<number>): { data: Float64Array; rowOf: Int32Array } {
  const rowOf: number[] = [];
  for (let i = 0; i < returns.length; i++) if (Number.isFinite(returns[i])) rowOf.push(i);
  const data = new Float64Array(rowOf.length);
  rowOf.forEach((row, j) => (data[j] = returns[row]));
  return { data, rowOf: Int32Array.from(rowOf) };
}

/** Forecast rows a run will fit: max(0, usable returns − window). */
export function rollingUnits(returns: ArrayLike<number>, window: number): number {
  let usable = 0;
  for (let i = 0; i < returns.length; i++) if (Number.isFinite(returns[i])) usable++;
  return Math.max(0, usable - window);
}

/** The rolling run of any ForecastModel, as resumable work. `window` must be a whole number ≥ 1. */
export function* rollingForecasts<S>(
  returns: ArrayLike<number>,
  window: number,
  model: { forecast(window: Float64Array, previous: S | null): { law: ForecastLaw | null; state: S | null; note?: string } },
): Work<RollingForecasts> {
  const laws: (ForecastLaw | null)[] = new Array(returns.length).fill(null);
  const notes: (string | undefined)[] = new Array(returns.length).fill(undefined);
  const { data, rowOf } = compact(returns);
  const failedRows: number[] = [];
  const flaggedRows: number[] = [];
  let forecasts = 0;
  let attempted = 0;
  if (Number.isInteger(window) && window >= 1) {
    const total = Math.max(1, data.length - window);
    let state: S | null = null;
    for (let j = window; j < data.length; j++) {
      const row = rowOf[j];
      const out = model.forecast(data.subarray(j - window, j), state);
      attempted++;
      state = out.state;
      if (out.law) {
        laws[row] = out.law;
        forecasts++;
        if (out.note) {
          notes[row] = out.note;
          flaggedRows.push(row);
        }
      } else {
        notes[row] = out.note ?? "No forecast for this row.";
        failedRows.push(row);
      }
      yield (j - window + 1) / total;
    }
  }
  return Object.freeze({
    laws: Object.freeze(laws),
    notes: Object.freeze(notes),
    forecasts,
    failedRows: Object.freeze(failedRows),
    flaggedRows: Object.freeze(flaggedRows),
    usable: data.length,
    attempted,
  });
}

/** Runs a registered model by name. */
export function rollingModelForecasts(returns: ArrayLike<number>, window: number, model: string, options: ModelOptions = {}): Work<RollingForecasts> {
  return rollingForecasts(returns, window, createModel(model, options));
}

export interface RollingVarOptions {
  readonly side?: RiskSide;
  readonly method?: "mle" | "lmom";
  /** Warm-start each fit from the previous window (default true); false fits every window cold. */
  readonly warmStart?: boolean;
}

export interface RollingVar {
  /** Forecast VaR per input row; NaN where no forecast exists (too little history or a missing return). */
  readonly values: Float64Array;
  /** Number of rows with a forecast. */
  readonly forecasts: number;
  /** Forecast rows whose maximum-likelihood fit was irregular (the value is then the L-moment fit's VaR). */
  readonly unconverged: number;
  /** Total optimizer iterations over all windows. */
  readonly iterations: number;
  /** Rows whose window could not be fitted at all (e.g. constant returns); their value is NaN. */
  readonly failedRows: readonly number[];
  /** Rows whose value comes from the L-moment fallback (method "mle" only). */
  readonly flaggedRows: readonly number[];
}

/** Rolling VaR of the unconditional generalized normal fit ("iid" model), synchronously. */
export function rollingVar(
  returns: ArrayLike<number>,
  window: number,
  confidence: number,
  options: RollingVarOptions = {},
): RollingVar {
  const side = options.side ?? "long";
  const values = new Float64Array(returns.length).fill(NaN);
  if (!(Number.isInteger(window) && window >= 1) || !(confidence > 0 && confidence < 1)) {
    return Object.freeze({ values, forecasts: 0, unconverged: 0, iterations: 0, failedRows: Object.freeze([]), flaggedRows: Object.freeze([]) });
  }
  const model = createIidModel({ method: options.method ?? "mle", warmStart: options.warmStart });
  const run = runToEnd(rollingForecasts(returns, window, model));
  run.laws.forEach((law, i) => {
    if (law) values[i] = law.valueAtRisk(confidence, side);
  });
  return Object.freeze({
    values,
    forecasts: run.forecasts,
    unconverged: model.counters.unconverged,
    iterations: model.counters.iterations,
    failedRows: run.failedRows,
    flaggedRows: run.flaggedRows,
  });
}
