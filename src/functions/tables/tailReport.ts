/**
 * TAILREPORT rows: a pure function from the core spliced fit to (label, value) rows, shared by the cell
 * function and the task pane.
 *
 * Fixed row order (37 rows, labels in TAIL_REPORT_LABELS): observations, tail method, tail share, sides, body
 * fit ("censored mle", "full-data mle", "lmom" or "given"), body location, body scale, body shape; then for the loss tail and then the gain tail: threshold,
 * exceedances, share of data beyond, tail mass (body), ξ, ξ std. error, β, β std. error, mean excess (data),
 * mean excess (fitted), log-likelihood, converged, finite variance, finite mean (ES exists); then warnings.
 * Rows of a side without a tail are blank (null); the mean excess of the data beside the fitted β/(1 − ξ) is a
 * quick check of the threshold (they should be close when the tail fits).
 */
import type { SplicedFit, TailFitSide } from "../../core/pareto";
import type { ReportRow } from "./fitReport";

const SIDE_ROWS = [
  "threshold",
  "exceedances",
  "share of data beyond",
  "tail mass (body)",
  "ξ",
  "ξ std. error",
  "β",
  "β std. error",
  "mean excess (data)",
  "mean excess (fitted)",
  "log-likelihood",
  "converged",
  "finite variance",
  "finite mean (ES exists)",
] as const;

export const TAIL_REPORT_LABELS: readonly string[] = [
  "observations",
  "tail method",
  "tail share",
  "sides",
  "body fit",
  "body location",
  "body scale",
  "body shape",
  ...SIDE_ROWS.map((r) => `loss tail ${r}`),
  ...SIDE_ROWS.map((r) => `gain tail ${r}`),
  "warnings",
];

function sideValues(s: TailFitSide | null): ReportRow[1][] {
  if (!s) return SIDE_ROWS.map(() => null);
  const se = s.fit.standardErrors;
  return [
    s.threshold,
    s.exceedances,
    s.empiricalShare,
    s.tailMass,
    s.fit.params.shape,
    se ? se[0] : null,
    s.fit.params.scale,
    se ? se[1] : null,
    s.sampleMeanExcess,
    Number.isFinite(s.fittedMeanExcess) ? s.fittedMeanExcess : null,
    s.fit.method === "mle" ? s.fit.logLikelihood : null,
    s.fit.converged,
    !s.fit.infiniteVariance,
    !s.fit.infiniteMean,
  ];
}

/** The report rows for a spliced fit; `sides` as the user chose it. */
export function tailReportRows(fit: SplicedFit, sides: string): ReportRow[] {
  const values: ReportRow[1][] = [
    fit.n,
    fit.method,
    fit.tailShare,
    sides,
    fit.bodyMethod,
    fit.params.body.location,
    fit.params.body.scale,
    fit.params.body.shape,
    ...sideValues(fit.lower),
    ...sideValues(fit.upper),
    fit.warnings.length > 0 ? fit.warnings.join(" ") : "none",
  ];
  return TAIL_REPORT_LABELS.map((label, i) => [label, values[i]] as const);
}
