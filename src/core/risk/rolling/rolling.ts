/**
 * Rolling out-of-sample VaR: for each row t, fit the generalized normal law to the `window` most recent
 * returns strictly before row t and forecast the VaR for row t from that fit.
 *
 * Missing returns (NaN) are skipped: they are not part of any window and their row gets no forecast (NaN).
 * A row gets a forecast once `window` usable returns precede it, so without gaps the first `window` rows
 * have none. Each maximum-likelihood fit is warm-started from the previous window's solution (consecutive
 * windows share all but one observation, so the optimum moves little) and ends with one unverified Newton step
 * once the predicted gain is negligible (WARM_ONE_STEP_GAIN); fitGnoQuick itself falls back to
 * its cold strategy when the warm start does not reach a regular maximum. The L-moment method is
 * closed-form and needs no start. A window that cannot be fitted (constant returns) gives NaN for its row.
 */
import { fitGnoQuick, type FitMethod, type QuickFit } from "../../fit";
import type { GnoParams } from "../../gno";
import type { RiskSide } from "../measures/side";
import { valueAtRisk } from "../measures/tail";

/**
 * A warm fit stops with one unverified Newton step once the predicted remaining gain is below this
 * (log-likelihood units); the step then lands within ~gain² of the maximum, and the measured VaR stays within
 * 1.3e-6 relative of a cold, fully converged fit (bench/risk.ts prints the difference).
 */
const WARM_ONE_STEP_GAIN = 1e-6;

export interface RollingVarOptions {
  readonly side?: RiskSide;
  readonly method?: FitMethod;
  /** Warm-start each fit from the previous window (default true); false fits every window cold. */
  readonly warmStart?: boolean;
}

export interface RollingVar {
  /** Forecast VaR per input row; NaN where no forecast exists (too little history or a missing return). */
  readonly values: Float64Array;
  /** Number of rows with a forecast. */
  readonly forecasts: number;
  /** Forecast rows whose fit did not report convergence (the forecast is still that fit's VaR). */
  readonly unconverged: number;
  /** Total optimizer iterations over all windows. */
  readonly iterations: number;
  /** Rows whose window could not be fitted at all (e.g. constant returns); their value is NaN. */
  readonly failedRows: readonly number[];
}

/** Rolling VaR forecasts; row t uses only usable returns before row t. */
export function rollingVar(
  returns: ArrayLike<number>,
  window: number,
  confidence: number,
  options: RollingVarOptions = {},
): RollingVar {
  const side = options.side ?? "long";
  const method = options.method ?? "mle";
  const warm = options.warmStart !== false;
  const values = new Float64Array(returns.length).fill(NaN);
  const usable: number[] = [];
  const rowOf: number[] = [];
  for (let i = 0; i < returns.length; i++) {
    if (Number.isFinite(returns[i])) {
      usable.push(returns[i]);
      rowOf.push(i);
    }
  }
  const data = Float64Array.from(usable);
  let forecasts = 0;
  let unconverged = 0;
  let iterations = 0;
  const failedRows: number[] = [];
  if (!(Number.isInteger(window) && window >= 1) || !(confidence > 0 && confidence < 1)) {
    return Object.freeze({ values, forecasts, unconverged, iterations, failedRows });
  }
  let start: GnoParams | undefined;
  for (let j = window; j < data.length; j++) {
    const slice = data.subarray(j - window, j);
    let fit: QuickFit;
    try {
      fit = fitGnoQuick(slice, warm && start ? { method, start, oneStepGain: WARM_ONE_STEP_GAIN } : { method });
    } catch {
      failedRows.push(rowOf[j]);
      start = undefined;
      continue;
    }
    iterations += fit.iterations;
    if (!fit.converged) unconverged++;
    start = fit.converged ? fit.params : undefined;
    values[rowOf[j]] = valueAtRisk(confidence, fit.params, side);
    forecasts++;
  }
  return Object.freeze({ values, forecasts, unconverged, iterations, failedRows: Object.freeze(failedRows) });
}
