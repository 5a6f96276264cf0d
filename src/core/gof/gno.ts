/**
 * Goodness of fit of the generalized normal law: exact p-values for given parameters (KS by
 * Marsaglia–Tsang–Wang, AD by Marsaglia & Marsaglia) and parametric-bootstrap p-values for a law fitted to the
 * same data (refitting each replicate with the same estimator, warm-started at the original estimate).
 * ln F and ln(1 − F) come straight from gno.logCdf / gno.logSf.
 */
import { ContentCache, fitGnoCached, fitGnoCachedWork, fitGnoQuick, type FitMethod, type GnoFit } from "../fit";
import {
  isValidParams,
  logCdf,
  logSf,
  reducedVariate,
  sample,
  sampleSortedInto,
  sortedNormalsInto,
  sortNearlySorted,
  type GnoParams,
} from "../gno";
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
 * y_i = reducedVariate(x_i, p) for every point: reduced.ts's common branch (finite t = (x − ξ)/α, k ≠ 0,
 * 1e-8 ≤ |k t|, k t < ½: y = t·log1p(−kt)/(−kt), the same arithmetic) in a loop without calls, then the function
 * itself for the points outside that branch, if any (k = 0, tiny |k t|, points near or beyond the edge).
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
  let others = k === 0 ? n : 0;
  if (k !== 0) {
    for (let i = 0; i < n; i++) {
      const t = (x[i] - xi) / al;
      const kt = k * t;
      out[i] = t * (Math.log1p(-kt) / -kt);
      if (!(t - t === 0 && kt < 0.5 && (kt >= 1e-8 || kt <= -1e-8))) others++;
    }
  }
  if (others === 0) return;
  for (let i = 0; i < n; i++) {
    const t = (x[i] - xi) / al;
    const kt = k * t;
    if (!(k !== 0 && t - t === 0 && kt < 0.5 && (kt >= 1e-8 || kt <= -1e-8))) out[i] = reducedVariate(x[i], p);
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
 * from the fitted parameters takes 2.3 likelihood passes instead of 3.9 (1.3 from the predicted start below).
 */
export const REFIT_GAIN = 1e-2;

/**
 * The bootstrap model for the generalized normal fitted by `method`. Given the fit of the data (`fit`, maximum
 * likelihood with a covariance), each replicate's refit starts from a predicted estimate instead of the fitted
 * parameters θ₀: the draws are x_i = ξ₀ + α₀·g(z_i) with z_i standard normal quantiles, so the reduced variate of
 * x_i at θ₀ is z_i itself and the score S(θ₀) of the replicate costs a few operations per point while drawing
 * (formulas of fit/likelihood.ts at y = z). One Newton step with the data's covariance, θ₀ + Cov·S(θ₀), lands
 * within O(1/n) of the replicate's maximum (the classical one-step estimator, Lehmann & Casella 1998, §6.4), so
 * the refit usually ends after one likelihood pass by the REFIT_GAIN rule. It is only a start: the refit is the
 * same estimator with the same stopping rule, and a prediction outside the support (or a refit from it that does
 * not end regular) falls back to the start θ₀ — so a replicate whose refit fails costs up to two refits, and the
 * bootstrap's failure limit (bootstrap.ts) still bounds the run.
 */
export function gnoBootstrapModel(method: FitMethod, fit?: GnoFit): BootstrapModel<GnoParams> {
  const options = { method, oneStepGain: REFIT_GAIN };
  const refit = (x: Float64Array, start: GnoParams): GnoParams | null => {
    const q = fitGnoQuick(x, { ...options, start });
    return q.converged ? q.params : null;
  };
  const cov = method === "mle" && fit && fit.regular ? fit.covariance : null;
  if (!cov || !cov.every((row) => row.every(Number.isFinite))) {
    return { fit: refit, law: gnoLaw, simulate: sample, simulateSorted: sampleSortedInto };
  }
  const score = new Float64Array(3);
  let predictedFor: Float64Array | null = null;
  let predicted: GnoParams | null = null;
  return {
    fit(x: Float64Array, start: GnoParams): GnoParams | null {
      const guess = x === predictedFor ? predicted : null;
      predictedFor = null;
      if (guess) {
        const r = refit(x, guess);
        if (r) return r;
      }
      return refit(x, start);
    },
    law: gnoLaw,
    simulate: sample,
    simulateSorted(p: GnoParams, seed: number, out: Float64Array): Float64Array {
      if (!isValidParams(p)) return out.fill(NaN);
      drawWithScore(p, seed, out, score);
      const n = out.length;
      // score in (ξ, α, k): ∂ℓ/∂α = (∂ℓ/∂ln α)/α
      const g0 = score[0];
      const g1 = score[1] / p.scale;
      const g2 = score[2];
      const next = {
        location: p.location + cov[0][0] * g0 + cov[0][1] * g1 + cov[0][2] * g2,
        scale: p.scale + cov[1][0] * g0 + cov[1][1] * g1 + cov[1][2] * g2,
        shape: p.shape + cov[2][0] * g0 + cov[2][1] * g1 + cov[2][2] * g2,
      };
      predictedFor = out;
      predicted = n > 0 && isValidParams(next) && Math.abs(next.shape) < 2.9 && coversSample(next, out[0], out[n - 1]) ? next : null;
      return out;
    },
  };
}

/** Every point of [min, max] strictly inside the support of p. */
function coversSample(p: GnoParams, min: number, max: number): boolean {
  if (p.shape > 0) return 1 - (p.shape * (max - p.location)) / p.scale > 0;
  if (p.shape < 0) return 1 - (p.shape * (min - p.location)) / p.scale > 0;
  return true;
}

/**
 * sampleSortedInto(p, seed, out), accumulating on the way the score of the log-likelihood at p in (ξ, ln α, k)
 * (fit/likelihood.ts): with y = z_i, t = g(z_i), E = 1/(1 − k t) = e^{k y},
 * ∂ℓ/∂ξ = Σ (k − y)(−E/α), ∂ℓ/∂ln α = Σ (k − y)(−t E) − n, ∂ℓ/∂k = Σ (k − y) y_k + y with
 * y_k = (t E − y)/k (= y²(e^{ky} − 1 − ky)/(ky)², from E − 1 = k t E), y²(½ + ky/6) when |k y| < 1e-4.
 */
function drawWithScore(p: GnoParams, seed: number, out: Float64Array, score: Float64Array): void {
  sortedNormalsInto(seed, out);
  const xi = p.location;
  const al = p.scale;
  const k = p.shape;
  const n = out.length;
  let sx = 0;
  let sa = 0;
  let sk = 0;
  for (let i = 0; i < n; i++) {
    const y = out[i];
    // t = reducedQuantile(y, k), the same arithmetic written out (no call in the loop; exact t = y at k = 0)
    const u = -k * y;
    const t = Math.abs(u) < 1e-5 ? y * (1 + u / 2 + (u * u) / 6) : -Math.expm1(u) / k;
    out[i] = xi + al * t;
    const e = 1 / (1 - k * t);
    const r = k - y;
    const ky = k * y;
    const yk = ky < 1e-4 && ky > -1e-4 ? y * y * (0.5 + ky / 6) : (t * e - y) / k;
    sx -= r * e;
    sa -= r * t * e;
    sk += r * yk + y;
  }
  score[0] = sx / al;
  score[1] = sa - n;
  score[2] = sk;
  sortNearlySorted(out);
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
  const run = startBootstrap(x, gnoBootstrapModel(method, fit), fit.params, { resamples: options.resamples ?? DEFAULT_RESAMPLES, seed });
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
  const o = yield* bootstrapWork(x, gnoBootstrapModel(method, fit), fit.params, { resamples, seed });
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
