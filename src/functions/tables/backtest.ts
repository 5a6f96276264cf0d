/**
 * Label/value rows of a VaR backtest, built from the core result object so the cell function
 * (ASKEW.BACKTEST) and the task pane show the very same rows.
 *
 * Row order (fixed; documented for users of the spilled table):
 *  1 Observations used            9 Independence p-value
 *  2 Exceptions                  10 Independence test informative (TRUE/FALSE)
 *  3 Expected exceptions         11 Conditional coverage LR (Christoffersen 1998)
 *  4 Exception rate              12 Conditional coverage p-value
 *  5 Expected rate (1 − c)       13 Traffic-light zone (green / yellow / red)
 *  6 Kupiec POF LR (Kupiec 1995) 14 Binomial P(count ≤ exceptions)
 *  7 Kupiec p-value              15 Most exceptions still green
 *  8 Independence LR             16 Fewest exceptions in red
 * 17 Duration LR, Weibull vs exponential (Christoffersen & Pelletier 2004; "" when not informative)
 * 18 Duration p-value (asymptotic χ²₁; unreliable with few exceptions)
 * 19 Duration Weibull shape (1 = memoryless; below 1 = clustered exceptions)
 * 20 Duration test informative (TRUE/FALSE: at least 2 complete durations)
 */
import type { VarBacktest } from "../../core/risk/backtests/backtest";

export type BacktestRow = readonly [string, number | string | boolean];

export const BACKTEST_LABELS: readonly string[] = [
  "Observations used",
  "Exceptions",
  "Expected exceptions",
  "Exception rate",
  "Expected rate",
  "Kupiec POF LR",
  "Kupiec p-value",
  "Independence LR",
  "Independence p-value",
  "Independence test informative",
  "Conditional coverage LR",
  "Conditional coverage p-value",
  "Traffic-light zone",
  "Binomial P(count ≤ exceptions)",
  "Most exceptions still green",
  "Fewest exceptions in red",
  "Duration LR (Weibull vs exponential)",
  "Duration p-value",
  "Duration Weibull shape",
  "Duration test informative",
];

/** The backtest as (label, value) rows in the documented order. */
export function backtestRows(bt: VarBacktest): BacktestRow[] {
  const values: Array<number | string | boolean> = [
    bt.observations,
    bt.exceptions,
    bt.expectedExceptions,
    bt.exceptionRate,
    bt.expectedRate,
    bt.kupiec.statistic,
    bt.kupiec.pValue,
    bt.independence.statistic,
    bt.independence.pValue,
    bt.independence.informative,
    bt.conditionalCoverage.statistic,
    bt.conditionalCoverage.pValue,
    bt.zone,
    bt.cumulativeProbability,
    bt.greenMax,
    bt.redFrom,
    bt.duration.informative ? bt.duration.statistic : "",
    bt.duration.informative ? bt.duration.pValue : "",
    bt.duration.informative ? bt.duration.shape : "",
    bt.duration.informative,
  ];
  return BACKTEST_LABELS.map((label, i) => [label, values[i]] as const);
}
