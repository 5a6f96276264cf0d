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
import { shortfallZ, z2PValueMatchedTails } from "../../core/risk/backtests/shortfallZ";
import { exceedanceResiduals, exceedanceResidualTest } from "../../core/risk/backtests/exceedanceResiduals";
import { multinomialTest } from "../../core/risk/backtests/multinomial";
import { tailLikelihoodTest } from "../../core/risk/backtests/tailLikelihood";
import { shortfallTrafficLight } from "../../core/risk/backtests/shortfallLight";
import type { Work } from "../../core/work";
import { fail } from "../cells";

/** Fewest complete rows ESBACKTEST accepts (DEVELOPERS.md: fewer than 10 usable numbers is an error). */
export const MIN_ES_ROWS = 10;
/** Replicates of the simulated Z2 p-value and of the residual bootstrap (fixed, seeded: reproducible). */
export const ES_REPLICATES = 999;
const Z2_SEED = 20_141;
const BOOTSTRAP_SEED = 2_000;

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

/**
 * The ES backtest as a Work: the very computation ASKEW.ESBACKTEST runs (same seeds, same replicates), here so the
 * pane can run it too without importing a cell-function file. Throws CellError (fail) when fewer than MIN_ES_ROWS
 * complete rows remain or the PIT column holds no number.
 */
export function* esBacktestWork(
  r: Float64Array,
  v: Float64Array,
  e: Float64Array,
  c: number,
  side: "long" | "short",
  pit: Float64Array | null,
): Work<EsBacktestParts> {
  const z = shortfallZ(r, v, e, c, side);
  if (z === null) return fail("No row has a return, a VaR and an ES: nothing to backtest.");
  if (z.observations < MIN_ES_ROWS) return fail(`Only ${z.observations} rows have a return, a VaR and an ES: at least ${MIN_ES_ROWS} are needed.`);
  const keptVar: number[] = [];
  const keptEs: number[] = [];
  for (let i = 0; i < r.length; i++) {
    if (Number.isNaN(r[i]) || Number.isNaN(v[i]) || Number.isNaN(e[i])) continue;
    keptVar.push(v[i]);
    keptEs.push(e[i]);
  }
  const z2PValue = yield* z2PValueMatchedTails(z.z2, keptVar, keptEs, c, ES_REPLICATES, Z2_SEED);
  const res = exceedanceResiduals(r, v, e, side);
  const residuals = yield* exceedanceResidualTest(res.residuals, ES_REPLICATES, BOOTSTRAP_SEED);
  if (!pit) return { z, z2PValue, residuals };
  const multinomial = multinomialTest(pit, c, side);
  const tail = tailLikelihoodTest(pit, c, side);
  const light = shortfallTrafficLight(pit, c, side);
  if (!multinomial || !tail || !light) return fail("pit has no number: give the PIT column or leave the argument out.");
  return { z, z2PValue, residuals, pit: { multinomial, tail, light } };
}
