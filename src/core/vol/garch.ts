/**
 * GARCH(1,1) with standardized generalized-normal innovations (Bollerslev 1986, J. Econometrics 31:307-327):
 *   rₜ = μ + σₜzₜ,  σ²ₜ = ω + α(rₜ₋₁ − μ)² + βσ²ₜ₋₁,  zₜ i.i.d. with the mean-0, variance-1 law of shape k
 * (innovation.ts; "normal" innovations fix k = 0). Pre-sample convention of the benchmark of Fiorentini,
 * Calzolari & Panattoni (1996, J. Applied Econometrics 11:399-417): ε₀² = σ²₀ = mean of (rₜ − μ)² over the
 * sample, so σ²₁ = ω + (α + β)·that mean (R fGarch's garchFit starts its filter the same way).
 *
 * One likelihood pass computes the log-likelihood, its analytic gradient in θ = (μ, ω, α, β[, k]) by carrying
 * ∂σ²ₜ/∂θ through the recursion, and optionally the per-observation scores (their outer product is the BHHH
 * matrix; Bollerslev & Wooldridge 1992, Econometric Reviews 11:143-172, use it in the robust covariance).
 * Each return's law is GNO(μ + σₜξ(k), σₜα(k), k), so the score chains the kernel's ∂ℓ/∂(L, ln A, k):
 *   ∂L/∂θ = ∂μ/∂θ + ξ ∂σ/∂θ + σ ξ′ [θ = k],  ∂ln A/∂θ = ½ ∂σ²/∂θ / σ² + (ln α)′ [θ = k].
 *
 * Maximization (maximize.ts, BFGS with BHHH start) runs on φ = (μ, ln ω, logit(α + β), logit(α/(α + β))[, k·]),
 * with k = K·tanh(κ), K = INNOVATION_SHAPE_CAP: ω > 0, α ≥ 0, β ≥ 0, α + β < 1 hold by construction. Start:
 * variance targeting (ω = s²(1 − 0.95), α = 0.05, β = 0.90, μ = sample mean, k = 0) or a caller's warm start
 * (retried cold when it does not converge).
 * Solutions at a boundary (α or β within 1e-6 of 0, α + β within 1e-6 of 1) are reported, not hidden.
 */
import { HALF_LOG_2PI, INNOVATION_SHAPE_CAP, pointScore, standardizedShape, type PointScore } from "./innovation";
import { maximizeBfgs, type Evaluation } from "./maximize";

export type Innovations = "gno" | "normal";
export const INNOVATION_KINDS: readonly Innovations[] = ["gno", "normal"];

export interface GarchParams {
  readonly mu: number;
  readonly omega: number;
  readonly alpha: number;
  readonly beta: number;
  /** Innovation shape (0 for normal innovations). */
  readonly shape: number;
}

export interface GarchPass {
  readonly logLikelihood: number;
  /** ∂ℓ/∂θ, θ = (μ, ω, α, β[, k]); length 4 for normal innovations, 5 otherwise. */
  readonly gradient: Float64Array;
  /** Per-observation scores, n × dim row-major, when asked for. */
  readonly scores: Float64Array | null;
  /** σ²ₜ for t = 1…n and, last, the next day's σ²ₙ₊₁ (length n + 1). */
  readonly variances: Float64Array;
}

/** The pre-sample variance: mean of (rₜ − μ)². */
function presample(r: ArrayLike<number>, mu: number): { mean2: number; dMu: number } {
  let s = 0;
  let d = 0;
  for (let i = 0; i < r.length; i++) {
    const e = r[i] - mu;
    s += e * e;
    d += e;
  }
  return { mean2: s / r.length, dMu: (-2 * d) / r.length };
}

/** Variance path σ²₁…σ²ₙ₊₁ for given parameters (no likelihood). */
export function garchVariances(r: ArrayLike<number>, p: GarchParams): Float64Array {
  const n = r.length;
  const h = new Float64Array(n + 1);
  let ht = p.omega + (p.alpha + p.beta) * presample(r, p.mu).mean2;
  for (let t = 0; t < n; t++) {
    h[t] = ht;
    const e = r[t] - p.mu;
    ht = p.omega + p.alpha * e * e + p.beta * ht;
  }
  h[n] = ht;
  return h;
}

/** One likelihood pass; the log-likelihood is −Infinity when a return lies outside its law's support. */
export function garchLikelihood(r: ArrayLike<number>, p: GarchParams, innovations: Innovations, wantScores = false): GarchPass {
  const n = r.length;
  const dim = innovations === "normal" ? 4 : 5;
  const k = innovations === "normal" ? 0 : p.shape;
  const st = standardizedShape(k);
  const { mu, omega, alpha, beta } = p;
  const gradient = new Float64Array(dim);
  const scores = wantScores ? new Float64Array(n * dim) : null;
  const variances = new Float64Array(n + 1);
  const pre = presample(r, mu);
  let h = omega + (alpha + beta) * pre.mean2;
  // ∂h/∂(μ, ω, α, β)
  let hm = (alpha + beta) * pre.dMu;
  let hw = 1;
  let ha = pre.mean2;
  let hb = pre.mean2;
  const ps: PointScore = { value: 0, dLocation: 0, dLogScale: 0, dShape: 0 };
  let sum = 0;
  let comp = 0;
  let gm = 0, gw = 0, ga = 0, gb = 0, gk = 0;
  const lnScaleK = Math.log(st.scale);
  for (let t = 0; t < n; t++) {
    variances[t] = h;
    if (!(h > 0) || !Number.isFinite(h)) return { logLikelihood: -Infinity, gradient, scores, variances };
    let v: number;
    let dLoc: number;
    let dh: number;
    let sigma = 0;
    if (dim === 4) {
      // normal innovations: ℓ = −½(ln 2π + ln h + e²/h), ∂ℓ/∂μ (direct) = e/h, ∂ℓ/∂h = (e²/h − 1)/(2h)
      const e = r[t] - mu;
      const z2 = (e * e) / h;
      v = -0.5 * z2 - 0.5 * Math.log(h) - HALF_LOG_2PI;
      dLoc = e / h;
      dh = (z2 - 1) / (2 * h);
    } else {
      sigma = Math.sqrt(h);
      const loc = mu + sigma * st.location;
      const scale = sigma * st.scale;
      const lnScale = 0.5 * Math.log(h) + lnScaleK;
      if (!pointScore(r[t], loc, scale, lnScale, k, ps)) return { logLikelihood: -Infinity, gradient, scores, variances };
      v = ps.value;
      dLoc = ps.dLocation;
      // ∂L/∂h = ξ/(2σ), ∂a/∂h = 1/(2h)
      dh = ps.dLocation * (st.location / (2 * sigma)) + ps.dLogScale / (2 * h);
    }
    const s1 = sum + v;
    comp += Math.abs(sum) >= Math.abs(v) ? sum - s1 + v : v - s1 + sum;
    sum = s1;
    const sm = dLoc + dh * hm;
    const sw = dh * hw;
    const sa = dh * ha;
    const sb = dh * hb;
    gm += sm;
    gw += sw;
    ga += sa;
    gb += sb;
    let sk = 0;
    if (dim === 5) {
      sk = ps.dLocation * sigma * st.dLocation + ps.dLogScale * st.dLogScale + ps.dShape;
      gk += sk;
    }
    if (scores) {
      const o = t * dim;
      scores[o] = sm;
      scores[o + 1] = sw;
      scores[o + 2] = sa;
      scores[o + 3] = sb;
      if (dim === 5) scores[o + 4] = sk;
    }
    const e = r[t] - mu;
    hm = -2 * alpha * e + beta * hm;
    hw = 1 + beta * hw;
    ha = e * e + beta * ha;
    hb = h + beta * hb;
    h = omega + alpha * e * e + beta * h;
  }
  variances[n] = h;
  gradient[0] = gm;
  gradient[1] = gw;
  gradient[2] = ga;
  gradient[3] = gb;
  if (dim === 5) gradient[4] = gk;
  return { logLikelihood: sum + comp, gradient, scores, variances };
}

const logistic = (x: number): number => 1 / (1 + Math.exp(-x));
const logit = (p: number): number => Math.log(p / (1 - p));

/** Unconstrained coordinates φ → θ. */
export function fromTransformed(phi: ArrayLike<number>, innovations: Innovations): GarchParams {
  const persistence = logistic(phi[2]);
  const share = logistic(phi[3]);
  return {
    mu: phi[0],
    omega: Math.exp(phi[1]),
    alpha: persistence * share,
    beta: persistence * (1 - share),
    shape: innovations === "normal" ? 0 : INNOVATION_SHAPE_CAP * Math.tanh(phi[4]),
  };
}

/** θ → φ, with α, β and 1 − α − β kept at least 1e-8 away from 0 so the logits stay finite. */
export function toTransformed(p: GarchParams, innovations: Innovations): Float64Array {
  const a = Math.max(p.alpha, 1e-8);
  const b = Math.max(p.beta, 1e-8);
  const pers = Math.min(a + b, 1 - 1e-8);
  const phi = [p.mu, Math.log(p.omega), logit(pers), logit(a / (a + b))];
  if (innovations !== "normal") {
    const q = Math.max(-0.999999, Math.min(0.999999, p.shape / INNOVATION_SHAPE_CAP));
    phi.push(Math.atanh(q));
  }
  return Float64Array.from(phi);
}

/** dθ/dφ as a dense dim × dim matrix (row i: θᵢ, column j: φⱼ). */
function jacobian(phi: ArrayLike<number>, dim: number): Float64Array {
  const J = new Float64Array(dim * dim);
  const P = logistic(phi[2]);
  const S = logistic(phi[3]);
  const dP = P * (1 - P);
  const dS = S * (1 - S);
  J[0] = 1;
  J[1 * dim + 1] = Math.exp(phi[1]);
  J[2 * dim + 2] = S * dP;
  J[2 * dim + 3] = P * dS;
  J[3 * dim + 2] = (1 - S) * dP;
  J[3 * dim + 3] = -P * dS;
  if (dim === 5) {
    const th = Math.tanh(phi[4]);
    J[4 * dim + 4] = INNOVATION_SHAPE_CAP * (1 - th * th);
  }
  return J;
}

export interface GarchFitOptions {
  readonly innovations?: Innovations;
  /** Warm start (e.g. the previous window's estimate). */
  readonly start?: GarchParams;
  readonly maxPasses?: number;
  /** Stop when the predicted remaining gain is below this (log-likelihood units); default 1e-10. */
  readonly gainTolerance?: number;
}

export interface GarchEstimate {
  readonly params: GarchParams;
  readonly innovations: Innovations;
  readonly logLikelihood: number;
  readonly converged: boolean;
  /** Likelihood passes the optimizer spent (each is one sweep over the returns). */
  readonly passes: number;
  readonly iterations: number;
  /** "" or which constraint the solution sits on. */
  readonly boundary: string;
  readonly reason: string;
  readonly n: number;
}

/** Variance-targeting start: sample mean, α = 0.05, β = 0.90, ω = s²(1 − 0.95), k = 0. */
export function varianceTargetingStart(r: ArrayLike<number>): GarchParams {
  let m = 0;
  for (let i = 0; i < r.length; i++) m += r[i];
  m /= r.length;
  let v = 0;
  for (let i = 0; i < r.length; i++) v += (r[i] - m) * (r[i] - m);
  v /= r.length;
  return { mu: m, omega: v * 0.05, alpha: 0.05, beta: 0.9, shape: 0 };
}

function describeBoundary(p: GarchParams): string {
  const out: string[] = [];
  if (p.alpha < 1e-6) out.push("α at 0 (no reaction to news: the variance is a constant plus a decaying start)");
  if (p.beta < 1e-6) out.push("β at 0 (no memory: an ARCH(1) fit)");
  if (p.alpha + p.beta > 1 - 1e-6) out.push("α + β at 1 (integrated: no finite unconditional variance)");
  if (Math.abs(p.shape) > INNOVATION_SHAPE_CAP - 1e-6) out.push(`innovation shape at the cap |k| = ${INNOVATION_SHAPE_CAP}`);
  return out.join("; ");
}

/** Joint maximum likelihood of (μ, ω, α, β[, k]). n ≥ 10 finite returns with a positive spread are expected. */
export function fitGarch(r: ArrayLike<number>, options: GarchFitOptions = {}): GarchEstimate {
  const innovations = options.innovations ?? "gno";
  const dim = innovations === "normal" ? 4 : 5;
  const start = options.start ?? varianceTargetingStart(r);
  let passes = 0;
  const objective = (phi: Float64Array, wantOuter: boolean): Evaluation => {
    const p = fromTransformed(phi, innovations);
    const pass = garchLikelihood(r, p, innovations, wantOuter);
    passes++;
    if (!Number.isFinite(pass.logLikelihood)) return { value: -Infinity, gradient: pass.gradient };
    const J = jacobian(phi, dim);
    const g = new Float64Array(dim);
    for (let j = 0; j < dim; j++) {
      let s = 0;
      for (let i = 0; i < dim; i++) s += pass.gradient[i] * J[i * dim + j];
      g[j] = s;
    }
    let outer: Float64Array | undefined;
    if (wantOuter && pass.scores) {
      outer = new Float64Array(dim * dim);
      const row = new Float64Array(dim);
      for (let t = 0; t < r.length; t++) {
        for (let j = 0; j < dim; j++) {
          let s = 0;
          for (let i = 0; i < dim; i++) s += pass.scores[t * dim + i] * J[i * dim + j];
          row[j] = s;
        }
        for (let a = 0; a < dim; a++) for (let b = 0; b < dim; b++) outer[a * dim + b] += row[a] * row[b];
      }
    }
    return { value: pass.logLikelihood, gradient: g, outer };
  };
  let phi0 = toTransformed(start, innovations);
  if (!Number.isFinite(objective(phi0, false).value)) {
    phi0 = toTransformed({ ...varianceTargetingStart(r), shape: 0 }, innovations);
  }
  passes = 0;
  const settings = { maxEvaluations: options.maxPasses ?? 200, gainTolerance: options.gainTolerance ?? 1e-10 };
  let res = maximizeBfgs(objective, phi0, settings);
  if (!res.converged && options.start) {
    // a warm start that does not converge is retried cold (variance targeting); the better converged end is kept
    const cold = maximizeBfgs(objective, toTransformed(varianceTargetingStart(r), innovations), settings);
    if (cold.converged && (!res.converged || cold.value >= res.value)) res = cold;
  }
  const params = fromTransformed(res.x, innovations);
  const boundary = describeBoundary(params);
  return Object.freeze({
    params: Object.freeze(params),
    innovations,
    logLikelihood: res.value,
    converged: res.converged,
    passes,
    iterations: res.iterations,
    boundary,
    reason: res.reason,
    n: r.length,
  });
}

/** Natural parameter vector θ (length 4 or 5). */
export function garchVector(p: GarchParams, innovations: Innovations): number[] {
  return innovations === "normal" ? [p.mu, p.omega, p.alpha, p.beta] : [p.mu, p.omega, p.alpha, p.beta, p.shape];
}

export function garchFromVector(v: ArrayLike<number>, innovations: Innovations): GarchParams {
  return { mu: v[0], omega: v[1], alpha: v[2], beta: v[3], shape: innovations === "normal" ? 0 : v[4] };
}
