/**
 * Quasi-Newton maximization with an analytic gradient: BFGS (Nocedal & Wright 2006, Numerical Optimization,
 * 2nd ed., Alg. 6.1) on an unconstrained parameterization chosen by the caller, so constraints hold by
 * construction. The initial inverse curvature is the inverse outer product of the per-observation scores (the
 * BHHH matrix; Berndt, Hall, Hall & Hausman 1974), which for a likelihood already has the right scale in every
 * direction, so the first step is close to a Newton step. Line search: the full step first, then backtracking
 * with the Armijo condition (c₁ = 1e-4), interpolating a quadratic from the slope; the curvature update is
 * skipped when sᵀy ≤ 0; when the line search fails on a stale curvature model, B restarts once from the BHHH
 * matrix at the current point. Stops when the predicted gain ½gᵀBg falls below `gainTolerance` (log-likelihood units).
 * Each objective evaluation is one pass over the data and is counted.
 */
import { runToEnd, type Work } from "../work";
import { inverseSpd, multiply } from "./matrix";

/** One evaluation: value (−Infinity when infeasible), gradient, and optionally the score outer product. */
export interface Evaluation {
  readonly value: number;
  readonly gradient: Float64Array;
  readonly outer?: Float64Array;
}

export type Objective = (x: Float64Array, wantOuter: boolean) => Evaluation;

export interface MaximizeOptions {
  readonly maxEvaluations?: number;
  readonly gainTolerance?: number;
}

export interface MaximizeResult {
  readonly x: Float64Array;
  readonly value: number;
  readonly gradient: Float64Array;
  readonly converged: boolean;
  readonly evaluations: number;
  readonly iterations: number;
  readonly reason: string;
}

export function maximizeBfgs(f: Objective, x0: Float64Array, options: MaximizeOptions = {}): MaximizeResult {
  return runToEnd(maximizeBfgsWork(f, x0, options));
}

/**
 * maximizeBfgs as resumable work: yields after every objective evaluation (one likelihood pass), the fraction of
 * the evaluation budget used so far. Same arithmetic and result as maximizeBfgs.
 */
export function* maximizeBfgsWork(f: Objective, x0: Float64Array, options: MaximizeOptions = {}): Work<MaximizeResult> {
  const n = x0.length;
  const maxEval = options.maxEvaluations ?? 200;
  const tol = options.gainTolerance ?? 1e-10;
  let x = Float64Array.from(x0);
  let cur = f(x, true);
  let evaluations = 1;
  yield evaluations / maxEval;
  if (!Number.isFinite(cur.value)) {
    return { x, value: cur.value, gradient: cur.gradient, converged: false, evaluations, iterations: 0, reason: "the starting point is infeasible" };
  }
  let B = cur.outer ? inverseSpd(cur.outer, n) : null;
  if (!B) {
    B = new Float64Array(n * n);
    for (let i = 0; i < n; i++) B[i * n + i] = 1e-2;
  }
  let iterations = 0;
  let fresh = true;
  for (;;) {
    const d = multiply(B, cur.gradient, n);
    let slope = 0;
    for (let i = 0; i < n; i++) slope += cur.gradient[i] * d[i];
    if (!(slope > 0)) {
      // not an ascent direction: reset to the scaled gradient
      B = new Float64Array(n * n);
      for (let i = 0; i < n; i++) B[i * n + i] = 1e-4;
      continue;
    }
    if (slope / 2 < tol) return { x, value: cur.value, gradient: cur.gradient, converged: true, evaluations, iterations, reason: "converged" };
    if (evaluations >= maxEval) break;
    let step = 1;
    let next: Evaluation | null = null;
    let xn = new Float64Array(n);
    while (evaluations < maxEval) {
      for (let i = 0; i < n; i++) xn[i] = x[i] + step * d[i];
      const e = f(xn, false);
      evaluations++;
      yield evaluations / maxEval;
      if (Number.isFinite(e.value) && e.value >= cur.value + 1e-4 * step * slope) {
        next = e;
        break;
      }
      if (Number.isFinite(e.value)) {
        // maximum of the quadratic through value, slope and the trial value, kept within [0.1, 0.5] of the step
        const drop = cur.value + step * slope - e.value;
        const s = drop > 0 ? (slope * step * step) / (2 * drop) : step / 2;
        step = Math.min(0.5 * step, Math.max(0.1 * step, s));
      } else step *= 0.25;
      if (step < 1e-12) break;
    }
    if (!next) {
      if (!fresh && evaluations < maxEval) {
        // the curvature model went stale: restart once from the score outer product at the current point
        const e = f(x, true);
        evaluations++;
        yield evaluations / maxEval;
        const inv = e.outer ? inverseSpd(e.outer, n) : null;
        if (inv) {
          B = inv;
          fresh = true;
          continue;
        }
      }
      return { x, value: cur.value, gradient: cur.gradient, converged: slope / 2 < 1e-6, evaluations, iterations, reason: "the line search could not improve the likelihood" };
    }
    fresh = false;
    iterations++;
    const s = new Float64Array(n);
    const y = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      s[i] = xn[i] - x[i];
      // maximizing: curvature of −f, so y = −(g₊ − g)
      y[i] = cur.gradient[i] - next.gradient[i];
    }
    let sy = 0;
    for (let i = 0; i < n; i++) sy += s[i] * y[i];
    if (sy > 1e-300) {
      const By = multiply(B, y, n);
      let yBy = 0;
      for (let i = 0; i < n; i++) yBy += y[i] * By[i];
      const rho = 1 / sy;
      const nb = new Float64Array(n * n);
      for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) {
        nb[i * n + j] = B[i * n + j] - rho * (By[i] * s[j] + s[i] * By[j]) + (rho * rho * yBy + rho) * s[i] * s[j];
      }
      B = nb;
    }
    x = xn;
    xn = new Float64Array(n);
    cur = next;
  }
  return { x, value: cur.value, gradient: cur.gradient, converged: false, evaluations, iterations, reason: `no convergence within ${maxEval} likelihood passes` };
}
