/**
 * VOLFIT rows: a pure function from the core volatility report to (label, value) rows, shared by the cell
 * function and the pane. Fixed row order (labels in VOL_ROW_LABELS); rows that do not apply to the model are null
 * (shown as ""): "iid" fills location/scale/shape, "ewma" lambda and shape, "garch" mu, omega, alpha, beta, shape.
 */
import type { VolReport } from "../../core/vol";
import type { ReportRow, ReportValue } from "./fitReport";

export const VOL_ROW_LABELS = [
  "model",
  "innovations",
  "observations",
  "location",
  "location std. error",
  "scale",
  "scale std. error",
  "mu",
  "mu std. error",
  "mu robust std. error",
  "omega",
  "omega std. error",
  "omega robust std. error",
  "alpha",
  "alpha std. error",
  "alpha robust std. error",
  "beta",
  "beta std. error",
  "beta robust std. error",
  "lambda",
  "shape",
  "shape std. error",
  "shape robust std. error",
  "persistence",
  "half-life (days)",
  "unconditional volatility",
  "next-day volatility",
  "next-day location",
  "next-day scale",
  "next-day shape",
  "log-likelihood",
  "AIC",
  "BIC",
  "LR statistic vs normal innovations",
  "LR p-value",
  "Ljung-Box Q, squared residuals (10 lags)",
  "Ljung-Box p-value",
  "innovation edge (sigma units)",
  "converged",
  "likelihood passes",
  "warnings",
] as const;

const fin = (x: number): ReportValue => (Number.isFinite(x) ? x : null);

export function volReportRows(r: VolReport): ReportRow[] {
  const v = new Map<string, ReportValue>();
  v.set("model", r.model);
  v.set("innovations", r.innovations === "gno" ? "generalized normal" : "normal");
  v.set("observations", r.n);
  for (const p of r.parameters) {
    v.set(p.name, fin(p.value));
    if (p.name !== "lambda") v.set(`${p.name} std. error`, fin(p.standardError));
    if (r.model === "garch") v.set(`${p.name} robust std. error`, fin(p.robustError));
  }
  if (r.model !== "iid") {
    v.set("persistence", fin(r.persistence));
    v.set("half-life (days)", fin(r.halfLife));
  }
  v.set("unconditional volatility", fin(r.unconditionalVolatility));
  v.set("next-day volatility", fin(r.nextDayVolatility));
  v.set("next-day location", r.nextDay.location);
  v.set("next-day scale", r.nextDay.scale);
  v.set("next-day shape", r.nextDay.shape);
  v.set("log-likelihood", fin(r.logLikelihood));
  v.set("AIC", fin(r.aic));
  v.set("BIC", fin(r.bic));
  v.set("LR statistic vs normal innovations", fin(r.lrStatistic));
  v.set("LR p-value", fin(r.lrPValue));
  v.set("Ljung-Box Q, squared residuals (10 lags)", fin(r.ljungBox.statistic));
  v.set("Ljung-Box p-value", fin(r.ljungBox.pValue));
  v.set("innovation edge (sigma units)", r.innovationEdge === null ? null : fin(r.innovationEdge));
  v.set("converged", r.converged);
  v.set("likelihood passes", r.passes);
  v.set("warnings", r.warnings.length ? r.warnings.join(" ") : "none");
  return VOL_ROW_LABELS.map((label) => [label, v.has(label) ? v.get(label)! : null] as const);
}
