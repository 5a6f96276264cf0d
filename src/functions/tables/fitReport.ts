/**
 * FITREPORT rows: a pure function from the core fit object to (label, value) rows, shared by the cell
 * function and the task pane.
 *
 * Fixed row order (32 rows, labels in ROW_LABELS): observations, method, location, scale, shape,
 * location/scale/shape std. error, location 95% low/high, scale 95% low/high, shape 95% low/high,
 * log-likelihood, AIC, BIC, iterations, converged, regular maximum, gradient norm, LR statistic vs normal,
 * LR p-value vs normal, support edge, edge side, edge distance (sample sd), chance beyond the extreme
 * observation, sample skewness, fitted skewness, sample excess kurtosis, fitted excess kurtosis, warnings.
 * Rows that do not apply (no edge, no standard errors, L-moment fits without a likelihood test) hold null,
 * which the cell layer shows as "".
 */
import type { GnoFit } from "../../core/fit";

export type ReportValue = number | string | boolean | null;
export type ReportRow = readonly [string, ReportValue];

/** The labels of the report, in order. */
export const ROW_LABELS = [
  "observations",
  "method",
  "location",
  "scale",
  "shape",
  "location std. error",
  "scale std. error",
  "shape std. error",
  "location 95% low",
  "location 95% high",
  "scale 95% low",
  "scale 95% high",
  "shape 95% low",
  "shape 95% high",
  "log-likelihood",
  "AIC",
  "BIC",
  "iterations",
  "converged",
  "regular maximum",
  "gradient norm",
  "LR statistic vs normal",
  "LR p-value vs normal",
  "support edge",
  "edge side",
  "edge distance (sample sd)",
  "chance beyond the extreme observation",
  "sample skewness",
  "fitted skewness",
  "sample excess kurtosis",
  "fitted excess kurtosis",
  "warnings",
] as const;

const num = (x: number | undefined): number | null => (x !== undefined && Number.isFinite(x) ? x : null);

/** The report rows of a fit, in ROW_LABELS order. */
export function fitReportRows(fit: GnoFit): ReportRow[] {
  const se = fit.standardErrors;
  const ci = fit.intervals;
  const e = fit.edge;
  const values: ReportValue[] = [
    fit.n,
    fit.method === "mle" ? "maximum likelihood" : "L-moments",
    fit.params.location,
    fit.params.scale,
    fit.params.shape,
    num(se?.[0]),
    num(se?.[1]),
    num(se?.[2]),
    num(ci?.location[0]),
    num(ci?.location[1]),
    num(ci?.scale[0]),
    num(ci?.scale[1]),
    num(ci?.shape[0]),
    num(ci?.shape[1]),
    num(fit.logLikelihood),
    num(fit.aic),
    num(fit.bic),
    fit.iterations,
    fit.converged,
    fit.regular,
    num(fit.gradientNorm),
    num(fit.lrStatistic),
    num(fit.lrPValue),
    e ? e.value : null,
    e ? e.side : null,
    e ? num(e.distance) : null,
    e ? num(e.exceedance) : null,
    num(fit.sample.skewness),
    num(fit.fitted.skewness),
    num(fit.sample.excessKurtosis),
    num(fit.fitted.excessKurtosis),
    fit.warnings.length > 0 ? fit.warnings.join(" ") : "none",
  ];
  return ROW_LABELS.map((label, i) => [label, values[i]] as const);
}
