/**
 * Goodness of fit of the generalized normal law: exact p-values for given parameters (KS by
 * Marsaglia–Tsang–Wang, AD by Marsaglia & Marsaglia) and parametric-bootstrap p-values for a law fitted to the
 * same data (refitting each replicate with the same estimator, warm-started at the original estimate).
 * ln F and ln(1 − F) come straight from gno.logCdf / gno.logSf.
 */
import { ContentCache, fitGnoCached, fitGnoCachedWork, fitGnoQuick, type FitMethod, type GnoFit } from "../fit";
import { isValidParams, logCdf, logSf, reducedVariate, sample, sampleSortedInto, type GnoParams } from "../gno";
import { adProbability } from "./ad";
import { bootstrapWork, startBootstrap, type BootstrapModel, type BootstrapOutcome, type BootstrapProgress, type BootstrapRun } from "./bootstrap";
import { ksProbability, type KsRoute } from "./ks";
import { gofStatistics, type ContinuousLaw } from "./statistics";
import { runToEnd, stage, type Work } from "../work";

export const DEFAULT_RESAMPLES = 199;
export const MIN_RESAMPLES = 19;
export const MAX_RESAMPLES = 9999;
/** Fewest resamples the bootstrap accepts: with fewer, the smallest p-value 1/(B + 1) cannot reach 0.05. */
export const MIN_BOOTSTRAP_RESAMPLES = MIN_RESAMPLES;
/** Cap on resamples × n for one call (about 6 s of refits at the measured 2.8 µs per point-resample on a shared 2-core machine: bench/diagnostics.ts). */
export const MAX_BOOTSTRAP_WORK = 2_000_000;
export const DEFAULT_SEED = 20240611;

export function gnoLaw(p: GnoParams): ContinuousLaw {
  return { logCdf: (x) => logCdf(x, p), logSf: (x) => logSf(x, p), normalVariates: (x, out) => reducedVariates(x, p, out) };
}

/**
 * y_i = reducedVariate(x_i, p) for every point, with reduced.ts's common branch inlined (finite t = (x − ξ)/α,
 * k ≠ 0, k t < ½: y = t·log1p(−kt)/(−kt), the same arithmetic) and the function itself for every other point.
 */
function reducedVariates(x: ArrayLike<number>, p: GnoParams, out: Float64Array): void {
  const n = x.length;
  if (!isValidParams(p)) {
    out.fill(NaN, 0, n);
    return;
  }
  const xi = p.location;
  const al = p.scale;
  const k = p.shape;
  for (let i = 0; i < n; i++) {
    const t = (x[i] - xi) / al;
    const kt = k * t;
    if (k !== 0 && t - t === 0 && kt < 0.5 && (kt >= 1e-8 || kt <= -1e-8)) {
      out[i] = t * (Math.log1p(-kt) / -kt);
      continue;
    }
    out[i] = reducedVariate(x[i], p);
  }
}

export interface GnoGofResult {
  readonly n: number;
  readonly method: "exact" | "bootstrap";
  readonly params: GnoParams;
  readonly ksStatistic: number;
  readonly ksPValue: number;
  readonly adStatistic: number;
  readonly adPValue: number;
  /** How the KS p-value was computed on the exact route. */
  readonly ksRoute: KsRoute | null;
  readonly outsideSupport: number;
  /** Bootstrap only: estimator, requested and used replicates, failed refits, seed. */
  readonly fitMethod: FitMethod | null;
  readonly resamples: number;
  readonly usedResamples: number;
  readonly failedRefits: number;
  /** Bootstrap only: stopped early because too many refits failed (p-values then NaN when too few were used). */
  readonly stoppedEarly: boolean;
  readonly seed: number | null;
  /** True when the original fit was not a regular interior maximum (read the p-values with care). */
  readonly irregularFit: boolean;
  /** Bootstrap only: true when no replicate was run because the fit of the data itself is irregular. */
  readonly refused?: boolean;
}

/** Exact p-values against given parameters (fully specified law). */
export function testGnoSpecified(data: ArrayLike<number>, params: GnoParams): GnoGofResult {
  const s = gofStatistics(data, gnoLaw(params));
  const ks = ksProbability(s.n, s.ks.d);
  const ad = adProbability(s.n, s.ad);
  return {
    n: s.n,
    method: "exact",
    params,
    ksStatistic: s.ks.d,
    ksPValue: ks.pValue,
    adStatistic: s.ad,
    adPValue: ad.pValue,
    ksRoute: ks.method,
    outsideSupport: s.outsideSupport,
    fitMethod: null,
    resamples: 0,
    usedResamples: 0,
    failedRefits: 0,
    stoppedEarly: false,
    seed: null,
    irregularFit: false,
  };
}

/**
 * Stopping rule of a replicate's maximum-likelihood refit (log-likelihood units): once Newton's predicted remaining
 * gain gᵀ(−H)⁻¹g/2 is below this, the last Newton step is taken without evaluating the new point (the fit's
 * `oneStepGain`, see fit/newton.ts). Newton converges quadratically, so the step leaves a gain of order
 * REFIT_GAIN²/n. Measured on 199 replicates each at n = 50, 100, 250 and 1,000 (k from −0.6 to 0.3): the refitted
 * KS and AD statistics moved by at most 3e-3 relative (6e-4 at n = 1,000) against refits run to the default 1e-10,
 * and the seeded p-values of 15 cases (199 resamples, n = 50 to 1,000) were all unchanged; at n = 1,000 a refit
 * takes 2.3 likelihood passes instead of 3.9 (docs/notes/gofspeed.md).
 */
export const REFIT_GAIN = 1e-2;

/** The bootstrap model for the generalized normal fitted by `method`. */
export function gnoBootstrapModel(method: FitMethod): BootstrapModel<GnoParams> {
  const options = { method, oneStepGain: REFIT_GAIN };
  return {
    fit(x: Float64Array, start: GnoParams): GnoParams | null {
      const q = fitGnoQuick(x, { ...options, start });
      return q.converged ? q.params : null;
    },
    law: gnoLaw,
    simulate: sample,
    simulateSorted: sampleSortedInto,
  };
}

export interface GnoBootstrapOptions {
  readonly resamples?: number;
  readonly seed?: number;
  readonly method?: FitMethod;
  /** A fit of the same data by the same method, to reuse (else the cached fit is taken). */
  readonly fit?: GnoFit;
}

export interface GnoBootstrap {
  readonly fit: GnoFit;
  readonly run: BootstrapRun;
  /** Shapes the run's current outcome as a result object. */
  result(): GnoGofResult;
}

/** Starts a chunked bootstrap of the fitted law (call run.step(k) until run.progress.done). */
export function startGnoBootstrap(data: ArrayLike<number>, options: GnoBootstrapOptions = {}): GnoBootstrap {
  const x = data instanceof Float64Array ? data : Float64Array.from(data);
  const method = options.method ?? "mle";
  const fit = options.fit ?? fitGnoCached(x, method);
  const seed = options.seed ?? DEFAULT_SEED;
  const run = startBootstrap(x, gnoBootstrapModel(method), fit.params, { resamples: options.resamples ?? DEFAULT_RESAMPLES, seed });
  return {
    fit,
    run,
    result: () => shapeBootstrap(fit, run.result()),
  };
}

function shapeBootstrap(fit: GnoFit, o: BootstrapOutcome): GnoGofResult {
  return {
    n: o.observed.n,
    method: "bootstrap",
    params: fit.params,
    ksStatistic: o.observed.ks.d,
    ksPValue: o.ksPValue,
    adStatistic: o.observed.ad,
    adPValue: o.adPValue,
    ksRoute: null,
    outsideSupport: o.observed.outsideSupport,
    fitMethod: fit.method,
    resamples: o.resamples,
    usedResamples: o.used,
    failedRefits: o.failedRefits,
    stoppedEarly: o.stoppedEarly,
    seed: o.seed,
    irregularFit: !fit.regular,
  };
}

const resultCache = new ContentCache<GnoGofResult>(8);

/**
 * The bootstrap for the fitted law as resumable Work (one replicate per step). When the fit of the data itself is
 * not a regular maximum, no replicate is run: every refit of data drawn from a degenerate law meets the same
 * degenerate likelihood (each failing after the full profile search), so the irregularity is detected once, here,
 * and the result says so (p-values not available) instead of spending the bound on refits that fail.
 */
export function* testGnoFittedWork(data: ArrayLike<number>, options: GnoBootstrapOptions = {}): Work<GnoGofResult> {
  const x = data instanceof Float64Array ? data : Float64Array.from(data);
  const method = options.method ?? "mle";
  const fit = options.fit ?? (yield* stage(fitGnoCachedWork(x, method), 0, 0));
  const seed = options.seed ?? DEFAULT_SEED;
  const resamples = options.resamples ?? DEFAULT_RESAMPLES;
  if (!fit.regular) {
    const observed = gofStatistics(x, gnoLaw(fit.params));
    return {
      ...shapeBootstrap(fit, { observed, ksPValue: NaN, adPValue: NaN, resamples, used: 0, failedRefits: 0, stoppedEarly: false, seed }),
      refused: true,
    };
  }
  const o = yield* bootstrapWork(x, gnoBootstrapModel(method), fit.params, { resamples, seed });
  return shapeBootstrap(fit, o);
}

/**
 * testGnoFittedWork for a cell: the same data (proven equal, see fit/cache.ts), resamples and seed give the cached
 * result object instead of a new bootstrap on every recalculation. Least-recently-used, 8 entries.
 */
export function* testGnoFittedCachedWork(data: Float64Array, options: { resamples?: number; seed?: number; method?: FitMethod } = {}): Work<GnoGofResult> {
  const method = options.method ?? "mle";
  const key = `${method}:${options.resamples ?? DEFAULT_RESAMPLES}:${options.seed ?? DEFAULT_SEED}`;
  const hit = resultCache.get(data, key);
  if (hit) return hit;
  const fit = yield* stage(fitGnoCachedWork(data, method), 0, 0);
  const r = yield* testGnoFittedWork(data, { ...options, method, fit });
  resultCache.set(data, key, r);
  return r;
}

/** testGnoFittedCachedWork run to the end (synchronous callers). */
export function testGnoFittedCached(data: Float64Array, options: { resamples?: number; seed?: number; method?: FitMethod } = {}): GnoGofResult {
  return runToEnd(testGnoFittedCachedWork(data, options));
}

/** Runs the whole bootstrap for the fitted law; onProgress after every replicate. */
export function testGnoFitted(
  data: ArrayLike<number>,
  options: GnoBootstrapOptions = {},
  onProgress?: (p: BootstrapProgress) => void,
): GnoGofResult {
  const total = options.resamples ?? DEFAULT_RESAMPLES;
  return runToEnd(testGnoFittedWork(data, options), onProgress ? (f) => onProgress({ completed: Math.round(f * total), total, done: f >= 1 }) : undefined);
}
