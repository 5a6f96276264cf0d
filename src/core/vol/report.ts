/**
 * The volatility model report: estimates with standard errors, persistence, half-life, unconditional and next-day
 * volatility, likelihood, AIC (Akaike 1974), BIC (Schwarz 1978), likelihood-ratio test of generalized-normal
 * against normal innovations (χ²(1); on the boundary k = 0 is interior, so the usual law applies), Ljung–Box on
 * the squared standardized residuals (10 lags) and the innovation law's edge in σ units.
 *
 * Standard errors (GARCH): observed information −H, H the Hessian of the log-likelihood in θ = (μ, ω, α, β[, k])
 * by central differences of the analytic gradient (step 1e-5 relative); robust ones by the sandwich
 * H⁻¹(Σ sₜsₜᵀ)H⁻¹ of Bollerslev & Wooldridge (1992), sₜ the analytic per-observation scores. None when the
 * solution is on a boundary (the usual asymptotics do not hold there) or −H is not positive definite.
 * EWMA: λ is fixed, the mean is 0; the shape's standard error is 1/√(−S″(k)) of the two-step likelihood.
 * "iid": the generalized normal fitted to the whole sample (src/core/fit), constant volatility.
 */
import { fitGno } from "../fit";
import { moments, type GnoParams } from "../gno";
import { chiSquare1Sf } from "../risk/backtests/chiSquare";
import { ljungBox, type LjungBox } from "./diagnostics";
import { DEFAULT_LAMBDA } from "./ewma";
import { garchFromVector, garchLikelihood, garchVector, type Innovations } from "./garch";
import { innovationEdge } from "./innovation";
import { inverseSpd, sandwich } from "./matrix";
import { fitVolatility, type VolEstimate, type VolModelKind } from "./model";
import { shapeLikelihood } from "./shapeFit";

export type VolReportModel = "iid" | VolModelKind;
export const VOL_MODELS: readonly VolReportModel[] = ["iid", "ewma", "garch"];
export const LJUNG_BOX_LAGS = 10;

export interface ReportedParameter {
  readonly name: string;
  readonly value: number;
  /** From the observed information; NaN when unavailable. */
  readonly standardError: number;
  /** Bollerslev–Wooldridge robust; NaN when unavailable or not applicable. */
  readonly robustError: number;
}

export interface VolReport {
  readonly model: VolReportModel;
  readonly innovations: Innovations;
  readonly n: number;
  readonly parameters: readonly ReportedParameter[];
  readonly persistence: number;
  /** Days for a volatility shock to halve: ln ½ / ln(persistence). */
  readonly halfLife: number;
  readonly unconditionalVolatility: number;
  readonly nextDayVolatility: number;
  readonly nextDay: GnoParams;
  readonly logLikelihood: number;
  readonly aic: number;
  readonly bic: number;
  /** 2(ℓ_gno − ℓ_normal) and its χ²(1) p-value; NaN for normal innovations. */
  readonly lrStatistic: number;
  readonly lrPValue: number;
  readonly ljungBox: LjungBox;
  /** Edge of the innovation law in σ units (null at k = 0). */
  readonly innovationEdge: number | null;
  readonly converged: boolean;
  readonly passes: number;
  readonly warnings: readonly string[];
  readonly estimate: VolEstimate | null;
}

/** Observed and robust covariance of a GARCH estimate in θ; null when −H is not positive definite. */
export function garchCovariance(
  r: ArrayLike<number>,
  theta: readonly number[],
  innovations: Innovations,
): { observed: Float64Array; robust: Float64Array } | null {
  const dim = theta.length;
  const H = new Float64Array(dim * dim);
  for (let j = 0; j < dim; j++) {
    const step = 1e-5 * Math.max(Math.abs(theta[j]), 1e-3);
    const up = theta.slice();
    const dn = theta.slice();
    up[j] += step;
    dn[j] -= step;
    const gu = garchLikelihood(r, garchFromVector(up, innovations), innovations).gradient;
    const gd = garchLikelihood(r, garchFromVector(dn, innovations), innovations).gradient;
    for (let i = 0; i < dim; i++) H[i * dim + j] = (gu[i] - gd[i]) / (2 * step);
  }
  const negH = new Float64Array(dim * dim);
  for (let i = 0; i < dim; i++) for (let j = 0; j < dim; j++) negH[i * dim + j] = -0.5 * (H[i * dim + j] + H[j * dim + i]);
  const observed = inverseSpd(negH, dim);
  if (!observed || observed.some((v) => !Number.isFinite(v))) return null;
  const pass = garchLikelihood(r, garchFromVector(theta, innovations), innovations, true);
  const B = new Float64Array(dim * dim);
  const s = pass.scores!;
  for (let t = 0; t < r.length; t++) {
    for (let a = 0; a < dim; a++) for (let b = 0; b < dim; b++) B[a * dim + b] += s[t * dim + a] * s[t * dim + b];
  }
  return { observed, robust: sandwich(observed, B, dim) };
}

const fmt = (x: number): string => String(Number(x.toPrecision(4)));

function iidReport(r: ArrayLike<number>, innovations: Innovations): VolReport {
  const n = r.length;
  let mean = 0;
  for (let i = 0; i < n; i++) mean += r[i];
  mean /= n;
  let v = 0;
  for (let i = 0; i < n; i++) v += (r[i] - mean) ** 2;
  v /= n;
  let params: GnoParams;
  let logLik: number;
  let seArr: readonly number[] | null = null;
  const warnings: string[] = [];
  let lr = NaN;
  let lrP = NaN;
  let converged = true;
  let passes = 0;
  if (innovations === "normal") {
    params = { location: mean, scale: Math.sqrt(v), shape: 0 };
    logLik = -0.5 * n * (Math.log(2 * Math.PI * v) + 1);
    seArr = [Math.sqrt(v / n), Math.sqrt(v / (2 * n)), NaN];
  } else {
    const fit = fitGno(r);
    params = fit.params;
    logLik = fit.logLikelihood;
    seArr = fit.standardErrors;
    lr = fit.lrStatistic;
    lrP = fit.lrPValue;
    converged = fit.converged && fit.regular;
    passes = fit.iterations;
    warnings.push(...fit.warnings);
  }
  const sd = moments(params).sd;
  const z2 = new Float64Array(n);
  for (let i = 0; i < n; i++) z2[i] = ((r[i] - mean) / sd) ** 2;
  const lb = ljungBox(z2, Math.min(LJUNG_BOX_LAGS, n - 2));
  if (lb.pValue < 0.05) warnings.push(`Ljung–Box on squared returns p = ${fmt(lb.pValue)}: volatility clusters; a filtered model ("ewma" or "garch") fits such data better.`);
  const names = ["location", "scale", "shape"];
  const vals = [params.location, params.scale, params.shape];
  const k = innovations === "normal" ? 2 : 3;
  return Object.freeze({
    model: "iid" as const, innovations, n,
    parameters: Object.freeze(names.slice(0, k).map((name, i) => Object.freeze({ name, value: vals[i], standardError: seArr ? seArr[i] : NaN, robustError: NaN }))),
    persistence: 0, halfLife: 0, unconditionalVolatility: sd, nextDayVolatility: sd, nextDay: params,
    logLikelihood: logLik, aic: 2 * k - 2 * logLik, bic: k * Math.log(n) - 2 * logLik, lrStatistic: lr, lrPValue: lrP,
    ljungBox: lb, innovationEdge: null, converged, passes, warnings: Object.freeze(warnings), estimate: null,
  });
}

/** Fits the model to the whole sample and builds the report. */
export function volReport(r: ArrayLike<number>, model: VolReportModel, innovations: Innovations, lambda = DEFAULT_LAMBDA): VolReport {
  if (model === "iid") return iidReport(r, innovations);
  const n = r.length;
  const est = fitVolatility(r, model, { innovations, lambda });
  const warnings: string[] = [];
  const params: ReportedParameter[] = [];
  let persistence: number;
  let unconditional: number;
  let nParams: number;
  if (model === "garch") {
    const g = est.garch!;
    const theta = garchVector(g.params, innovations);
    const names = innovations === "normal" ? ["mu", "omega", "alpha", "beta"] : ["mu", "omega", "alpha", "beta", "shape"];
    const cov = g.boundary ? null : garchCovariance(r, theta, innovations);
    if (g.boundary) warnings.push(`Boundary solution: ${g.boundary}. Standard errors are not reported there.`);
    else if (!cov) warnings.push("The observed information is not positive definite: no standard errors.");
    const d = theta.length;
    theta.forEach((value, i) =>
      params.push({
        name: names[i],
        value,
        standardError: cov ? Math.sqrt(cov.observed[i * d + i]) : NaN,
        robustError: cov ? Math.sqrt(cov.robust[i * d + i]) : NaN,
      }),
    );
    persistence = g.params.alpha + g.params.beta;
    unconditional = persistence < 1 ? Math.sqrt(g.params.omega / (1 - persistence)) : NaN;
    nParams = d;
  } else {
    params.push({ name: "lambda", value: est.lambda!, standardError: NaN, robustError: NaN });
    if (innovations === "gno") {
      const k = est.shape;
      const h = 1e-5;
      const curv = (shapeLikelihood(est.residuals, k + h).slope - shapeLikelihood(est.residuals, k - h).slope) / (2 * h);
      params.push({ name: "shape", value: k, standardError: curv < 0 ? 1 / Math.sqrt(-curv) : NaN, robustError: NaN });
    }
    persistence = est.lambda!;
    unconditional = NaN;
    nParams = innovations === "gno" ? 1 : 0;
  }
  if (!est.converged) warnings.push(`The fit did not converge: ${est.reason}.`);
  if (est.boundary && model === "ewma") warnings.push(`Boundary solution: ${est.boundary}.`);
  let lr = NaN;
  let lrP = NaN;
  if (innovations === "gno") {
    const normal = fitVolatility(r, model, { innovations: "normal", lambda });
    lr = Math.max(0, 2 * (est.logLikelihood - normal.logLikelihood));
    lrP = chiSquare1Sf(lr);
  }
  const z2 = est.residuals.map((z) => z * z);
  const lb = ljungBox(z2, Math.min(LJUNG_BOX_LAGS, n - 2));
  if (lb.pValue < 0.05) warnings.push(`Ljung–Box on squared standardized residuals p = ${fmt(lb.pValue)}: clustering remains after filtering.`);
  const edge = innovationEdge(est.shape);
  if (edge !== null) {
    let extreme = edge > 0 ? -Infinity : Infinity;
    for (const z of est.residuals) extreme = edge > 0 ? Math.max(extreme, z) : Math.min(extreme, z);
    if (Math.abs(edge - extreme) < 0.05) warnings.push(`The innovation law's edge (${fmt(edge)} σ) lies within 0.05 σ of the most extreme standardized residual (${fmt(extreme)}): a degenerate fit; try normal innovations.`);
  }
  const halfLife = persistence > 0 && persistence < 1 ? Math.log(0.5) / Math.log(persistence) : NaN;
  return Object.freeze({
    model, innovations, n, parameters: Object.freeze(params.map((p) => Object.freeze(p))), persistence, halfLife,
    unconditionalVolatility: unconditional, nextDayVolatility: est.nextSigma, nextDay: est.nextDay,
    logLikelihood: est.logLikelihood, aic: 2 * nParams - 2 * est.logLikelihood, bic: nParams * Math.log(n) - 2 * est.logLikelihood,
    lrStatistic: lr, lrPValue: lrP, ljungBox: lb, innovationEdge: edge, converged: est.converged, passes: est.passes,
    warnings: Object.freeze(warnings), estimate: est,
  });
}
