/**
 * Seeded simulation of h-day returns under a one-day model: i.i.d. draws of a GNO law, GARCH(1,1) or EWMA
 * with standardized generalized-normal innovations (mean 0, variance 1; src/core/vol/innovation.ts), and the
 * h-day VaR / ES of the simulated sums with Monte Carlo standard errors.
 *
 *   GARCH(1,1) (Bollerslev 1986): rₜ = μ + σₜεₜ,  σ²ₜ₊₁ = ω + α(rₜ − μ)² + βσ²ₜ, starting from the forecast σ²ₜ₊₁.
 *   EWMA (RiskMetrics 1996):      rₜ = σₜεₜ,      σ²ₜ₊₁ = λσ²ₜ + (1 − λ)rₜ².
 * Innovations: εₜ = ξ(k) + a(k)·g(zₜ), zₜ = Φ⁻¹(uₜ), g the GNO reduced quantile, uₜ from the shared seeded
 * stream (src/core/random.ts). With antithetic variates each path is paired with the path driven by −z (same
 * uniforms, mirrored normal scores); the pair stays in one batch so the standard errors stay honest.
 *
 * Standard errors: batch means (BATCHES contiguous batches of paths; the estimate's standard error is the batch
 * estimates' standard deviation over √BATCHES; common practice for dependent or paired samples).
 * Work: one block of paths per step (about BLOCK_STEPS one-day steps), so a cell can slice and cancel it.
 */
import { reducedQuantile, type GnoParams } from "../../gno";
import { normalQuantile } from "../../normal";
import { uniformStream } from "../../random";
import { innovationLaw } from "../../vol";
import type { Work } from "../../work";
import type { RiskSide } from "../measures/side";
import { sortedCopy } from "../../sort";

/** Most one-day steps (paths × horizon) a simulation may take. */
export const MAX_SIMULATED_STEPS = 50_000_000;
/** Most paths. */
export const MAX_PATHS = 1_000_000;
const BLOCK_STEPS = 20_000;
/** Batches for the batch-means standard errors. */
export const BATCHES = 20;

export type PathModel =
  | { readonly kind: "iid"; readonly law: GnoParams }
  | {
      readonly kind: "garch";
      readonly mu: number;
      readonly omega: number;
      readonly alpha: number;
      readonly beta: number;
      /** Innovation shape k. */
      readonly shape: number;
      /** σ² of the first simulated day (the model's next-day forecast). */
      readonly nextVariance: number;
    }
  | {
      readonly kind: "ewma";
      readonly lambda: number;
      readonly shape: number;
      readonly nextVariance: number;
    };

export interface SimulationOptions {
  readonly horizon: number;
  readonly paths: number;
  readonly seed: number;
  /** Pair each path with its mirrored-score twin (default true). */
  readonly antithetic?: boolean;
}

/** The simulated h-day sums, in path order (antithetic twins adjacent). */
export interface SimulatedSums {
  readonly sums: Float64Array;
  readonly horizon: number;
  readonly antithetic: boolean;
}

/** Analytic variance of the h-day sum under GARCH(1,1): Σⱼ E[σ²ₜ₊ⱼ], E[σ²ₜ₊ⱼ] = σ̄² + (α + β)^{j−1}(σ²ₜ₊₁ − σ̄²). */
export function garchSumVariance(omega: number, alpha: number, beta: number, nextVariance: number, horizon: number): number {
  const persistence = alpha + beta;
  let s = 0;
  let v = nextVariance;
  for (let j = 1; j <= horizon; j++) {
    s += v;
    v = omega + persistence * v;
  }
  return s;
}

/** One path's h-day sum driven by normal scores sign·z₁…z_h (z read from `scores`). */
function pathSum(model: PathModel, scores: Float64Array, sign: number, loc: number, scale: number, k: number): number {
  const h = scores.length;
  let s = 0;
  if (model.kind === "iid") {
    for (let t = 0; t < h; t++) s += loc + scale * reducedQuantile(sign * scores[t], k);
    return s;
  }
  let v = model.nextVariance;
  if (model.kind === "garch") {
    const { mu, omega, alpha, beta } = model;
    for (let t = 0; t < h; t++) {
      const e = loc + scale * reducedQuantile(sign * scores[t], k);
      const shock = Math.sqrt(v) * e;
      s += mu + shock;
      v = omega + alpha * shock * shock + beta * v;
    }
    return s;
  }
  const { lambda } = model;
  for (let t = 0; t < h; t++) {
    const r = Math.sqrt(v) * (loc + scale * reducedQuantile(sign * scores[t], k));
    s += r;
    v = lambda * v + (1 - lambda) * r * r;
  }
  return s;
}

/** Simulates `paths` h-day sums (Work: yields the fraction done after each block). */
export function* simulateSums(model: PathModel, options: SimulationOptions): Work<SimulatedSums> {
  const h = options.horizon;
  const antithetic = options.antithetic ?? true;
  let n = Math.floor(options.paths);
  if (antithetic && n % 2 === 1) n += 1;
  const sums = new Float64Array(n);
  const law = model.kind === "iid" ? model.law : innovationLaw(model.shape);
  const { location: loc, scale, shape: k } = law;
  const next = uniformStream(options.seed);
  const scores = new Float64Array(h);
  const block = Math.max(2, Math.floor(BLOCK_STEPS / h));
  let i = 0;
  while (i < n) {
    const end = Math.min(n, i + block);
    while (i < end) {
      for (let t = 0; t < h; t++) scores[t] = normalQuantile(next());
      sums[i++] = pathSum(model, scores, 1, loc, scale, k);
      if (antithetic) sums[i++] = pathSum(model, scores, -1, loc, scale, k);
    }
    yield i / n;
  }
  return Object.freeze({ sums, horizon: h, antithetic });
}

export interface SimulatedTail {
  readonly valueAtRisk: number;
  readonly valueAtRiskError: number;
  readonly expectedShortfall: number;
  readonly expectedShortfallError: number;
  readonly paths: number;
  /** Simulated losses beyond the VaR that the ES averages. */
  readonly tailCount: number;
}

/** VaR (order statistic ⌈n·c⌉ of the losses) and ES (mean of the n(1 − c) largest losses, the boundary one weighted). */
function tailOf(losses: Float64Array, confidence: number): [number, number] {
  const n = losses.length;
  const sorted = sortedCopy(losses);
  const idx = Math.min(n - 1, Math.max(0, Math.ceil(n * confidence) - 1));
  const v = sorted[idx];
  const count = n * (1 - confidence);
  let s = 0;
  let used = 0;
  for (let j = n - 1; j >= 0 && used < count; j--) {
    const w = Math.min(1, count - used);
    s += w * sorted[j];
    used += w;
  }
  return [v, used > 0 ? s / used : v];
}

/** h-day VaR and ES of the simulated sums with batch-means standard errors. */
export function simulatedTail(sim: SimulatedSums, confidence: number, side: RiskSide = "long"): SimulatedTail {
  const n = sim.sums.length;
  const losses = new Float64Array(n);
  for (let i = 0; i < n; i++) losses[i] = side === "long" ? -sim.sums[i] : sim.sums[i];
  const [v, es] = tailOf(losses, confidence);
  const per = Math.floor(n / BATCHES / 2) * 2;
  let sv = 0;
  let sv2 = 0;
  let se = 0;
  let se2 = 0;
  for (let b = 0; b < BATCHES; b++) {
    const [bv, bes] = tailOf(losses.subarray(b * per, (b + 1) * per), confidence);
    sv += bv;
    sv2 += bv * bv;
    se += bes;
    se2 += bes * bes;
  }
  const sd = (s: number, s2: number) => Math.sqrt(Math.max(0, (s2 - (s * s) / BATCHES) / (BATCHES - 1)));
  return Object.freeze({
    valueAtRisk: v,
    valueAtRiskError: sd(sv, sv2) / Math.sqrt(BATCHES),
    expectedShortfall: es,
    expectedShortfallError: sd(se, se2) / Math.sqrt(BATCHES),
    paths: n,
    tailCount: Math.round(n * (1 - confidence)),
  });
}
