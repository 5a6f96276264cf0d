/**
 * Safeguarded Newton ascent for the generalized normal log-likelihood.
 *
 * Parameterisation θ = (ξ, a = ln α, k) keeps the scale positive; the location step is measured in units
 * of the current scale (D = diag(α, 1, 1)) so the damping below is scale-free. Each iteration:
 *  1. analytic score g and Hessian H (likelihood.ts);
 *  2. modified Newton step: solve (−H_D + μI) s = g_D by Cholesky, with μ = 0 when −H is positive
 *     definite and otherwise increased (Levenberg–Marquardt style) until the factorisation succeeds;
 *  3. step cap (|Δξ/α| ≤ 1, |Δa| ≤ 1, |Δk| ≤ 0.5), then halving until the new point keeps every
 *     observation strictly inside the support (checked on the sample extremes, O(1)), respects the
 *     shape cap |k| ≤ kCap, and passes Armijo's sufficient-increase test (Nocedal & Wright 2006, §3.1).
 * Convergence: the Newton decrement gᵀ(−H)⁻¹g / 2 (the predicted remaining log-likelihood gain)
 * falls below 1e-10 + 1e-15·|ℓ| with −H positive definite, or below 1e-8 while ten times the gain predicted after
 * the next step (c·gain², c = gain / previous gain² after a full step: quadratic convergence, Nocedal & Wright
 * 2006, Thm 3.5) is below 1e-15·|ℓ|, the rounding level of ℓ; that last Newton step is then taken too, unevaluated
 * (value = ℓ + decrement/2, exact to O(decrement²)), so the end point is not left short of the maximum. A coordinate can be frozen (shape fixed) for the
 * profile likelihood. The step never crosses the support edge, so the iterate never becomes infeasible.
 */
import { likelihoodDerivativesWork } from "./likelihood";
import { runToEnd, type Work } from "../work";

export interface NewtonStart {
  readonly location: number;
  readonly scale: number;
  readonly shape: number;
}

export interface NewtonResult {
  readonly location: number;
  readonly scale: number;
  readonly shape: number;
  readonly value: number;
  /** Gradient in (ξ, ln α, k) with the ξ component multiplied by α (scale-free), at the end point. */
  readonly scaledGradient: readonly number[];
  /** Hessian in (ξ, ln α, k) at the end point (row-major 3×3). */
  readonly hessian: Float64Array;
  readonly iterations: number;
  readonly converged: boolean;
  /** −H positive definite at the end point (on the free coordinates). */
  readonly negativeDefinite: boolean;
  readonly reason: string;
}

export interface NewtonOptions {
  readonly maxIterations?: number;
  /** Keep the shape fixed at its start value. */
  readonly fixShape?: boolean;
  /** Largest |k| allowed (default 3). */
  readonly shapeCap?: number;
  /** Smallest and largest observation (used for the O(1) support check). */
  readonly min: number;
  readonly max: number;
  /**
   * Warm starts only: when the predicted gain gᵀ(−H)⁻¹g/2 at the start is already below this, take the one full
   * Newton step (if it stays feasible) and stop without evaluating the new point — the classical one-step
   * estimator from a start far inside the √n neighbourhood (Lehmann & Casella 1998, §6.4): its distance to the
   * maximum is of the order of the square of the start's, far below the sampling error.
   */
  readonly oneStepBelow?: number;
}

/** True when every observation in [min, max] lies strictly inside the support of (ξ, α, k). */
export function insideSupport(location: number, scale: number, shape: number, min: number, max: number): boolean {
  if (shape > 0) return 1 - (shape * (max - location)) / scale > 0;
  if (shape < 0) return 1 - (shape * (min - location)) / scale > 0;
  return true;
}

/**
 * Solve of (A + μI) s = b with the smallest μ = 10^j · max(1e-8·max|Aᵢᵢ|, 1e-8), j = 0, 1, …, that makes the matrix
 * positive definite (Levenberg's damping of a Newton step whose Hessian is not negative definite); null when no
 * finite μ does.
 */
export function dampedSolve(A: ArrayLike<number>, b: ArrayLike<number>, m: number): Float64Array | null {
  let diag = 0;
  for (let i = 0; i < m; i++) diag = Math.max(diag, Math.abs(A[i * m + i]));
  let mu = Math.max(1e-8 * diag, 1e-8);
  const B = new Float64Array(m * m);
  let step: Float64Array | null = null;
  while (!step && Number.isFinite(mu)) {
    for (let i = 0; i < m * m; i++) B[i] = A[i];
    for (let i = 0; i < m; i++) B[i * m + i] += mu;
    step = choleskySolve(B, b, m);
    mu *= 10;
  }
  return step;
}

/** Scratch for choleskySolve's factor and forward solve (sizes up to 4×4; the solve never re-enters). */
const CHOL_L = new Float64Array(16);
const CHOL_Y = new Float64Array(4);

/** Cholesky solve of A s = b for symmetric positive definite A (m×m, row-major); null if A is not PD (a new array). */
export function choleskySolve(A: ArrayLike<number>, b: ArrayLike<number>, m: number): Float64Array | null {
  const L = m <= 4 ? CHOL_L : new Float64Array(m * m);
  for (let i = 0; i < m; i++) {
    for (let j = 0; j <= i; j++) {
      let s = A[i * m + j];
      for (let q = 0; q < j; q++) s -= L[i * m + q] * L[j * m + q];
      if (i === j) {
        if (!(s > 0)) return null;
        L[i * m + i] = Math.sqrt(s);
      } else L[i * m + j] = s / L[j * m + j];
    }
  }
  const y = m <= 4 ? CHOL_Y : new Float64Array(m);
  for (let i = 0; i < m; i++) {
    let s = b[i];
    for (let q = 0; q < i; q++) s -= L[i * m + q] * y[q];
    y[i] = s / L[i * m + i];
  }
  const x = new Float64Array(m);
  for (let i = m - 1; i >= 0; i--) {
    let s = y[i];
    for (let q = i + 1; q < m; q++) s -= L[q * m + i] * x[q];
    x[i] = s / L[i * m + i];
  }
  return x;
}

/** Maximises the log-likelihood from a feasible start. Never returns NaN parameters. */
export function newtonAscent(data: ArrayLike<number>, start: NewtonStart, opts: NewtonOptions): NewtonResult {
  return runToEnd(newtonAscentWork(data, start, opts));
}

/**
 * newtonAscent as resumable work: yields (NaN, progress unknown) after every pass over the data — each score and
 * Hessian evaluation, including every trial point of the line search — and inside a pass after every PASS_CHUNK
 * (131,072) observations, so a caller is never held for more than one chunk (under ~20 ms in plain node). Same
 * arithmetic, same result as newtonAscent.
 */
export function* newtonAscentWork(data: ArrayLike<number>, start: NewtonStart, opts: NewtonOptions): Work<NewtonResult> {
  const maxIt = opts.maxIterations ?? 100;
  const cap = opts.shapeCap ?? 3;
  const m = opts.fixShape ? 2 : 3;
  let xi = start.location;
  let a = Math.log(start.scale);
  let k = start.shape;
  let cur = yield* likelihoodDerivativesWork(data, xi, a, k);
  yield NaN;
  const done = (it: number, converged: boolean, negDef: boolean, reason: string): NewtonResult => {
    const d = cur!;
    const al = Math.exp(a);
    return {
      location: xi,
      scale: al,
      shape: k,
      value: d.value,
      scaledGradient: [d.gradient[0] * al, d.gradient[1], opts.fixShape ? 0 : d.gradient[2]],
      hessian: d.hessian,
      iterations: it,
      converged,
      negativeDefinite: negDef,
      reason,
    };
  };
  if (!cur || !Number.isFinite(cur.value)) {
    cur = null;
    return {
      location: xi, scale: Math.exp(a), shape: k, value: -Infinity, scaledGradient: [NaN, NaN, NaN],
      hessian: new Float64Array(9).fill(NaN), iterations: 0, converged: false, negativeDefinite: false,
      reason: "the starting point leaves observations outside the support",
    };
  }
  /** The predicted gain of the last step when it was a full Newton step (0 otherwise): for the stopping rule. */
  let lastFullGain = 0;
  // the scaled system's buffers, one pair per ascent (reused by every iteration; an ascent may be suspended at a
  // yield while another runs, so they are not module scratch)
  const gD = new Float64Array(m);
  const A = new Float64Array(m * m);
  for (let it = 0; it < maxIt; it++) {
    const al = Math.exp(a);
    const g = cur.gradient;
    const H = cur.hessian;
    // scaled system on the free coordinates: D = diag(α, 1, 1)
    for (let i = 0; i < m; i++) {
      const di = i === 0 ? al : 1;
      gD[i] = g[i] * di;
      for (let j = 0; j < m; j++) A[i * m + j] = -H[i * 3 + j] * di * (j === 0 ? al : 1);
    }
    let step = choleskySolve(A, gD, m);
    const negDef = step !== null;
    if (step) {
      let dec = 0;
      for (let i = 0; i < m; i++) dec += gD[i] * step[i];
      // Newton's gain shrinks quadratically near the maximum: gain_next ≈ c·gain², with c estimated from the last
      // two gains when the step between them was a full one. When even 10× that prediction is below the rounding
      // level of ℓ, the pass that would verify it can change nothing and is skipped.
      const gain = dec / 2;
      const c = lastFullGain > 0 ? gain / (lastFullGain * lastFullGain) : Infinity;
      const negligible = gain < 1e-8 && 10 * c * gain * gain <= 1e-15 * Math.max(1, Math.abs(cur.value));
      if (gain < 1e-10 + 1e-15 * Math.abs(cur.value) || negligible) {
        // converged: take the last Newton step as well (it closes the remaining gain, below 1e-10 + 1e-15|ℓ|, to
        // O(gain²)) when it stays feasible; the value is the quadratic model's, score and Hessian those of the
        // evaluated point
        const nxi = xi + step[0] * al;
        const na = a + step[1];
        const nk = m === 3 ? k + step[2] : k;
        const d = cur;
        if (Math.abs(nk) <= cap && insideSupport(nxi, Math.exp(na), nk, opts.min, opts.max)) {
          return { ...done(it, true, true, "converged"), location: nxi, scale: Math.exp(na), shape: nk, value: d.value + dec / 2 };
        }
        return done(it, true, true, "converged");
      }
      if (opts.oneStepBelow !== undefined && dec / 2 < opts.oneStepBelow) {
        const nxi = xi + step[0] * al;
        const na = a + step[1];
        const nk = m === 3 ? k + step[2] : k;
        if (Math.abs(nk) <= cap && insideSupport(nxi, Math.exp(na), nk, opts.min, opts.max)) {
          const d = cur;
          return {
            location: nxi, scale: Math.exp(na), shape: nk, value: d.value + dec / 2,
            scaledGradient: [0, 0, 0], hessian: d.hessian, iterations: it + 1, converged: true, negativeDefinite: true,
            reason: "converged (one Newton step from a warm start)",
          };
        }
      }
    } else {
      step = dampedSolve(A, gD, m);
      if (!step) return done(it, false, false, "the Hessian could not be regularised");
    }
    // step in θ and caps
    let gainHere = 0;
    for (let i = 0; i < m; i++) gainHere += gD[i] * step[i];
    gainHere = negDef ? gainHere / 2 : 0;
    const s = [step[0] * al, step[1], m === 3 ? step[2] : 0];
    let scale = 1;
    const big = Math.max(Math.abs(step[0]), Math.abs(step[1]), Math.abs(s[2]) * 2);
    if (big > 1) scale = 1 / big;
    let slope = 0;
    for (let i = 0; i < m; i++) slope += gD[i] * step[i];
    let accepted = false;
    for (let tries = 0; tries < 60; tries++) {
      const nxi = xi + scale * s[0];
      const na = a + scale * s[1];
      const nk = k + scale * s[2];
      const nal = Math.exp(na);
      if (Math.abs(nk) <= cap && insideSupport(nxi, nal, nk, opts.min, opts.max)) {
        const next = yield* likelihoodDerivativesWork(data, nxi, na, nk);
        yield NaN;
        if (next && next.value >= cur.value + 1e-4 * scale * slope) {
          xi = nxi;
          a = na;
          k = nk;
          cur = next;
          accepted = true;
          lastFullGain = scale === 1 ? gainHere : 0;
          break;
        }
      }
      scale *= 0.5;
    }
    if (!accepted) {
      // no representable increase along the Newton direction: at the maximum to rounding, or stuck
      const gNorm = Math.max(Math.abs(gD[0]), Math.abs(gD[1]), m === 3 ? Math.abs(gD[2]) : 0);
      const flat = negDef && gNorm <= 1e-6 * Math.max(1, Math.sqrt(data.length));
      return done(it, flat, negDef, flat ? "converged (no further increase representable)" : "the line search could not increase the likelihood");
    }
  }
  const A3 = new Float64Array(m * m);
  const al = Math.exp(a);
  const dsc = [al, 1, 1];
  for (let i = 0; i < m; i++) for (let j = 0; j < m; j++) A3[i * m + j] = -cur.hessian[i * 3 + j] * dsc[i] * dsc[j];
  const nd = choleskySolve(A3, new Float64Array(m), m) !== null;
  return done(maxIt, false, nd, `no convergence within ${maxIt} iterations`);
}
