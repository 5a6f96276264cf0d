/**
 * Label/value rows of the desk-level test (ASKEW.DESKTEST) and of the P&L attribution test (ASKEW.PLATEST).
 *
 * DESKTEST rows (fixed; the hypothetical rows are "" when no hypothetical P&L is given):
 *  1 Window used (days)                   8 Hypothetical: exceptions at 97.5%
 *  2 Full 250-day window                  9 Days without P&L or VaR (counted as exceptions)
 *  3 Actual: exceptions at 99%           10 Desk verdict
 *  4 Actual: exceptions at 97.5%         11 Bank-level exceptions at 99% (larger series)
 *  5 Limit at 99% (more fails)           12 Multiplier
 *  6 Limit at 97.5% (more fails)         13 Multiplier zone
 *  7 Hypothetical: exceptions at 99%
 *
 * PLATEST rows: 1 Paired days used, 2 Spearman correlation, 3 KS statistic, 4 KS p-value (exact), 5 Spearman zone,
 * 6 KS zone, 7 Attribution zone.
 */
import type { DeskTest } from "../../core/risk/backtests/desk";
import type { AttributionTest } from "../../core/risk/backtests/attribution";
import type { BacktestRow } from "./backtest";

export const DESK_LABELS: readonly string[] = [
  "Window used (days)",
  "Full 250-day window",
  "Actual: exceptions at 99%",
  "Actual: exceptions at 97.5%",
  "Limit at 99% (more fails)",
  "Limit at 97.5% (more fails)",
  "Hypothetical: exceptions at 99%",
  "Hypothetical: exceptions at 97.5%",
  "Days without P&L or VaR",
  "Desk verdict",
  "Bank-level exceptions at 99%",
  "Multiplier",
  "Multiplier zone",
];

export function deskRows(d: DeskTest): BacktestRow[] {
  const h = d.hypothetical;
  const values: Array<number | string | boolean> = [
    d.window,
    !d.shortWindow,
    d.actual.at99.exceptions,
    d.actual.at975.exceptions,
    d.limit99,
    d.limit975,
    h ? h.at99.exceptions : "",
    h ? h.at975.exceptions : "",
    d.unavailableDays,
    d.deskPasses ? "within limits" : "limit breached",
    d.bankExceptions,
    d.multiplier,
    d.zone,
  ];
  return DESK_LABELS.map((label, i) => [label, values[i]] as const);
}

export const ATTRIBUTION_LABELS: readonly string[] = [
  "Paired days used",
  "Spearman correlation",
  "KS statistic",
  "KS p-value (exact)",
  "Spearman zone",
  "KS zone",
  "Attribution zone",
];

export function attributionRows(a: AttributionTest): BacktestRow[] {
  const values: Array<number | string | boolean> = [a.observations, a.spearman, a.ks, a.ksPValue, a.spearmanZone, a.ksZone, a.zone];
  return ATTRIBUTION_LABELS.map((label, i) => [label, values[i]] as const);
}
