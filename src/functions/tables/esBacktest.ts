/**
 * Label/value rows of the ES backtest (ASKEW.ESBACKTEST), built from the core results so the cell function and
 * the pane show the very same rows. Always 21 rows; rows 14–21 are "" when no PIT column is given.
 *
 *  1 Observations used                    12 Exceedance residual t-statistic
 *  2 Exceptions (loss beyond VaR)         13 Exceedance residual p-value (bootstrap, one-sided)
 *  3 Expected exceptions                  14 Multinomial statistic (Pearson, 4 levels)
 *  4 Z1                                   15 Multinomial p-value (χ²₄)
 *  5 Z2                                   16 Multinomial p-value (Nass)
 *  6 Z2 critical value 5%                 17 Tail LR (censored normal)
 *  7 Z2 critical value 0.01%              18 Tail LR p-value
 *  8 Z2 verdict                           19 ES failure rate Z
 *  9 Z2 p-value (simulated)               20 ES failure rate P(≤ Z)
 * 10 Exceedance residuals                 21 ES traffic-light zone
 * 11 Mean exceedance residual
 * A statistic that does not apply (e.g. Z1 with no exception) is "".
 */
import type { ShortfallZ, SimulatedPValue } from "../../core/risk/backtests/shortfallZ";
import { Z2_CRITICAL_001, Z2_CRITICAL_5, Z2_CRITICAL_CONFIDENCE } from "../../core/risk/backtests/shortfallZ";
import type { ExceedanceResidualTest } from "../../core/risk/backtests/exceedanceResiduals";
import type { MultinomialTest } from "../../core/risk/backtests/multinomial";
import type { TailLikelihoodTest } from "../../core/risk/backtests/tailLikelihood";
import type { ShortfallTrafficLight } from "../../core/risk/backtests/shortfallLight";
import type { BacktestRow } from "./backtest";

export const ES_BACKTEST_LABELS: readonly string[] = [
  "Observations used",
  "Exceptions (loss beyond VaR)",
  "Expected exceptions",
  "Z1",
  "Z2",
  "Z2 critical value 5%",
  "Z2 critical value 0.01%",
  "Z2 verdict",
  "Z2 p-value (simulated)",
  "Exceedance residuals",
  "Mean exceedance residual",
  "Exceedance residual t-statistic",
  "Exceedance residual p-value",
];

export const ES_BACKTEST_PIT_LABELS: readonly string[] = [
  "Multinomial statistic",
  "Multinomial p-value (chi-square)",
  "Multinomial p-value (Nass)",
  "Tail LR (censored normal)",
  "Tail LR p-value",
  "ES failure rate Z",
  "ES failure rate P(<= Z)",
  "ES traffic-light zone",
];

/** Whether the fixed critical values apply (they belong to 97.5%). */
function criticalValuesApply(confidence: number): boolean {
  return Math.abs(confidence - Z2_CRITICAL_CONFIDENCE) < 1e-12;
}

export function z2Verdict(z: ShortfallZ): string {
  if (!criticalValuesApply(z.confidence)) return "no fixed critical value at this confidence: use the p-value";
  if (z.z2Reject001) return "rejected at 0.01%";
  if (z.z2Reject5) return "rejected at 5%";
  return "not rejected at 5%";
}

export interface EsBacktestParts {
  readonly z: ShortfallZ;
  readonly z2PValue: SimulatedPValue;
  readonly residuals: ExceedanceResidualTest;
  readonly pit?: {
    readonly multinomial: MultinomialTest;
    readonly tail: TailLikelihoodTest;
    readonly light: ShortfallTrafficLight;
  };
}

export function esBacktestRows(p: EsBacktestParts): BacktestRow[] {
  const applies = criticalValuesApply(p.z.confidence);
  const values: Array<number | string | boolean> = [
    p.z.observations,
    p.z.exceptions,
    p.z.observations * (1 - p.z.confidence),
    p.z.z1,
    p.z.z2,
    applies ? Z2_CRITICAL_5 : "",
    applies ? Z2_CRITICAL_001 : "",
    z2Verdict(p.z),
    p.z2PValue.pValue,
    p.residuals.count,
    p.residuals.mean,
    p.residuals.tStatistic,
    p.residuals.pValue,
  ];
  const rows = ES_BACKTEST_LABELS.map((label, i) => [label, values[i]] as const);
  if (!p.pit) return [...rows, ...ES_BACKTEST_PIT_LABELS.map((label) => [label, ""] as const)];
  const { multinomial, tail, light } = p.pit;
  const more: Array<number | string | boolean> = [
    multinomial.pearson,
    multinomial.pValue,
    multinomial.nassPValue,
    tail.informative ? tail.statistic : "",
    tail.informative ? tail.pValue : "",
    light.z,
    light.cumulativeProbability,
    light.zone,
  ];
  return [...rows, ...ES_BACKTEST_PIT_LABELS.map((label, i) => [label, more[i]] as const)];
}
