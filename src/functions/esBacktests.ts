/**
 * Cell functions for expected-shortfall backtests and the desk-level regulatory tests: ASKEW.ESBACKTEST (async,
 * cancelable: it runs a simulated p-value and a bootstrap), ASKEW.DESKTEST and ASKEW.PLATEST.
 * Thin adapters: parse (the series reader of risk.ts) → src/core/risk/backtests → tables/.
 *
 * Conventions: returns and P&L columns are amounts with gains positive; VaR and ES columns are positive losses.
 * Statistical evidence only: a regulatory determination follows the firm's model-risk policy and the supervisor.
 */
import { RISK_SIDES } from "../core/risk";
import { deskTest } from "../core/risk/backtests/desk";
import { attributionTest } from "../core/risk/backtests/attribution";
import { runWork, guardGridAsync } from "./async";
import { fail, guardGrid, isBlank, labelTable, readChoice, readProbability, type Grid } from "./cells";
import { readSeries, type Series } from "./risk";
import { esBacktestRows, esBacktestWork } from "./tables/esBacktest";
import { attributionRows, deskRows } from "./tables/desk";

/** Most rows ESBACKTEST accepts (bounds the simulation at ES_REPLICATES × rows uniform draws). */
export const MAX_ES_ROWS = 20_000;
export { MIN_ES_ROWS, ES_REPLICATES } from "./tables/esBacktest";
/** Most rows DESKTEST and PLATEST read: a whole worksheet column (only the latest 250 days are used; reading is one pass). */
export const MAX_DESK_ROWS = 1_048_576;

function sameLength(a: Series, b: Series, an: string, bn: string): void {
  if (a.values.length !== b.values.length) fail(`${an} (${a.values.length} cells) and ${bn} (${b.values.length} cells) must be the same length.`);
}

function bounded(s: Series, name: string, max: number): Series {
  if (s.values.length > max) fail(`${name} has ${s.values.length} cells; at most ${max} are accepted.`);
  return s;
}

/**
 * ES backtests: Z1, Z2 with critical values and a simulated p-value, the exceedance-residual bootstrap; with a PIT column also multinomial, tail LR and ES traffic light.
 * @customfunction ESBACKTEST
 * @cancelable
 * @param returns Realised returns (gains positive) in one column; at most 20000 rows; blank rows are skipped.
 * @param VaR VaR forecasts for the same rows as positive losses.
 * @param ES ES forecasts for the same rows as positive losses, at least VaR.
 * @param confidence Confidence level of VaR and ES, strictly between 0 and 1, e.g. 0.975.
 * @param [side] "long" (default: losses are falls) or "short".
 * @param [pit] PIT of each return under its forecast law, F(return), between 0 and 1 (e.g. from a rolling forecast).
 * @returns A 21×2 table (label, value); the last 8 rows are blank without pit. Statistical evidence, not a regulatory determination.
 */
export async function esBacktest(
  returns: any[][],
  VaR: any[][],
  ES: any[][],
  confidence: any,
  side: any,
  pit: any[][],
  invocation: CustomFunctions.CancelableInvocation,
): Promise<any[][]> {
  return guardGridAsync(async (): Promise<Grid> => {
    const r = readSeries(returns, "returns");
    const v = readSeries(VaR, "VaR");
    const e = readSeries(ES, "ES");
    sameLength(r, v, "returns", "VaR");
    sameLength(r, e, "returns", "ES");
    // The bound is on rows that carry a return, a VaR and an ES: a whole-column reference padded with blanks is fine.
    let used = 0;
    for (let i = 0; i < r.values.length; i++) if (!Number.isNaN(r.values[i]) && !Number.isNaN(v.values[i]) && !Number.isNaN(e.values[i])) used++;
    if (used > MAX_ES_ROWS) fail(`returns has ${used} rows with a return, a VaR and an ES; at most ${MAX_ES_ROWS} are accepted.`);
    const c = readProbability(confidence, "confidence");
    const s = readChoice(side, "side", RISK_SIDES, "long");
    for (let i = 0; i < r.values.length; i++) {
      if (e.values[i] < v.values[i]) fail(`ES at row ${i + 1} (${e.values[i]}) is below the VaR (${v.values[i]}); ES must be at least VaR.`);
    }
    let p: Float64Array | null = null;
    const pitGiven = !(pit === null || pit === undefined || (!Array.isArray(pit) && isBlank(pit)));
    if (pitGiven) {
      const ps = readSeries(pit, "pit");
      sameLength(r, ps, "returns", "pit");
      ps.values.forEach((u, i) => {
        if (u < 0 || u > 1) fail(`pit at row ${i + 1} is ${u}; a PIT lies between 0 and 1.`);
      });
      p = ps.values;
    }
    const parts = await runWork(esBacktestWork(r.values, v.values, e.values, c, s, p), invocation);
    return labelTable(esBacktestRows(parts));
  });
}

/**
 * Desk-level backtest over the latest 250 days: exceptions at 99% and 97.5% for actual (and hypothetical) P&L, limits, verdict, multiplier.
 * @customfunction DESKTEST
 * @param actual Actual daily P&L (gains positive), oldest first; rows blank in every column are skipped, a day missing P&L or VaR is an exception.
 * @param VaR99 One-day 99% VaR for the same days, positive losses.
 * @param VaR975 One-day 97.5% VaR for the same days, positive losses.
 * @param [hypothetical] Hypothetical daily P&L (gains positive) for the same days.
 * @returns A 13×2 table (label, value). Statistical evidence, not a regulatory determination.
 */
export function desktest(actual: any[][], VaR99: any[][], VaR975: any[][], hypothetical?: any[][]): any[][] {
  return guardGrid(() => {
    const a = bounded(readSeries(actual, "actual"), "actual", MAX_DESK_ROWS);
    const v99 = readSeries(VaR99, "VaR99");
    const v975 = readSeries(VaR975, "VaR975");
    sameLength(a, v99, "actual", "VaR99");
    sameLength(a, v975, "actual", "VaR975");
    let h: Float64Array | null = null;
    if (!(hypothetical === null || hypothetical === undefined || (!Array.isArray(hypothetical) && isBlank(hypothetical)))) {
      const hs = readSeries(hypothetical, "hypothetical");
      sameLength(a, hs, "actual", "hypothetical");
      h = hs.values;
    }
    const d = deskTest(a.values, v99.values, v975.values, h);
    if (d === null) fail("actual is empty: nothing to test.");
    return labelTable(deskRows(d));
  });
}

/**
 * P&L attribution over the latest 250 paired days: Spearman correlation, two-sample KS statistic and the green/amber/red zone.
 * @customfunction PLATEST
 * @param hypothetical Hypothetical daily P&L (gains positive), oldest first; days with a blank in either column are skipped.
 * @param risktheoretical Risk-theoretical daily P&L from the risk model (gains positive), same days.
 * @returns A 7×2 table (label, value). Statistical evidence, not a regulatory determination.
 */
export function platest(hypothetical: any[][], risktheoretical: any[][]): any[][] {
  return guardGrid(() => {
    const h = bounded(readSeries(hypothetical, "hypothetical"), "hypothetical", MAX_DESK_ROWS);
    const r = readSeries(risktheoretical, "risktheoretical");
    sameLength(h, r, "hypothetical", "risktheoretical");
    const t = attributionTest(h.values, r.values);
    if (t === null) fail("Fewer than 2 days have both P&L values: nothing to compare.");
    if (t.observations < 10) fail(`Only ${t.observations} paired days: at least 10 are needed (the rule uses 250).`);
    return labelTable(attributionRows(t));
  });
}
