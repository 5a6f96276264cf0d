/**
 * Fitting the generalized normal law: maximum likelihood (default) or the method of L-moments, with
 * the full report (standard errors, intervals, likelihood-ratio test against the normal, AIC/BIC,
 * sample vs fitted moments, support-edge diagnostics).
 *
 * Inference: the covariance is the inverse observed information (−H)⁻¹ at the maximum, computed in
 * (ξ, ln α, k) and mapped to (ξ, α, k) by the delta method (J = diag(1, α, 1)). 95% intervals are Wald
 * intervals, ξ ± z·se and k ± z·se, and exp(ln α ± z·se(ln α)) for the scale so it stays positive
 * (z = Φ⁻¹(0.975)). The likelihood-ratio test of shape = 0 compares with the normal fit, whose maximum
 * likelihood estimate is closed form (mean, divisor-n variance); LR ~ χ²(1) under the null, with
 * survival P(χ²₁ > x) = erfc(√(x/2)) (risk/chiSquare). AIC = 6 − 2ℓ (Akaike 1974), BIC = 3 ln n − 2ℓ (Schwarz 1978).
 * Standard errors, intervals and the LR test are reported for maximum likelihood only (an L-moment
 * fit gets none: its covariance is a different, unimplemented asymptotic formula).
 *
 * Memory: the fit reads the caller's array in place; the only copy of the data is the sorted one used
 * for the sample L-moments (one Float64Array of n), so a cell fit copies the data at most twice
 * (the adapter's read plus this sort). fitGnoQuick with a warm start makes no copy at all.
 */
import { edge, moments, cdf, sf, isValidParams } from "../gno";
import type { GnoParams } from "../gno";
import { normalQuantile } from "../normal";
import { chiSquare1Sf } from "../risk/backtests/chiSquare";
import { logLikelihood } from "./likelihood";
import { choleskySolve, insideSupport } from "./newton";
import { findMaximum, SHAPE_CAP } from "./maximise";
import { sampleMoments, sampleLMoments, type SampleMoments, type SampleLMoments } from "./sampleStats";
import { estimateFromLMoments } from "./lmomentEstimator";

export type FitMethod = "mle" | "lmom";

export interface FitOptions {
  readonly method?: FitMethod;
  /** Warm start for maximum likelihood (ignored when infeasible). */
  readonly start?: GnoParams;
  /**
   * fitGnoQuick with a warm start only: accept one unverified Newton step when the predicted gain at the start
   * is below this many log-likelihood units (see newton.ts, oneStepBelow). Off unless given.
   */
  readonly oneStepGain?: number;
}

export interface MomentSummary {
  readonly mean: number;
  readonly sd: number;
  readonly skewness: number;
  readonly excessKurtosis: number;
}

export interface EdgeDiagnostics {
  readonly value: number;
  readonly side: "upper" | "lower";
  /** The most extreme observation on the edge's side. */
  readonly extreme: number;
  /** |edge − extreme| in units of the sample sd. */
  readonly distance: number;
  /** Fitted probability of a value beyond that extreme (toward the edge). */
  readonly exceedance: number;
}

export interface ParameterIntervals {
  readonly level: number;
  readonly location: readonly [number, number];
  readonly scale: readonly [number, number];
  readonly shape: readonly [number, number];
}

export interface GnoFit {
  readonly method: FitMethod;
  readonly n: number;
  readonly params: GnoParams;
  readonly logLikelihood: number;
  /** 3×3 covariance in the order (location, scale, shape); null when unavailable. */
  readonly covariance: readonly (readonly number[])[] | null;
  readonly standardErrors: readonly [number, number, number] | null;
  readonly converged: boolean;
  /** The estimate is an interior, regular maximum (or, for L-moments, all data lie inside its support). */
  readonly regular: boolean;
  readonly iterations: number;
  /** Largest component of the score in (location/scale, ln scale, shape) units at the estimate. */
  readonly gradientNorm: number;
  readonly reason: string;
  readonly warnings: readonly string[];
  readonly intervals: ParameterIntervals | null;
  readonly normalLogLikelihood: number;
  /** 2(ℓ − ℓ_normal); NaN for L-moment fits. */
  readonly lrStatistic: number;
  readonly lrPValue: number;
  readonly aic: number;
  readonly bic: number;
  readonly sample: MomentSummary;
  readonly fitted: MomentSummary;
  readonly sampleLMoments: SampleLMoments;
  readonly edge: EdgeDiagnostics | null;
}

export interface QuickFit {
  readonly params: GnoParams;
  readonly logLikelihood: number;
  readonly converged: boolean;
  readonly iterations: number;
}

const fmt = (x: number): string => (Number.isFinite(x) ? String(Number(x.toPrecision(4))) : String(x));

interface Core {
  readonly params: GnoParams;
  readonly converged: boolean;
  readonly regular: boolean;
  readonly iterations: number;
  readonly gradientNorm: number;
  readonly reason: string;
  readonly hessian: Float64Array | null;
  readonly warnings: string[];
}

function lmomentStart(data: ArrayLike<number>, s: SampleMoments): { params: GnoParams; lm: SampleLMoments; truncated: boolean } {
  const lm = sampleLMoments(data);
  const est = estimateFromLMoments(lm);
  if (est) return { params: est.params, lm, truncated: est.truncated };
  return { params: { location: s.mean, scale: Math.sqrt(s.varianceMle), shape: 0 }, lm, truncated: false };
}

function maximumLikelihood(data: ArrayLike<number>, s: SampleMoments, start: GnoParams, fallback: GnoParams): Core {
  const search = findMaximum(data, s, start);
  const r = search.result;
  const warnings: string[] = [];
  if (!search.regular) {
    warnings.push(
      `Irregular fit: ${search.reason}. The L-moment estimate is shown instead of the runaway maximum; treat it with care.`,
    );
    return { params: fallback, converged: false, regular: false, iterations: search.iterations, gradientNorm: NaN, reason: search.reason, hessian: null, warnings };
  }
  let gradientNorm = 0;
  for (const g of r.scaledGradient) gradientNorm = Math.max(gradientNorm, Math.abs(g));
  return {
    params: { location: r.location, scale: r.scale, shape: r.shape },
    converged: r.converged,
    regular: true,
    iterations: search.iterations,
    gradientNorm,
    reason: search.usedProfile ? search.reason : "converged",
    hessian: r.hessian,
    warnings,
  };
}

/** Inverse of −H in (ξ, ln α, k) mapped to (ξ, α, k); null when −H is not positive definite. */
function covarianceFrom(hessian: Float64Array, scale: number): number[][] | null {
  const A = hessian.map((h) => -h);
  const inv: number[][] = [[], [], []];
  for (let j = 0; j < 3; j++) {
    const e = new Float64Array(3);
    e[j] = 1;
    const col = choleskySolve(A, e, 3);
    if (!col) return null;
    for (let i = 0; i < 3; i++) inv[i][j] = col[i];
  }
  const J = [1, scale, 1];
  return inv.map((row, i) => row.map((v, j) => v * J[i] * J[j]));
}

function edgeDiagnostics(p: GnoParams, s: SampleMoments): EdgeDiagnostics | null {
  const e = edge(p);
  if (!e) return null;
  const extreme = e.side === "upper" ? s.max : s.min;
  const distance = Math.abs(e.value - extreme) / s.sd;
  const exceedance = e.side === "upper" ? sf(extreme, p) : cdf(extreme, p);
  return { value: e.value, side: e.side, extreme, distance, exceedance };
}

function edgeWarnings(d: EdgeDiagnostics | null): string[] {
  if (!d) return [];
  const out: string[] = [];
  if (d.side === "upper") {
    out.push(`Upper edge at ${fmt(d.value)}: the fit rules out returns above it, so a short position's VaR and ES cannot exceed a loss of ${fmt(d.value)}.`);
  } else {
    out.push(`Lower edge at ${fmt(d.value)}: the fit rules out returns below it, so a long position's VaR and ES cannot exceed a loss of ${fmt(-d.value)}.`);
  }
  if (d.distance < 1) {
    out.push(`The edge lies only ${fmt(d.distance)} sample sd beyond the most extreme observation (${fmt(d.extreme)}); a new observation beyond ${fmt(d.value)} would be impossible under this fit.`);
  }
  return out;
}

/** Throws a RangeError saying why a sample cannot be fitted (too few numbers, or a spread that is 0 or not representable). */
function checkFittable(n: number, s: SampleMoments): void {
  if (n < 4) throw new RangeError(`a fit needs at least 4 numbers (got ${n})`);
  if (!Number.isFinite(s.mean) || !Number.isFinite(s.sd)) {
    throw new RangeError("the numbers are too large to compute their spread in double precision; rescale them (e.g. returns as decimals)");
  }
  if (!(s.sd > 0)) {
    throw new RangeError("the numbers' spread is zero or too small to compute in double precision; rescale them (e.g. returns in percent)");
  }
}

/** Fits the law to the data (n ≥ 4 finite numbers, not all equal) and builds the full report. */
export function fitGno(data: ArrayLike<number>, options: FitOptions = {}): GnoFit {
  const method: FitMethod = options.method ?? "mle";
  const n = data.length;
  const s = sampleMoments(data);
  checkFittable(n, s);
  const lmStart = lmomentStart(data, s);
  const warnings: string[] = [];
  if (lmStart.truncated) warnings.push(`Sample L-skewness ${fmt(lmStart.lm.t3)} is beyond ±0.95; the L-moment estimate uses ±0.95.`);
  let core: Core;
  if (method === "lmom") {
    const p = lmStart.params;
    const inside = insideSupport(p.location, p.scale, p.shape, s.min, s.max);
    core = {
      params: p, converged: true, regular: inside, iterations: 0, gradientNorm: NaN, hessian: null, warnings: [],
      reason: inside ? "closed form" : "some observations lie outside the support of the L-moment fit",
    };
    if (!inside) core.warnings.push("Some observations lie outside the support of the L-moment fit: its log-likelihood is −∞. Use maximum likelihood.");
  } else {
    const start = options.start && isValidParams(options.start) ? options.start : lmStart.params;
    core = maximumLikelihood(data, s, start, lmStart.params);
  }
  warnings.push(...core.warnings);
  const p = core.params;
  const ll = logLikelihood(data, p);
  const normalLL = -0.5 * n * (Math.log(2 * Math.PI * s.varianceMle) + 1);
  let covariance: number[][] | null = null;
  let se: [number, number, number] | null = null;
  let intervals: ParameterIntervals | null = null;
  let lr = NaN;
  let lrP = NaN;
  if (method === "mle" && core.regular && core.hessian) {
    covariance = covarianceFrom(core.hessian, p.scale);
    if (covariance) {
      const c = covariance;
      se = [Math.sqrt(c[0][0]), Math.sqrt(c[1][1]), Math.sqrt(c[2][2])];
      const z = normalQuantile(0.975);
      const seLog = se[1] / p.scale;
      intervals = {
        level: 0.95,
        location: [p.location - z * se[0], p.location + z * se[0]],
        scale: [p.scale * Math.exp(-z * seLog), p.scale * Math.exp(z * seLog)],
        shape: [p.shape - z * se[2], p.shape + z * se[2]],
      };
    } else warnings.push("The observed information is not positive definite: no standard errors.");
    lr = Math.max(0, 2 * (ll - normalLL));
    lrP = chiSquare1Sf(lr);
  }
  if (method === "mle" && Math.abs(p.shape) >= SHAPE_CAP - 1e-6) warnings.push(`The shape sits at the cap |k| = ${SHAPE_CAP}.`);
  const fm = moments(p);
  const ed = edgeDiagnostics(p, s);
  warnings.push(...edgeWarnings(ed));
  return Object.freeze({
    method,
    n,
    params: Object.freeze({ ...p }),
    logLikelihood: ll,
    covariance: covariance ? Object.freeze(covariance.map((r) => Object.freeze(r))) : null,
    standardErrors: se ? (Object.freeze(se) as readonly [number, number, number]) : null,
    converged: core.converged,
    regular: core.regular,
    iterations: core.iterations,
    gradientNorm: core.gradientNorm,
    reason: core.reason,
    warnings: Object.freeze(warnings),
    intervals: intervals ? Object.freeze(intervals) : null,
    normalLogLikelihood: normalLL,
    lrStatistic: lr,
    lrPValue: lrP,
    aic: 6 - 2 * ll,
    bic: 3 * Math.log(n) - 2 * ll,
    sample: Object.freeze({ mean: s.mean, sd: s.sd, skewness: s.skewness, excessKurtosis: s.excessKurtosis }),
    fitted: Object.freeze({ mean: fm.mean, sd: fm.sd, skewness: fm.skewness, excessKurtosis: fm.excessKurtosis }),
    sampleLMoments: Object.freeze({ ...lmStart.lm }),
    edge: ed ? Object.freeze(ed) : null,
  });
}

/**
 * Lean maximum-likelihood path for rolling windows and bootstrap replicates: no report, and no copy of
 * the data when a feasible warm start is given. Falls back to the full strategy (L-moment start, profile)
 * when the warm start does not lead to a regular maximum; `converged` is false for an irregular fit,
 * whose params are then the L-moment estimate.
 */
export function fitGnoQuick(data: ArrayLike<number>, options: FitOptions = {}): QuickFit {
  const s = sampleMoments(data);
  checkFittable(data.length, s);
  if (options.method === "lmom") {
    const p = lmomentStart(data, s).params;
    return { params: p, logLikelihood: logLikelihood(data, p), converged: true, iterations: 0 };
  }
  const st = options.start;
  if (st && isValidParams(st) && insideSupport(st.location, st.scale, st.shape, s.min, s.max)) {
    const search = findMaximum(data, s, st, options.oneStepGain);
    if (search.regular) {
      const r = search.result;
      return { params: { location: r.location, scale: r.scale, shape: r.shape }, logLikelihood: r.value, converged: true, iterations: search.iterations };
    }
  }
  const lm = lmomentStart(data, s).params;
  const core = maximumLikelihood(data, s, lm, lm);
  return { params: core.params, logLikelihood: logLikelihood(data, core.params), converged: core.regular && core.converged, iterations: core.iterations };
}
