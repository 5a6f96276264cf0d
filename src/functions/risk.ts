/**
 * Cell functions for the risk layer: VaR and expected shortfall of the law, the VaR interval of a fit,
 * VaR backtests and returns from prices (the rolling forecasts are in rolling.ts).
 * Thin adapters: parse (cells.ts and the series reader below) → src/core/risk → shape.
 *
 * Series arguments (returns, VaR, prices) are one column or one row; blanks are kept as gaps (NaN) so each
 * output row lines up with its input row; text, booleans and error cells are rejected naming the cell.
 */
import { fitGnoCachedWork } from "../core/fit";
import {
  backtestVar,
  expectedShortfall,
  RETURN_KINDS,
  returnsFromPrices,
  RISK_SIDES,
  valueAtRisk,
  varInterval,
  varProfileIntervalWork,
  type VarProfileInterval,
} from "../core/risk";
import { ContentCache } from "../core/fit";
import { guardGridAsync, runWork } from "./async";
import {
  CellValue,
  Grid,
  asGrid,
  describeCell,
  fail,
  guardGrid,
  isBlank,
  labelTable,
  mapCells,
  notAvailable,
  numberCell,
  readChoice,
  readData,
  readInteger,
  readParams,
  readProbability,
  isSpliced,
  WITH_TAILS,
} from "./cells";
import { backtestRows } from "./tables/backtest";
import { splicedExpectedShortfall, splicedValueAtRisk, type SplicedParams } from "../core/pareto";
import type { GnoParams } from "../core/gno";
import { horizonLaw, MAX_HORIZON, MAX_HORIZON_SHAPE, type HorizonLaw } from "../core/risk/horizons";


export interface Series {
  readonly values: Float64Array;
  /** True when the argument was a single row (the output keeps that orientation). */
  readonly isRow: boolean;
}

/** Reads a single column or row of numbers; blanks become NaN gaps; anything else is an error naming its cell. */
export function readSeries(v: unknown, name: string): Series {
  const grid = asGrid(v);
  const rows = grid.length;
  const cols = rows > 0 ? grid[0].length : 0;
  if (rows > 1 && cols > 1) fail(`${name} must be a single column (or row); got ${rows} rows × ${cols} columns.`);
  const isRow = rows === 1 && cols > 1;
  const n = cols === 0 ? 0 : isRow ? cols : rows;
  const values = new Float64Array(n);
  // One loop, no per-cell allocation (a whole-column reference is 1,048,576 cells); the message is built on failure only.
  for (let i = 0; i < n; i++) {
    const x = isRow ? grid[0][i] : grid[i][0];
    if (typeof x === "number" && x - x === 0) values[i] = x;
    else if (isBlank(x)) values[i] = NaN;
    else fail(`${name}: the cell at ${isRow ? "column" : "row"} ${i + 1} holds ${describeCell(x)}; only numbers and blanks are allowed.`);
  }
  return { values, isRow };
}

/** Shapes a series result like its input: NaN → "" (no value for that row). */
export function shapeSeries(values: ArrayLike<number>, isRow: boolean, whatIfNotFinite: string): Grid {
  const cells: CellValue[] = [];
  for (let i = 0; i < values.length; i++) cells.push(Number.isNaN(values[i]) ? "" : numberCell(values[i], whatIfNotFinite));
  return isRow ? [cells] : cells.map((c) => [c]);
}

function readConfidence(v: number): number {
  if (!(v > 0 && v < 1)) fail(`confidence must lie strictly between 0 and 1 (got ${v}); e.g. 0.99 for 99%.`);
  return v;
}

/**
 * Reads the optional horizon in days: blank or omitted gives 1, today's one-day figure; 0 is an error, as for every
 * whole-number argument (a 0 that an old desktop build sends for a blank cannot be told apart). Beyond one day the h-day law needs
 * |shape| ≤ MAX_HORIZON_SHAPE (src/core/risk/horizons) and the plain 3-cell law (no Pareto tails).
 */
function readHorizon(v: unknown, p: GnoParams | SplicedParams): number {
  const h = readInteger(v, "horizon", 1, MAX_HORIZON, 1);
  if (h === 1) return h;
  if (isSpliced(p)) {
    notAvailable(`No ${h}-day figure for Pareto-tailed params: the exact h-day law is computed for the 3-cell law only; use ASKEW.HORIZON (simulation) for the fitted model instead.`);
  }
  if (Math.abs(p.shape) > MAX_HORIZON_SHAPE) {
    notAvailable(
      `No ${h}-day figure: the shape ${p.shape} is beyond ±${MAX_HORIZON_SHAPE}, where the exact h-day law is not computed to 1e-8; use ASKEW.HORIZON (simulation) instead.`,
    );
  }
  return h;
}

/** One-day (h = 1, the closed form untouched) or h-day (sum of h i.i.d. draws) risk figure per confidence cell. */
function riskByHorizon(
  confidence: any[][],
  p: GnoParams | SplicedParams,
  h: number,
  oneDay: (c: number) => number,
  hDay: (law: HorizonLaw, c: number) => number,
  whatIfNotFinite: string,
): Grid {
  if (h === 1) return mapCells(confidence, "confidence", (c) => oneDay(readConfidence(c)), whatIfNotFinite);
  if (isSpliced(p)) throw new RangeError("h-day figures need the 3-cell law"); // refused by readHorizon first
  const law = horizonLaw(p, h);
  return mapCells(confidence, "confidence", (c) => hDay(law, readConfidence(c)), whatIfNotFinite);
}

/**
 * Value at risk of the law at a confidence level, as a positive loss (negative means a gain); over h days, of the sum of h independent days.
 * @customfunction VAR
 * @param confidence Confidence level strictly between 0 and 1, e.g. 0.99; a range gives one VaR per cell.
 * @param params Location, scale, shape: 3 cells (e.g. from ASKEW.FIT), or 9 with Pareto tails (ASKEW.TAILFIT).
 * @param [side] "long" (default: losses when returns fall) or "short" (losses when returns rise).
 * @param [horizon] Days, 1 (default) to 250: the exact law of the sum of that many independent days, not √h scaling; |shape| ≤ 0.75 beyond 1 day.
 * @returns The loss exceeded with probability 1 − confidence.
 */
export function valueAtRiskCell(confidence: any[][], params: any[][], side?: any, horizon?: any): any[][] {
  return guardGrid(() => {
    const p = readParams(params, "params", WITH_TAILS);
    const s = readChoice(side, "side", RISK_SIDES, "long");
    const h = readHorizon(horizon, p);
    return riskByHorizon(
      confidence,
      p,
      h,
      (c) => (isSpliced(p) ? splicedValueAtRisk(c, p, s) : valueAtRisk(c, p, s)),
      (law, c) => law.valueAtRisk(c, s),
      "The VaR overflows for these parameters.",
    );
  });
}

/**
 * Expected shortfall of the law: the mean loss beyond the VaR at a confidence level, as a positive loss; over h days, of the sum of h independent days.
 * @customfunction SHORTFALL
 * @param confidence Confidence level strictly between 0 and 1, e.g. 0.975; a range gives one ES per cell.
 * @param params Location, scale, shape: 3 cells (e.g. from ASKEW.FIT), or 9 with Pareto tails (ASKEW.TAILFIT).
 * @param [side] "long" (default: losses when returns fall) or "short" (losses when returns rise).
 * @param [horizon] Days, 1 (default) to 250: the exact law of the sum of that many independent days, not √h scaling; |shape| ≤ 0.75 beyond 1 day.
 * @returns The mean loss in the worst 1 − confidence of outcomes.
 */
export function expectedShortfallCell(confidence: any[][], params: any[][], side?: any, horizon?: any): any[][] {
  return guardGrid(() => {
    const p = readParams(params, "params", WITH_TAILS);
    const s = readChoice(side, "side", RISK_SIDES, "long");
    const h = readHorizon(horizon, p);
    return riskByHorizon(
      confidence,
      p,
      h,
      (c) => (isSpliced(p) ? splicedExpectedShortfall(c, p, s) : expectedShortfall(c, p, s)),
      (law, c) => law.expectedShortfall(c, s),
      "The expected shortfall is infinite or overflows: the tail is too heavy (a Pareto tail with ξ ≥ 1 has none).",
    );
  });
}

const profileIntervals = new ContentCache<VarProfileInterval>(16);

/**
 * Confidence interval for the VaR of a maximum-likelihood fit: the profile-likelihood interval by default, or
 * "delta" for the VaR ± z·standard error.
 * @customfunction VARCI
 * @cancelable
 * @param data Daily returns: a column or range of numbers; blanks are skipped.
 * @param confidence VaR confidence level strictly between 0 and 1, e.g. 0.99.
 * @param [side] "long" (default) or "short".
 * @param [level] Coverage of the interval strictly between 0 and 1 (default 0.95).
 * @param [method] "profile" (profile likelihood, default) or "delta" (VaR ± z·standard error).
 * @returns A 3×1 column: lower end, VaR of the fitted law, upper end. An end the data cannot bound shows #VALUE! with the reason.
 */
export async function varIntervalCell(
  data: any[][],
  confidence: any,
  side: any,
  level: any,
  method: any,
  invocation: CustomFunctions.CancelableInvocation,
): Promise<any[][]> {
  return guardGridAsync(async (): Promise<Grid> => {
    const x = readData(data, "data");
    const c = readProbability(confidence, "confidence");
    const s = readChoice(side, "side", RISK_SIDES, "long");
    const lv = isBlank(level) ? 0.95 : readProbability(level, "level");
    const m = readChoice(method, "method", ["profile", "delta"] as const, "profile");
    const fit = await runWork(fitGnoCachedWork(x, "mle"), invocation);
    if (m === "profile") {
      if (!fit.regular) notAvailable(`No VaR interval: the fit is not a regular maximum of the likelihood (${fit.reason}).`);
      const key = `profile:${c}:${s}:${lv}`;
      let ci = profileIntervals.get(x, key);
      if (!ci) {
        ci = await runWork(varProfileIntervalWork(x, fit, c, s, lv), invocation);
        profileIntervals.set(x, key, ci);
      }
      if (!Number.isFinite(ci.valueAtRisk)) notAvailable(`No VaR interval: ${ci.reason ?? "the fitted VaR is not finite"}.`);
      const why = ci.reason ?? "";
      return [
        [numberCell(ci.lower, `No lower end: ${why}.`)],
        [ci.valueAtRisk],
        [numberCell(ci.upper, `No upper end: ${why}.`)],
      ];
    }
    if (fit.covariance === null) notAvailable(`No VaR interval: the fit has no covariance (${fit.reason}).`);
    const ci = varInterval(fit.params, fit.covariance, c, s, lv);
    if (!Number.isFinite(ci.lower) || !Number.isFinite(ci.upper)) {
      notAvailable("No VaR interval: the fit's covariance does not give a finite variance for the VaR.");
    }
    return [[ci.lower], [ci.valueAtRisk], [ci.upper]];
  });
}

/**
 * Backtest of a VaR column against realised returns: exception count, Kupiec and Christoffersen tests, traffic-light zone, duration test.
 * @customfunction BACKTEST
 * @param returns Realised returns in one column; rows where returns or VaR is blank are skipped.
 * @param VaR VaR forecasts for the same rows as positive losses (e.g. from ASKEW.ROLLVAR).
 * @param confidence The confidence level the VaR was computed at, strictly between 0 and 1, e.g. 0.99.
 * @param [side] "long" (default: an exception is a return below −VaR) or "short" (a return above VaR).
 * @returns A 20×2 table (label, value): observations, exceptions, rates, LR tests and p-values, zone, duration test.
 */
export function backtest(returns: any[][], VaR: any[][], confidence: any, side?: any): any[][] {
  return guardGrid(() => {
    const r = readSeries(returns, "returns");
    const v = readSeries(VaR, "VaR");
    if (r.values.length !== v.values.length) {
      fail(`returns (${r.values.length} cells) and VaR (${v.values.length} cells) must be the same length.`);
    }
    const c = readProbability(confidence, "confidence");
    const s = readChoice(side, "side", RISK_SIDES, "long");
    const bt = backtestVar(r.values, v.values, c, s);
    if (bt === null) fail("No row has both a return and a VaR: nothing to backtest.");
    return labelTable(backtestRows(bt));
  });
}

/**
 * Returns from a price series: log returns ln(P_t / P_t−1) or simple returns P_t / P_t−1 − 1.
 * @customfunction RETURNS
 * @param prices Prices in one column (or row), oldest first; all must be greater than 0; a blank price leaves its returns blank.
 * @param [kind] "log" (default) or "simple".
 * @returns A column one shorter than prices.
 */
export function returns(prices: any[][], kind?: any): any[][] {
  return guardGrid(() => {
    const p = readSeries(prices, "prices");
    if (p.values.length < 2) fail("prices needs at least 2 cells to give a return.");
    p.values.forEach((x, i) => {
      if (x <= 0) fail(`prices: the price at ${p.isRow ? "column" : "row"} ${i + 1} is ${x}; prices must be greater than 0.`);
    });
    const k = readChoice(kind, "kind", RETURN_KINDS, "log");
    return shapeSeries(returnsFromPrices(p.values, k), p.isRow, "The return overflows.");
  });
}
