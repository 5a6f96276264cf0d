/**
 * Parametric-bootstrap p-values for KS and AD when the law's parameters were estimated from the same data
 * (Stute, González Manteiga & Presedo Quindimil 1993, Metrika 40:243-256; Marsaglia, Tsang & Wang 2003 (KS) and Marsaglia & Marsaglia 2004 (AD), J. Stat. Software; values recomputed with scipy 1.17 / mpmath outside the repo): for b = 1..B draw n
 * points from the fitted law, refit with the SAME estimator, compute T_b against the refitted law, and report
 * p = (1 + #{T_b ≥ T_obs}) / (B_used + 1) (the usual Monte Carlo p-value, common practice). Replicates whose
 * refit fails are counted and left out of B_used.
 *
 * Work is done in chunks: `startBootstrap` returns a run whose `step(k)` performs k more replicates, so a page can
 * interleave the work with rendering; `bootstrapWork` is the same run as a resumable Work (one replicate per
 * step, src/core/work.ts); `runBootstrap` drives a run to the end with an optional progress callback.
 * Replicate b draws with seed replicateSeed(seed, b), so results do not depend on the chunking.
 *
 * Bounded work: when refits keep failing (more than max(10, 20% of B) failures — e.g. data whose fitted law is
 * degenerate, where every replicate is too) the run stops early, and when fewer than MIN_USED_REPLICATES refits
 * succeeded the p-values are NaN (not available) rather than a number computed from a handful of replicates.
 */
import { fmix32 } from "../random";
import type { Work } from "../work";
import { gofStatistics, gofStatisticsSorted, type ContinuousLaw, type GofStatistics } from "./statistics";

export interface BootstrapModel<P> {
  /** Refits a replicate; `start` is the original estimate (a warm start). Null when the fit fails. */
  fit(sample: Float64Array, start: P): P | null;
  law(p: P): ContinuousLaw;
  simulate(p: P, n: number, seed: number): Float64Array;
  /**
   * Optional fast path: the same draws as simulate(p, out.length, seed), in ascending order, written into `out`.
   * The run then reuses one buffer for every replicate and skips the statistics' sorted copy, so `fit` must not
   * keep a reference to its sample.
   */
  simulateSorted?(p: P, seed: number, out: Float64Array): Float64Array;
}

/** Fewest successful refits for which bootstrap p-values are reported. */
export const MIN_USED_REPLICATES = 19;

export interface BootstrapOptions {
  readonly resamples: number;
  readonly seed: number;
}

export interface BootstrapProgress {
  readonly completed: number;
  readonly total: number;
  readonly done: boolean;
}

export interface BootstrapOutcome {
  readonly observed: GofStatistics;
  readonly ksPValue: number;
  readonly adPValue: number;
  /** Requested replicates. */
  readonly resamples: number;
  /** Replicates whose refit succeeded (the B in the p-value). */
  readonly used: number;
  readonly failedRefits: number;
  /** True when the run stopped early because too many refits failed. */
  readonly stoppedEarly: boolean;
  readonly seed: number;
}

export interface BootstrapRun {
  /** Runs up to `count` more replicates and reports progress. */
  step(count: number): BootstrapProgress;
  readonly progress: BootstrapProgress;
  /** The p-values from the replicates done so far (final once progress.done). */
  result(): BootstrapOutcome;
}

/** Seed of replicate b: a 32-bit integer mix of (seed, b) through MurmurHash3's finaliser (src/core/random.ts). */
export function replicateSeed(seed: number, b: number): number {
  return fmix32(Math.imul((seed | 0) ^ 0x9e3779b9, 0x85ebca6b) ^ Math.imul(b + 1, 0xc2b2ae35));
}

export function startBootstrap<P>(data: ArrayLike<number>, model: BootstrapModel<P>, fitted: P, options: BootstrapOptions): BootstrapRun {
  const n = data.length;
  const observed = gofStatistics(data, model.law(fitted));
  const total = Math.max(0, Math.floor(options.resamples));
  let completed = 0;
  let used = 0;
  let ksAtLeast = 0;
  let adAtLeast = 0;
  let stopped = false;
  const failLimit = Math.max(10, Math.ceil(0.2 * total));
  const progress = (): BootstrapProgress => ({ completed, total, done: stopped || completed >= total });
  // one replicate buffer for the whole run when the model draws in ascending order
  const buffer = model.simulateSorted ? new Float64Array(n) : null;
  return {
    step(count: number): BootstrapProgress {
      const end = Math.min(total, completed + Math.max(0, Math.floor(count)));
      for (; completed < end && !stopped; completed++) {
        if (completed - used > failLimit) {
          stopped = true;
          break;
        }
        const seed = replicateSeed(options.seed, completed);
        const sample = buffer ? model.simulateSorted!(fitted, seed, buffer) : model.simulate(fitted, n, seed);
        const refit = model.fit(sample, fitted);
        if (refit === null) continue;
        const t = buffer ? gofStatisticsSorted(sample, model.law(refit)) : gofStatistics(sample, model.law(refit));
        if (Number.isNaN(t.ks.d) || Number.isNaN(t.ad)) continue;
        used++;
        if (t.ks.d >= observed.ks.d) ksAtLeast++;
        if (t.ad >= observed.ad) adAtLeast++;
      }
      return progress();
    },
    get progress() {
      return progress();
    },
    result(): BootstrapOutcome {
      const enough = used >= Math.min(MIN_USED_REPLICATES, total);
      return {
        observed,
        ksPValue: enough ? (1 + ksAtLeast) / (used + 1) : NaN,
        adPValue: enough ? (1 + adAtLeast) / (used + 1) : NaN,
        resamples: total,
        used,
        failedRefits: completed - used,
        stoppedEarly: stopped,
        seed: options.seed,
      };
    },
  };
}

/** Runs the whole bootstrap; onProgress is called after every chunk of `chunk` replicates. */
export function runBootstrap<P>(
  data: ArrayLike<number>,
  model: BootstrapModel<P>,
  fitted: P,
  options: BootstrapOptions,
  onProgress?: (p: BootstrapProgress) => void,
  chunk = 10,
): BootstrapOutcome {
  const run = startBootstrap(data, model, fitted, options);
  while (!run.progress.done) {
    const p = run.step(chunk);
    if (onProgress) onProgress(p);
  }
  return run.result();
}

/**
 * The bootstrap as resumable Work: one replicate (a draw, a refit, two statistics) per step, yielding the
 * fraction of requested replicates done. Same replicates and result as runBootstrap.
 */
export function* bootstrapWork<P>(data: ArrayLike<number>, model: BootstrapModel<P>, fitted: P, options: BootstrapOptions): Work<BootstrapOutcome> {
  const run = startBootstrap(data, model, fitted, options);
  while (!run.progress.done) {
    const p = run.step(1);
    yield p.total > 0 ? p.completed / p.total : 1;
  }
  return run.result();
}
