/**
 * The method-comparison table (pane backtest view; src/core/risk/comparison): a header row, then one row per model,
 * best first by mean FZ0 loss. Every number is computed on the rows where all models forecast.
 *
 * Columns (fixed): Method · Forecast rows · Rows without a forecast · Exceptions · Expected exceptions ·
 * Kupiec p-value · Conditional coverage p-value · Zone · Mean tick loss · Mean FZ0 loss · DM p-value against the best.
 */
import type { MethodComparison } from "../../core/risk/comparison/methodComparison";

export const COMPARISON_HEADER: readonly string[] = [
  "Method",
  "Forecast rows",
  "Rows without a forecast",
  "Exceptions",
  "Expected exceptions",
  "Kupiec p-value",
  "Conditional coverage p-value",
  "Zone",
  "Mean tick loss",
  "Mean FZ0 loss",
  "DM p-value against the best",
];

const MODEL_NAMES: Readonly<Record<string, string>> = {
  iid: "Generalized normal, window fit",
  ewma: "Generalized normal, EWMA",
  garch: "Generalized normal, GARCH(1,1)",
  hs: "Historical simulation",
  normal: "Normal",
  cf: "Cornish–Fisher",
  fhs: "Filtered historical simulation",
};

/** The model's display name (the registry name when it has none). */
export function methodName(model: string): string {
  return MODEL_NAMES[model] ?? model;
}

const cell = (x: number | undefined): number | string => (x === undefined || !Number.isFinite(x) ? "" : x);

/** Header plus one row per model; "" where a value does not apply (e.g. the best model's DM p-value). */
export function methodComparisonRows(c: MethodComparison): Array<Array<number | string>> {
  const rows: Array<Array<number | string>> = [COMPARISON_HEADER.slice()];
  for (const m of c.methods) {
    const bt = m.backtest;
    rows.push([
      methodName(m.model),
      m.forecastRows,
      m.declinedRows,
      bt ? bt.exceptions : "",
      cell(bt?.expectedExceptions),
      cell(bt?.kupiec.pValue),
      cell(bt?.conditionalCoverage.pValue),
      bt ? bt.zone : "",
      cell(m.meanTickLoss),
      cell(m.meanFz0Loss),
      cell(m.pValueAgainstBest),
    ]);
  }
  return rows;
}
