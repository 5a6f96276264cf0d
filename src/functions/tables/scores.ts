/**
 * Label/value rows of forecast scores (ASKEW.SCORE) and of the Diebold–Mariano comparison of two forecast
 * columns (ASKEW.DMTEST), built from the core result objects so cells and pane show the very same rows.
 *
 * SCORE row order (fixed):  1 Observations scored   2 Mean tick loss   3 Mean FZ0 loss
 * DMTEST row order (fixed):
 *  1 Observations compared              8 Lower FZ0 loss at 5% ("A", "B" or "neither")
 *  2 Newey–West lag                     9 Mean tick loss A
 *  3 Mean FZ0 loss A                   10 Mean tick loss B
 *  4 Mean FZ0 loss B                   11 DM statistic (tick)
 *  5 DM statistic (FZ0)                12 p-value (tick, normal)
 *  6 p-value (FZ0, normal)             13 p-value (tick, small-sample t)
 *  7 p-value (FZ0, small-sample t)     14 Lower tick loss at 5%
 * The verdict rows use the small-sample (Harvey–Leybourne–Newbold) p-value, the more cautious of the two.
 */
import type { DieboldMarianoTest, ForecastScores } from "../../core/scores";

export type ScoreRow = readonly [string, number | string];

export const SCORE_LABELS: readonly string[] = ["Observations scored", "Mean tick loss", "Mean FZ0 loss"];

export function scoreRows(s: ForecastScores): ScoreRow[] {
  const values = [s.observations, s.meanTickLoss, s.meanFz0Loss];
  return SCORE_LABELS.map((label, i) => [label, values[i]] as const);
}

/** Significance level of the verdict rows. */
export const VERDICT_LEVEL = 0.05;

export const DM_LABELS: readonly string[] = [
  "Observations compared",
  "Newey–West lag",
  "Mean FZ0 loss A",
  "Mean FZ0 loss B",
  "DM statistic (FZ0)",
  "p-value (FZ0, normal)",
  "p-value (FZ0, small-sample t)",
  "Lower FZ0 loss at 5%",
  "Mean tick loss A",
  "Mean tick loss B",
  "DM statistic (tick)",
  "p-value (tick, normal)",
  "p-value (tick, small-sample t)",
  "Lower tick loss at 5%",
];

/** "A" or "B" when the small-sample p-value is below 5% (the sign says which has the lower mean loss), else "neither". */
export function verdict(t: DieboldMarianoTest): string {
  if (!(t.smallSamplePValue < VERDICT_LEVEL)) return Number.isFinite(t.statistic) ? "neither" : "no test (no variation)";
  return t.meanDifference < 0 ? "A" : "B";
}

export function dieboldMarianoRows(fz0: DieboldMarianoTest, tick: DieboldMarianoTest): ScoreRow[] {
  const values = [
    fz0.observations,
    fz0.lag,
    fz0.meanLossA,
    fz0.meanLossB,
    fz0.statistic,
    fz0.pValue,
    fz0.smallSamplePValue,
    verdict(fz0),
    tick.meanLossA,
    tick.meanLossB,
    tick.statistic,
    tick.pValue,
    tick.smallSamplePValue,
    verdict(tick),
  ];
  return DM_LABELS.map((label, i) => [label, values[i]] as const);
}
