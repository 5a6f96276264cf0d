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
 * Start of maximum likelihood: Hosking's L-moment estimate. From LARGE_SAMPLE = 20,000 points on, the start comes
 * from the L-moments of an evenly strided subsample of START_SUBSAMPLE = 8,192 points (sorting 8,192 numbers instead
 * of n): Newton refines it to the same maximum on the whole data, and a start whose support leaves an observation
 * out (or whose L-skewness is near Hosking's ±0.95 limit) falls back to the full-sample estimate. The report's
 * sample L-moments are then computed on first read (sorting one copy) and the fit keeps a reference to the data
 * until that read.
 *
 * Memory: the fit reads the caller's array in place; the only copy of the data is the sorted one used
 * for the full-sample L-moments (one Float64Array of n), so a cell fit copies the data at most twice
 * (the adapter's read plus this sort). fitGnoQuick with a warm start makes no copy at all.
 */
import { edge, moments, cdf, sf, isValidParams } from "../gno";
import type { GnoParams } from "../gno";
import { normalQuantile } from "../normal";
import { chiSquare1Sf } from "../risk/backtests/chiSquare";
import { logLikelihood } from "./likelihood";
import { choleskySolve, insideSupport } from "./newton";
import { findMaximum, findMaximumWork, SHAPE_CAP, type ProfileMemo } from "./maximise";
import { runToEnd, stage, type Work } from "../work";
import { sampleMoments, sampleLMoments, sampleLMomentsSorted, type SampleMoments, type SampleLMoments } from "./sampleStats";
import { estimateFromLMoments } from "./lmomentEstimator";
import { sortFinite } from "../sort";
import { slideStart, type SlideFrom } from "./slideStart";

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
  /**
   * fitGnoQuick only: the previous window's fit and the observation dropped and added. The warm start then becomes
   * that fit moved by one Newton step for the change (slideStart.ts); `start` is used when the update fails.
   */
  readonly slide?: SlideFrom;
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
  /** Hessian of the log-likelihood in (ξ, ln α, k) at the last evaluated point (maximum likelihood, regular fits only). */
  readonly hessian?: Float64Array;
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
  /** Log-likelihood at params when the optimizer computed it there (a compensated sum over the data). */
  readonly value?: number;
}

function lmomentStart(data: ArrayLike<number>, s: SampleMoments): { params: GnoParams; lm: SampleLMoments; truncated: boolean } {
  const lm = sampleLMoments(data);
  const est = estimateFromLMoments(lm);
  if (est) return { params: est.params, lm, truncated: est.truncated };
  return { params: { location: s.mean, scale: Math.sqrt(s.varianceMle), shape: 0 }, lm, truncated: false };
}

/** From this many points on, maximum likelihood starts from the L-moments of a strided subsample. */
export const LARGE_SAMPLE = 20_000;
/** Size of that subsample. */
export const START_SUBSAMPLE = 8192;

/**
 * Start for maximum likelihood without sorting the whole sample (n ≥ LARGE_SAMPLE): the L-moment estimate of an
 * evenly strided subsample, when it is feasible (every observation inside its support) and its L-skewness is
 * clear of the ±0.95 limit; otherwise null (use the full-sample estimate).
 */
export function subsampleStart(data: ArrayLike<number>, s: SampleMoments): GnoParams | null {
  const n = data.length;
  if (n < LARGE_SAMPLE) return null;
  const m = START_SUBSAMPLE;
  const sub = new Float64Array(m);
  const stride = n / m;
  for (let i = 0; i < m; i++) sub[i] = data[Math.floor((i + 0.5) * stride)];
  sortFinite(sub);
  const lm = sampleLMomentsSorted(sub);
  if (!(Math.abs(lm.t3) < 0.9)) return null;
  const est = estimateFromLMoments(lm);
  if (!est) return null;
  const p = est.params;
  return insideSupport(p.location, p.scale, p.shape, s.min, s.max) ? p : null;
}

/** The start fitGno uses for maximum likelihood on these data (the subsample start, else the full L-moment one). */
export function startForMaximumLikelihood(data: ArrayLike<number>, s: SampleMoments): GnoParams {
  return subsampleStart(data, s) ?? lmomentStart(data, s).params;
}

function* maximumLikelihood(
  data: ArrayLike<number>,
  s: SampleMoments,
  start: GnoParams,
  fallbackParams: GnoParams | null,
  fallbackOf?: () => GnoParams,
  memo?: ProfileMemo,
): Work<Core> {
  const search = yield* stage(findMaximumWork(data, s, start, undefined, memo), 0.1, 0.9);
  yield 0.9;
  const r = search.result;
  const warnings: string[] = [];
  if (!search.regular) {
    const fallback = fallbackParams ?? fallbackOf!();
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
    value: r.value,
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
  return runToEnd(fitGnoWork(data, options));
}

/**
 * fitGno as resumable work: yields after the sample moments, the start, every pass over the data of the
 * likelihood search (see findMaximumWork) and the final log-likelihood, so no step is longer than one pass over the
 * data or one sort of it (about 0.1 s at 1,000,000 points in plain node). Same arithmetic and result as fitGno.
 */
export function* fitGnoWork(data: ArrayLike<number>, options: FitOptions = {}): Work<GnoFit> {
  const method: FitMethod = options.method ?? "mle";
  const n = data.length;
  const s = sampleMoments(data);
  checkFittable(n, s);
  yield 0.02;
  const quickStart = method === "mle" && !(options.start && isValidParams(options.start)) ? subsampleStart(data, s) : null;
  let lmFull: { params: GnoParams; lm: SampleLMoments; truncated: boolean } | null = quickStart ? null : lmomentStart(data, s);
  yield 0.1;
  const lmStartOf = () => (lmFull ??= lmomentStart(data, s));
  const warnings: string[] = [];
  if (lmFull?.truncated) warnings.push(`Sample L-skewness ${fmt(lmFull.lm.t3)} is beyond ±0.95; the L-moment estimate uses ±0.95.`);
  let core: Core;
  if (method === "lmom") {
    const p = lmStartOf().params;
    const inside = insideSupport(p.location, p.scale, p.shape, s.min, s.max);
    core = {
      params: p, converged: true, regular: inside, iterations: 0, gradientNorm: NaN, hessian: null, warnings: [],
      reason: inside ? "closed form" : "some observations lie outside the support of the L-moment fit",
    };
    if (!inside) core.warnings.push("Some observations lie outside the support of the L-moment fit: its log-likelihood is −∞. Use maximum likelihood.");
  } else {
    const start = options.start && isValidParams(options.start) ? options.start : (quickStart ?? lmStartOf().params);
    core = yield* maximumLikelihood(data, s, start, quickStart ? null : lmStartOf().params, () => lmStartOf().params);
  }
  warnings.push(...core.warnings);
  const p = core.params;
  if (lmFull?.truncated && !warnings.some((w) => w.startsWith("Sample L-skewness"))) {
    warnings.unshift(`Sample L-skewness ${fmt(lmFull.lm.t3)} is beyond ±0.95; the L-moment estimate uses ±0.95.`);
  }
  const ll = core.value !== undefined && Number.isFinite(core.value) ? core.value : logLikelihood(data, p);
  yield 0.95;
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
  let held: ArrayLike<number> | null = lmFull ? null : data;
  let lmomentsOfSample: SampleLMoments | null = lmFull ? Object.freeze({ ...lmFull.lm }) : null;
  const report = {
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
    sampleLMoments: null as unknown as SampleLMoments,
    edge: ed ? Object.freeze(ed) : null,
  };
  Object.defineProperty(report, "sampleLMoments", {
    enumerable: true,
    get(): SampleLMoments {
      if (!lmomentsOfSample) {
        lmomentsOfSample = Object.freeze({ ...sampleLMoments(held!) });
        held = null;
      }
      return lmomentsOfSample;
    },
  });
  return Object.freeze(report) as GnoFit;
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
    // the log-likelihood is one more pass over the data: computed only when read (rolling forecasts never read it)
    let ll: number | undefined;
    return {
      params: p,
      get logLikelihood() {
        return (ll ??= logLikelihood(data, p));
      },
      converged: true,
      iterations: 0,
    };
  }
  const slid = options.slide ? slideStart(options.slide) : null;
  const usable = (p: GnoParams | null | undefined): p is GnoParams => !!p && isValidParams(p) && insideSupport(p.location, p.scale, p.shape, s.min, s.max);
  const st = usable(slid) ? slid : options.start;
  // a warm attempt that ends irregular hands its profile to the cold search (the profile does not depend on the start)
  const memo: ProfileMemo = {};
  if (usable(st)) {
    const search = findMaximum(data, s, st, options.oneStepGain, memo);
    if (search.regular) {
      const r = search.result;
      return {
        params: { location: r.location, scale: r.scale, shape: r.shape },
        logLikelihood: r.value,
        converged: true,
        iterations: search.iterations,
        hessian: r.hessian,
      };
    }
  }
  const lm = lmomentStart(data, s).params;
  const core = runToEnd(maximumLikelihood(data, s, lm, lm, undefined, memo));
  const ll = core.value !== undefined && Number.isFinite(core.value) ? core.value : logLikelihood(data, core.params);
  const converged = core.regular && core.converged;
  return { params: core.params, logLikelihood: ll, converged, iterations: core.iterations, ...(converged && core.hessian ? { hessian: core.hessian } : {}) };
}
