/**
 * The "Volatility and backtest" view's computation: one Work that makes, for the pane's data, exactly what these
 * cell functions make for the same column —
 *   VOLATILITY(returns, model)                       σₜ per row (parameters from the whole column)
 *   VOLFIT(returns, model)                           the model report rows (tables/volReport.ts)
 *   ROLLVAR / ROLLES / ROLLPIT(returns, window, level, side, method, model)   for the chosen model and for "iid"
 *   BACKTEST(returns, ROLLVAR column, level, side)   the backtest rows (tables/backtest.ts)
 *   ESBACKTEST(returns, ROLLVAR, ROLLES, level, side, ROLLPIT)   the ES backtest (tables/esBacktest.ts)
 * by calling the same core (rolling engine over the model registry, backtestVar, volReport, esBacktestWork). Nothing
 * here computes a statistic of its own. The result is plain data (typed arrays, row tables, result objects), so a
 * Web Worker can compute it and post it to the page.
 *
 * The iid line uses method "auto" (the L-moment forecast where maximum likelihood has no regular maximum in a
 * window), so its column has a number on every forecast row and can be backtested; ROLLVAR(…, "auto", "iid") in the
 * sheet gives the same column. Bounds: the rolling cell functions' (at most 20,000 rows and at most 5,000,000
 * window-observations), checked before any work.
 */
import { fitGnoCached } from "../core/fit";
import { moments } from "../core/gno";
import { backtestVar, createModel, exceptionSequence, rollingForecasts, type RiskSide, type VarBacktest } from "../core/risk";
import { fitVolatility, volReport } from "../core/vol";
import type { Work } from "../core/work";
import { CellError } from "../functions/cells";
import { backtestRows, type BacktestRow } from "../functions/tables/backtest";
import { esBacktestRows, esBacktestWork, type EsBacktestParts } from "../functions/tables/esBacktest";
import type { ReportRow } from "../functions/tables/fitReport";
import { volReportRows } from "../functions/tables/volReport";
import { compareMethods, DEFAULT_COMPARED_MODELS } from "../core/risk/comparison/methodComparison";
import { methodComparisonRows } from "../functions/tables/methodComparison";

export const VIEW_MODELS = ["iid", "ewma", "garch"] as const;
export type ViewModel = (typeof VIEW_MODELS)[number];

export const MODEL_LABELS: Readonly<Record<ViewModel, string>> = { iid: "Fitted law (iid)", ewma: "EWMA (λ 0.94)", garch: "GARCH(1,1)" };

/** Same bounds as the rolling cell functions (src/functions/rolling.ts). */
export const VIEW_MAX_ROWS = 20_000;
export const VIEW_MAX_CELLS = 5_000_000;
export const VIEW_MIN_WINDOW = 10;
/** GARCH refuses windows below this (the model's own rule; stated here so the pane can say it before running). */
export const VIEW_MIN_GARCH_WINDOW = 100;

export interface VolSpec {
  readonly model: ViewModel;
  readonly window: number;
  readonly level: number;
  readonly side: RiskSide;
  /** Also compare the reference methods (hs, normal, Cornish–Fisher, filtered HS) on the same windows. */
  readonly compare?: boolean;
}

/** The models of the method comparison: the chosen model (when not iid) and the reference set. */
export function comparedModels(model: ViewModel): string[] {
  return model === "iid" ? [...DEFAULT_COMPARED_MODELS] : [model, ...DEFAULT_COMPARED_MODELS];
}

/** The ROLLVAR `method` argument that reproduces a line (null: the default). */
export function lineMethod(model: ViewModel): string | null {
  return model === "iid" ? "auto" : null;
}

export interface LineResult {
  readonly model: ViewModel;
  readonly method: string | null;
  /** Per data row; NaN where ROLLVAR/ROLLES/ROLLPIT show "" or an error. */
  readonly valueAtRisk: Float64Array;
  readonly expectedShortfall: Float64Array;
  readonly pit: Float64Array;
  /** 1 where the row is an exception of this line's VaR, else 0 (forecast rows only; see `forecastRows`). */
  readonly exceptions: Uint8Array;
  readonly forecastRows: number;
  /** Rows the model declined or flagged (the cell shows #VALUE!/#N/A there) and the first reason. */
  readonly problemRows: number;
  readonly firstProblem: string | null;
  readonly backtest: VarBacktest | null;
  readonly backtestRows: BacktestRow[] | null;
  readonly es: EsBacktestParts | null;
  readonly esRows: BacktestRow[] | null;
  /** Why there is no ES backtest (too few rows…), or null. */
  readonly esProblem: string | null;
}

export interface VolResult {
  readonly spec: VolSpec;
  /** σₜ per data row as VOLATILITY gives it, or null with the reason. */
  readonly sigmas: Float64Array | null;
  readonly sigmaProblem: string | null;
  readonly report: ReportRow[] | null;
  readonly reportProblem: string | null;
  /** The chosen model first, then the iid line (once when the chosen model is iid). */
  readonly lines: LineResult[];
  /** The method-comparison table (header + rows, best first by mean FZ0 loss), when asked for. */
  readonly comparison: Array<Array<number | string>> | null;
  readonly comparisonRows: number;
}

/** Checks the spec against the data before any work; returns a sentence for the user, or null when it can run. */
export function specProblem(n: number, spec: VolSpec): string | null {
  if (n > VIEW_MAX_ROWS) return `The data hold ${n} returns; the rolling backtest accepts at most ${VIEW_MAX_ROWS.toLocaleString("en-US")}.`;
  if (!Number.isInteger(spec.window) || spec.window < VIEW_MIN_WINDOW || spec.window >= n) {
    return `The window must be a whole number from ${VIEW_MIN_WINDOW} to ${n - 1} (one less than the ${n} returns).`;
  }
  if (spec.model === "garch" && spec.window < VIEW_MIN_GARCH_WINDOW) return `A GARCH window needs at least ${VIEW_MIN_GARCH_WINDOW} returns.`;
  if ((n - spec.window) * spec.window > VIEW_MAX_CELLS) {
    return `(returns − window) × window = ${(n - spec.window) * spec.window} is above the bound of ${VIEW_MAX_CELLS.toLocaleString("en-US")}; use a shorter window.`;
  }
  if (!(spec.level > 0 && spec.level < 1)) return "The level must lie strictly between 0 and 1.";
  return null;
}

/** Maps a sub-work's fractions into [from, from + span] of the whole. */
function* part<T>(w: Work<T>, from: number, span: number): Work<T> {
  for (;;) {
    const r = w.next();
    if (r.done) return r.value;
    yield from + span * r.value;
  }
}

const messageOf = (e: unknown): string => (e instanceof Error ? e.message : String(e));

/** σₜ as VOLATILITY(returns, model) gives it (innovations "gno"). */
function sigmasOf(data: Float64Array, model: ViewModel): { sigmas: Float64Array | null; problem: string | null } {
  if (model === "iid") return { sigmas: new Float64Array(data.length).fill(moments(fitGnoCached(data, "mle").params).sd), problem: null };
  const est = fitVolatility(data, model, { innovations: "gno" });
  if (!est.converged) return { sigmas: null, problem: `The ${model.toUpperCase()} fit did not converge (${est.reason}).` };
  return { sigmas: Float64Array.from(est.sigmas), problem: null };
}

function* lineWork(data: Float64Array, spec: VolSpec, model: ViewModel, from: number, span: number): Work<LineResult> {
  const n = data.length;
  const method = lineMethod(model);
  const run = yield* part(rollingForecasts(data, spec.window, createModel(model, { method: method ?? undefined })), from, span * 0.8);
  const v = new Float64Array(n).fill(NaN);
  const e = new Float64Array(n).fill(NaN);
  const u = new Float64Array(n).fill(NaN);
  let problemRows = 0;
  let firstProblem: string | null = null;
  for (let i = 0; i < n; i++) {
    const law = run.laws[i];
    const note = run.notes[i];
    if (note !== undefined) {
      problemRows++;
      firstProblem ??= note;
      continue;
    }
    if (!law) continue;
    const fin = (x: number): number => (Number.isFinite(x) ? x : NaN);
    v[i] = fin(law.valueAtRisk(spec.level, spec.side));
    e[i] = fin(law.expectedShortfall(spec.level, spec.side));
    const p = law.cdf(data[i]);
    u[i] = fin(spec.side === "short" ? 1 - p : p);
  }
  const bt = backtestVar(data, v, spec.level, spec.side);
  const hits = new Uint8Array(n);
  let forecastRows = 0;
  const seq = exceptionSequence(data, v, spec.side);
  for (let i = 0, j = 0; i < n; i++) {
    if (Number.isNaN(v[i])) continue;
    forecastRows++;
    hits[i] = seq[j++] ? 1 : 0;
  }
  let es: EsBacktestParts | null = null;
  let esProblem: string | null = null;
  try {
    es = yield* part(esBacktestWork(data, v, e, spec.level, spec.side, u), from + span * 0.8, span * 0.2);
  } catch (err) {
    if (!(err instanceof CellError)) throw err;
    esProblem = err.message;
  }
  return {
    model,
    method,
    valueAtRisk: v,
    expectedShortfall: e,
    pit: u,
    exceptions: hits,
    forecastRows,
    problemRows,
    firstProblem,
    backtest: bt,
    backtestRows: bt ? backtestRows(bt) : null,
    es,
    esRows: es ? esBacktestRows(es) : null,
    esProblem,
  };
}

/** The whole view as one Work (progress 0 → 1). Call specProblem first. */
export function* volBacktestWork(data: Float64Array, spec: VolSpec): Work<VolResult> {
  let report: ReportRow[] | null = null;
  let reportProblem: string | null = null;
  try {
    report = volReportRows(volReport(data, spec.model, "gno"));
  } catch (err) {
    reportProblem = messageOf(err);
  }
  yield 0.03;
  const s = sigmasOf(data, spec.model);
  yield 0.05;
  const lines: LineResult[] = [];
  // The chosen model takes most of the time when it is GARCH (a likelihood maximisation per row).
  const scale = spec.compare ? 0.4 : 1;
  const chosenSpan = (spec.model === "iid" ? 0.95 : spec.model === "garch" ? 0.75 : 0.45) * scale;
  lines.push(yield* lineWork(data, spec, spec.model, 0.05, chosenSpan));
  if (spec.model !== "iid") lines.push(yield* lineWork(data, spec, "iid", 0.05 + chosenSpan, 0.95 * scale - chosenSpan));
  let comparison: Array<Array<number | string>> | null = null;
  let comparisonRows = 0;
  if (spec.compare) {
    const c = yield* part(compareMethods(data, spec.window, spec.level, spec.side, comparedModels(spec.model)), 0.05 + 0.95 * scale, 0.95 * (1 - scale));
    comparison = methodComparisonRows(c);
    comparisonRows = c.commonRows;
  }
  return { spec, sigmas: s.sigmas, sigmaProblem: s.problem, report, reportProblem, lines, comparison, comparisonRows };
}
