/**
 * Method comparison for a validator: several rolling models on the same returns, window, level and side, each
 * backtested and scored on the SAME rows — the rows where every model has a forecast — so that exception counts
 * and mean losses are comparable. Ranked best first by mean FZ0 loss (VaR and ES jointly; strictly consistent), with
 * the Diebold–Mariano small-sample p-value of each model against the best.
 *
 * A Work: one unit per window fit of each model (rollingForecasts yields after each row), so the pane can drive it
 * in slices with a progress bar. Bound: models × (rows − window) window fits, each as the model's own bound.
 */
import type { ForecastLaw } from "../../forecast/law";
import { dieboldMariano } from "../../scores/dieboldMariano";
import { scoreForecasts } from "../../scores/losses";
import type { Work } from "../../work";
import { backtestVar, type VarBacktest } from "../backtests/backtest";
import type { RiskSide } from "../measures/side";
import { createModel, type ModelOptions } from "../rolling/registry";
import { rollingForecasts } from "../rolling/rolling";

export const DEFAULT_COMPARED_MODELS: readonly string[] = ["iid", "hs", "normal", "cf", "fhs"];

export interface ComparedMethod {
  readonly model: string;
  /** Rows where this model forecast (before restricting to the common rows). */
  readonly forecastRows: number;
  /** Rows this model declined (the first reason is kept). */
  readonly declinedRows: number;
  readonly firstReason: string | null;
  /** Backtest of its VaR on the common rows (null when there are none). */
  readonly backtest: VarBacktest | null;
  readonly meanTickLoss: number;
  readonly meanFz0Loss: number;
  /** Harvey–Leybourne–Newbold p-value of equal mean FZ0 loss against the best model (NaN for the best itself). */
  readonly pValueAgainstBest: number;
}

export interface MethodComparison {
  /** Rows scored for every model. */
  readonly commonRows: number;
  /** Best first by mean FZ0 loss; models with no FZ0 (no common rows, or ES ≤ 0 somewhere) last. */
  readonly methods: readonly ComparedMethod[];
}

/** Runs each model's rolling forecasts, then backtests and scores all of them on their common rows. */
export function* compareMethods(
  returns: ArrayLike<number>,
  window: number,
  confidence: number,
  side: RiskSide = "long",
  models: readonly string[] = DEFAULT_COMPARED_MODELS,
  options: ModelOptions = {},
): Work<MethodComparison> {
  const n = returns.length;
  const runs: Array<{ model: string; laws: readonly (ForecastLaw | null)[]; notes: readonly (string | undefined)[] }> = [];
  for (let k = 0; k < models.length; k++) {
    const work = rollingForecasts(returns, window, createModel(models[k], options));
    let step = work.next();
    while (!step.done) {
      yield (k + (Number.isFinite(step.value) ? step.value : 0)) / models.length;
      step = work.next();
    }
    runs.push({ model: models[k], laws: step.value.laws, notes: step.value.notes });
  }
  const valueAtRisk = runs.map(() => new Float64Array(n).fill(NaN));
  const shortfall = runs.map(() => new Float64Array(n).fill(NaN));
  runs.forEach((run, k) => {
    for (let t = 0; t < n; t++) {
      const law = run.laws[t];
      if (!law || run.notes[t] !== undefined) continue;
      valueAtRisk[k][t] = law.valueAtRisk(confidence, side);
      shortfall[k][t] = law.expectedShortfall(confidence, side);
    }
  });
  const common = new Float64Array(n).fill(NaN);
  let commonRows = 0;
  for (let t = 0; t < n; t++) {
    if (!Number.isFinite(returns[t])) continue;
    if (runs.every((_, k) => Number.isFinite(valueAtRisk[k][t]) && Number.isFinite(shortfall[k][t]))) {
      common[t] = returns[t];
      commonRows++;
    }
  }
  const scored = runs.map((run, k) => {
    const s = scoreForecasts(common, valueAtRisk[k], shortfall[k], confidence, side);
    let forecastRows = 0;
    let declinedRows = 0;
    let firstReason: string | null = null;
    for (let t = 0; t < n; t++) {
      if (Number.isFinite(valueAtRisk[k][t])) forecastRows++;
      else if (run.notes[t] !== undefined) {
        declinedRows++;
        firstReason ??= run.notes[t] ?? null;
      }
    }
    const bt = commonRows > 0 ? backtestVar(common, valueAtRisk[k], confidence, side) : null;
    return { model: run.model, forecastRows, declinedRows, firstReason, backtest: bt, meanTickLoss: s.meanTickLoss, meanFz0Loss: s.meanFz0Loss, fz0: s.fz0 };
  });
  const order = scored.map((_, k) => k).sort((a, b) => {
    const x = scored[a].meanFz0Loss;
    const y = scored[b].meanFz0Loss;
    if (Number.isNaN(x) || Number.isNaN(y)) return Number.isNaN(x) ? (Number.isNaN(y) ? 0 : 1) : -1;
    return x - y;
  });
  const best = scored[order[0]];
  const methods = order.map((k, rank): ComparedMethod => {
    const s = scored[k];
    const p = rank === 0 || Number.isNaN(s.meanFz0Loss) ? NaN : dieboldMariano(s.fz0, best.fz0).smallSamplePValue;
    return {
      model: s.model,
      forecastRows: s.forecastRows,
      declinedRows: s.declinedRows,
      firstReason: s.firstReason,
      backtest: s.backtest,
      meanTickLoss: s.meanTickLoss,
      meanFz0Loss: s.meanFz0Loss,
      pValueAgainstBest: p,
    };
  });
  return { commonRows, methods };
}
