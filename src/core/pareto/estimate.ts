/**
 * Estimators of the generalized Pareto law from excesses over a threshold.
 *
 * Maximum likelihood by Grimshaw's (1993, Technometrics 35:185–191) one-dimensional reduction: with θ = ξ/β,
 * the likelihood is maximised over ξ for fixed θ by ξ(θ) = mean log1p(θy), leaving the profile
 *   ℓ*(θ) = −n·[ln h(θ) + θ·h(θ) + 1],  h(θ) = mean(log1p(θy)/θ) = β(θ),  θ > −1/max y,
 * with analytic derivative ℓ*′(θ) = −n·[h′/h + h + θh′], h′(θ) = mean(y²·D(θy)) (D from likelihood.ts,
 * series near 0, so θ = 0, the exponential law, is an ordinary point). The profile is scanned on a grid in
 * τ = θ·max y (log-spaced on both sides of 0; the likelihood can have two local maxima, Grimshaw's point), and
 * the probability-weighted-moment estimate is added to the grid as a start, and
 * the best grid cell is refined by a bracketed root search on ℓ*′ (Illinois false position with bisection
 * fallback) — no simplex. Standard errors from the inverse of the analytic observed information.
 * A maximum at τ → −1 means ξ ≤ −1, where the likelihood is unbounded (Smith 1985): reported, not returned
 * as a regular fit. fitGpdWork is the same estimate as resumable work: one step per profile evaluation (one pass
 * over the excesses), so a tail of 100,000 excesses is never one long block.
 *
 * Probability-weighted moments (Hosking & Wallis 1987, Technometrics 29:339–349, with their k = −ξ): on the
 * ascending excesses y₍ⱼ₎ with plotting positions pⱼ = (j − 0.35)/n (their recommended choice),
 *   a₀ = mean y,  a₁ = mean y₍ⱼ₎(1 − pⱼ),  ξ = 2 − a₀/(a₀ − 2a₁),  β = 2a₀a₁/(a₀ − 2a₁),
 * with their asymptotic covariance (valid for ξ < 1/2):
 *   n(1 − 2ξ)(3 − 2ξ)·Var ξ = (1 − ξ)(2 − ξ)²(1 − ξ + 2ξ²),
 *   n(1 − 2ξ)(3 − 2ξ)·Var β = β²(7 − 18ξ + 11ξ² − 2ξ³),
 *   n(1 − 2ξ)(3 − 2ξ)·Cov = β(2 − ξ)(2 − 6ξ + 7ξ² − 2ξ³).
 */
import type { GpdParams } from "./gpd";
import { log1pRatio } from "./gpd";
import { gpdDerivatives, gpdLogLikelihood, ratioSlope } from "./likelihood";
import { done, runToEnd, type Work } from "../work";
import { sortedCopy } from "../sort";

export type GpdMethod = "mle" | "pwm";
export const GPD_METHODS: readonly GpdMethod[] = ["mle", "pwm"];

export interface GpdFit {
  readonly method: GpdMethod;
  /** Number of excesses used. */
  readonly n: number;
  readonly params: GpdParams;
  /** (se ξ, se β); null when unavailable (information not positive definite, or PWM with ξ ≥ 1/2). */
  readonly standardErrors: readonly [number, number] | null;
  /** 2×2 covariance in the order (ξ, β), or null. */
  readonly covariance: readonly [readonly [number, number], readonly [number, number]] | null;
  readonly logLikelihood: number;
  /** For "mle": an interior maximum was found; for "pwm": the estimate exists (a₀ > 2a₁). */
  readonly converged: boolean;
  /** ξ ≥ 1/2: the tail has infinite variance. */
  readonly infiniteVariance: boolean;
  /** ξ ≥ 1: the tail has infinite mean; expected shortfall does not exist. */
  readonly infiniteMean: boolean;
  readonly warnings: readonly string[];
}

/** Fewest excesses any estimator accepts (a two-parameter fit). */
export const MIN_EXCESSES = 3;

function profile(y: ArrayLike<number>, theta: number): { value: number; slope: number; h: number } {
  const n = y.length;
  let h = 0;
  let dh = 0;
  for (let i = 0; i < n; i++) {
    const a = theta * y[i];
    h += y[i] * log1pRatio(a);
    dh += y[i] * y[i] * ratioSlope(a);
  }
  h /= n;
  dh /= n;
  return { value: -n * (Math.log(h) + theta * h + 1), slope: -n * (dh / h + h + theta * dh), h };
}

/** ℓ*(θ) and β(θ) = h(θ) only (the grid scan needs no slope). */
function profileValue(y: ArrayLike<number>, theta: number): { value: number; h: number } {
  const n = y.length;
  let h = 0;
  for (let i = 0; i < n; i++) h += y[i] * log1pRatio(theta * y[i]);
  h /= n;
  return { value: -n * (Math.log(h) + theta * h + 1), h };
}

/** Grid in τ = θ·max y: towards −1 geometrically, 0, and log-spaced positive values up to 1e10. */
function tauGrid(): number[] {
  const g: number[] = [];
  for (let j = 24; j >= 1; j--) g.push(-(1 - Math.pow(10, -j / 2)));
  for (let j = 0; j <= 8; j++) g.push(-Math.pow(10, -1 - j / 2));
  g.push(0);
  for (let j = -24; j <= 40; j++) g.push(Math.pow(10, j / 4));
  return g.sort((a, b) => a - b);
}
const TAU_GRID = tauGrid();

function covarianceFrom(info: readonly (readonly number[])[]): GpdFit["covariance"] {
  const [[a, b], [, d]] = info;
  const det = a * d - b * b;
  if (!(a > 0 && d > 0 && det > 0) || !Number.isFinite(det)) return null;
  return [
    [d / det, -b / det],
    [-b / det, a / det],
  ];
}

function flags(xi: number, n: number): { infiniteVariance: boolean; infiniteMean: boolean; warnings: string[] } {
  const warnings: string[] = [];
  const infiniteMean = xi >= 1;
  const infiniteVariance = xi >= 0.5;
  if (infiniteMean) warnings.push(`ξ = ${xi.toPrecision(3)} ≥ 1: the tail has an infinite mean, so expected shortfall does not exist.`);
  else if (infiniteVariance) warnings.push(`ξ = ${xi.toPrecision(3)} ≥ 0.5: the tail has an infinite variance; ES exists but is very uncertain.`);
  if (n < 30) warnings.push(`Only ${n} exceedances: tail estimates are very uncertain (30 or more is common practice).`);
  return { infiniteVariance, infiniteMean, warnings };
}

function finish(method: GpdMethod, y: ArrayLike<number>, params: GpdParams, converged: boolean, extra: string[], cov: GpdFit["covariance"]): GpdFit {
  const f = flags(params.shape, y.length);
  return Object.freeze({
    method,
    n: y.length,
    params: Object.freeze({ ...params }),
    standardErrors: cov ? ([Math.sqrt(cov[0][0]), Math.sqrt(cov[1][1])] as const) : null,
    covariance: cov,
    logLikelihood: gpdLogLikelihood(y, params),
    converged,
    infiniteVariance: f.infiniteVariance,
    infiniteMean: f.infiniteMean,
    warnings: Object.freeze([...extra, ...f.warnings]),
  });
}

function checkExcesses(y: ArrayLike<number>): number {
  if (y.length < MIN_EXCESSES) throw new RangeError(`at least ${MIN_EXCESSES} excesses are needed (got ${y.length}).`);
  let max = 0;
  for (let i = 0; i < y.length; i++) {
    if (!(y[i] >= 0) || !Number.isFinite(y[i])) throw new RangeError("excesses must be finite and not negative.");
    if (y[i] > max) max = y[i];
  }
  if (!(max > 0)) throw new RangeError("all excesses are 0: no tail to fit.");
  return max;
}

/** Hosking & Wallis (1987) probability-weighted-moment estimate, plotting positions (j − 0.35)/n. */
export function fitGpdPwm(excesses: ArrayLike<number>): GpdFit {
  checkExcesses(excesses);
  const y = sortedCopy(excesses);
  const n = y.length;
  let a0 = 0;
  let a1 = 0;
  for (let j = 0; j < n; j++) {
    a0 += y[j];
    a1 += y[j] * (1 - (j + 1 - 0.35) / n);
  }
  a0 /= n;
  a1 /= n;
  const d = a0 - 2 * a1;
  if (!(d > 0)) {
    return finish("pwm", y, { shape: NaN, scale: NaN }, false, ["The probability-weighted moments admit no generalized Pareto law (a₀ ≤ 2a₁)."], null);
  }
  const xi = 2 - a0 / d;
  const beta = (2 * a0 * a1) / d;
  let cov: GpdFit["covariance"] = null;
  if (xi < 0.5) {
    const den = n * (1 - 2 * xi) * (3 - 2 * xi);
    const vXi = ((1 - xi) * (2 - xi) * (2 - xi) * (1 - xi + 2 * xi * xi)) / den;
    const vBeta = (beta * beta * (7 - 18 * xi + 11 * xi * xi - 2 * xi * xi * xi)) / den;
    const c = (beta * (2 - xi) * (2 - 6 * xi + 7 * xi * xi - 2 * xi * xi * xi)) / den;
    cov = [
      [vXi, c],
      [c, vBeta],
    ];
  }
  const extra = cov ? [] : ["No standard errors: the probability-weighted-moment covariance needs ξ < 0.5."];
  return finish("pwm", y, { shape: xi, scale: beta }, true, extra, cov);
}

/** Root of the profile slope between lo and hi (slope(lo) > 0 > slope(hi)) by Illinois false position. */
function* slopeRoot(y: ArrayLike<number>, lo: number, hi: number, fLo: number, fHi: number): Work<number> {
  let a = lo;
  let b = hi;
  let fa = fLo;
  let fb = fHi;
  let side = 0;
  for (let it = 0; it < 200; it++) {
    let c = (a * fb - b * fa) / (fb - fa);
    if (!(c > Math.min(a, b) && c < Math.max(a, b))) c = (a + b) / 2;
    const fc = profile(y, c).slope;
    yield NaN;
    if (fc === 0) return c;
    if (Math.sign(fc) === Math.sign(fb)) {
      b = c;
      fb = fc;
      if (side === -1) fa /= 2;
      side = -1;
    } else {
      a = c;
      fa = fc;
      if (side === 1) fb /= 2;
      side = 1;
    }
    if (Math.abs(b - a) <= 4e-16 * Math.max(Math.abs(a), Math.abs(b)) + 1e-300) break;
  }
  return Math.abs(fa) < Math.abs(fb) ? a : b;
}

/** The τ grid with the probability-weighted-moment estimate's τ = (ξ/β)·max y added as a start when it exists. */
function gridWithStart(y: Float64Array, max: number): number[] {
  const start = fitGpdPwm(y).params;
  const tau = (start.shape / start.scale) * max;
  if (!(tau > -1 && tau < TAU_GRID[TAU_GRID.length - 1]) || TAU_GRID.includes(tau)) return TAU_GRID;
  return [...TAU_GRID, tau].sort((a, b) => a - b);
}

/** Maximum likelihood by Grimshaw's reduction; observed-information standard errors. */
export function fitGpdMle(excesses: ArrayLike<number>): GpdFit {
  return runToEnd(fitGpdMleWork(excesses));
}

/** fitGpdMle as resumable work: yields after the start and after every profile evaluation. */
export function* fitGpdMleWork(excesses: ArrayLike<number>): Work<GpdFit> {
  const max = checkExcesses(excesses);
  const y = Float64Array.from(excesses);
  const grid = gridWithStart(y, max);
  yield 0;
  // The likelihood is unbounded where ξ < −1 (the density is infinite at the end of the tail), so only the
  // region ξ(θ) > −1 is searched: a maximum on its edge is no regular maximum (Smith 1985).
  const values: number[] = [];
  for (const tau of grid) {
    const pr = profileValue(y, tau / max);
    values.push((tau / max) * pr.h > -1 ? pr.value : -Infinity);
    yield (0.8 * values.length) / grid.length;
  }
  let best = -1;
  for (let i = 0; i < values.length; i++) if (Number.isFinite(values[i]) && (best < 0 || values[i] > values[best])) best = i;
  const extra: string[] = [];
  let theta: number;
  let converged = true;
  const edge = best <= 0 || best === grid.length - 1 || !Number.isFinite(values[best - 1]) || !Number.isFinite(values[best + 1]);
  if (best < 0 || edge) {
    converged = false;
    theta = best < 0 ? grid[0] / max : grid[best] / max;
    extra.push(
      best < grid.length - 1
        ? "No interior likelihood maximum: the likelihood rises towards ξ ≤ −1 (a bounded tail ending at the largest excess)."
        : "No interior likelihood maximum: the likelihood rises towards an extremely heavy tail.",
    );
  } else {
    const lo = grid[best - 1] / max;
    const hi = grid[best + 1] / max;
    const sLo = profile(y, lo).slope;
    const sHi = profile(y, hi).slope;
    yield 0.8;
    const mid = grid[best] / max;
    const sMid = profile(y, mid).slope;
    if (sMid === 0) theta = mid;
    else if (sMid > 0 && sHi < 0) theta = yield* slopeRoot(y, mid, hi, sMid, sHi);
    else if (sMid < 0 && sLo > 0) theta = yield* slopeRoot(y, lo, mid, sLo, sMid);
    else theta = mid;
  }
  yield 0.95;
  const h = profile(y, theta).h;
  const params: GpdParams = { shape: theta * h, scale: h };
  const d = gpdDerivatives(y, params);
  const cov = converged ? covarianceFrom(d.information) : null;
  if (converged && !cov) extra.push("No standard errors: the observed information is not positive definite at the estimate.");
  if (params.shape <= -0.5 && converged) extra.push("ξ ≤ −0.5: the maximum-likelihood estimate is not regular there (Smith 1985); standard errors are unreliable.");
  return finish("mle", y, params, converged, extra, cov);
}

/** The estimate by `method`. */
export function fitGpd(excesses: ArrayLike<number>, method: GpdMethod = "mle"): GpdFit {
  return method === "pwm" ? fitGpdPwm(excesses) : fitGpdMle(excesses);
}

/** fitGpd as resumable work (the probability-weighted moments are one sort and one pass: a single step). */
export function fitGpdWork(excesses: ArrayLike<number>, method: GpdMethod = "mle"): Work<GpdFit> {
  return method === "pwm" ? done(fitGpdPwm(excesses)) : fitGpdMleWork(excesses);
}
