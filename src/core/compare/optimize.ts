/**
 * Small derivative-free maximisers shared by the comparison families (one home for both):
 * - goldenMaximise: golden-section search on a bracket (Kiefer 1953), for unimodal 1-D profiles;
 * - nelderMeadMaximise: the Nelder & Mead (1965) simplex with the standard coefficients (reflection 1,
 *   expansion 2, contraction ½, shrink ½) and one restart from the best vertex, which guards against the
 *   simplex collapsing early (common practice).
 * The objective may return −Infinity (outside the feasible set); such points are simply never preferred.
 * nelderMeadMaximiseWork is the same search as resumable work (one yield per simplex step).
 */
import { runToEnd, type Work } from "../work";

export interface Maximum1d {
  readonly x: number;
  readonly value: number;
  readonly evaluations: number;
}

const INV_PHI = (Math.sqrt(5) - 1) / 2;

/** Maximises f on [lo, hi] by golden-section search until the bracket is narrower than tol. */
export function goldenMaximise(f: (x: number) => number, lo: number, hi: number, tol: number): Maximum1d {
  return runToEnd(goldenMaximiseWork(f, lo, hi, tol));
}

/** goldenMaximise as resumable work: yields once per evaluation of f (progress unknown: NaN). */
export function* goldenMaximiseWork(f: (x: number) => number, lo: number, hi: number, tol: number): Work<Maximum1d> {
  let a = lo;
  let b = hi;
  let c = b - INV_PHI * (b - a);
  let d = a + INV_PHI * (b - a);
  let fc = f(c);
  yield NaN;
  let fd = f(d);
  yield NaN;
  let evaluations = 2;
  while (Math.abs(b - a) > tol && evaluations < 200) {
    if (fc >= fd) {
      b = d;
      d = c;
      fd = fc;
      c = b - INV_PHI * (b - a);
      fc = f(c);
    } else {
      a = c;
      c = d;
      fc = fd;
      d = a + INV_PHI * (b - a);
      fd = f(d);
    }
    yield NaN;
    evaluations++;
  }
  return fc >= fd ? { x: c, value: fc, evaluations } : { x: d, value: fd, evaluations };
}

export interface MaximumNd {
  readonly x: readonly number[];
  readonly value: number;
  readonly iterations: number;
  readonly converged: boolean;
}

function* simplexRun(
  f: (x: readonly number[]) => number,
  start: readonly number[],
  steps: readonly number[],
  tol: number,
  maxIterations: number,
): Work<MaximumNd> {
  const dim = start.length;
  const pts: number[][] = [start.slice()];
  for (let i = 0; i < dim; i++) {
    const p = start.slice();
    p[i] += steps[i];
    pts.push(p);
  }
  let vals = pts.map((p) => f(p));
  let iterations = 0;
  let converged = false;
  while (iterations < maxIterations) {
    yield iterations / maxIterations;
    iterations++;
    const order = vals.map((_, i) => i).sort((i, j) => vals[j] - vals[i]);
    const sorted = order.map((i) => pts[i]);
    const sv = order.map((i) => vals[i]);
    pts.splice(0, pts.length, ...sorted);
    vals = sv;
    const best = vals[0];
    const worst = vals[dim];
    let size = 0;
    for (let i = 1; i <= dim; i++) for (let j = 0; j < dim; j++) size = Math.max(size, Math.abs(pts[i][j] - pts[0][j]));
    if (Number.isFinite(worst) && Math.abs(best - worst) <= tol * (1 + Math.abs(best)) && size <= Math.sqrt(tol)) {
      converged = true;
      break;
    }
    const centroid = new Array<number>(dim).fill(0);
    for (let i = 0; i < dim; i++) for (let j = 0; j < dim; j++) centroid[j] += pts[i][j] / dim;
    const along = (t: number): number[] => centroid.map((c, j) => c + t * (pts[dim][j] - c));
    const xr = along(-1);
    const fr = f(xr);
    if (fr > vals[0]) {
      const xe = along(-2);
      const fe = f(xe);
      if (fe > fr) {
        pts[dim] = xe;
        vals[dim] = fe;
      } else {
        pts[dim] = xr;
        vals[dim] = fr;
      }
    } else if (fr > vals[dim - 1]) {
      pts[dim] = xr;
      vals[dim] = fr;
    } else {
      const outside = fr > vals[dim];
      const xc = along(outside ? -0.5 : 0.5);
      const fcv = f(xc);
      if (fcv > (outside ? fr : vals[dim])) {
        pts[dim] = xc;
        vals[dim] = fcv;
      } else {
        for (let i = 1; i <= dim; i++) {
          pts[i] = pts[i].map((v, j) => pts[0][j] + 0.5 * (v - pts[0][j]));
          vals[i] = f(pts[i]);
        }
      }
    }
  }
  let bi = 0;
  for (let i = 1; i < vals.length; i++) if (vals[i] > vals[bi]) bi = i;
  return { x: pts[bi], value: vals[bi], iterations, converged };
}

/**
 * Maximises f from `start` with initial simplex steps `steps`; converged when the simplex values agree to
 * tol (relative) and its vertices to √tol. Restarts once from the best vertex with the original steps.
 */
export function nelderMeadMaximise(
  f: (x: readonly number[]) => number,
  start: readonly number[],
  steps: readonly number[],
  tol = 1e-12,
  maxIterations = 4000,
): MaximumNd {
  return runToEnd(nelderMeadMaximiseWork(f, start, steps, tol, maxIterations));
}

/** nelderMeadMaximise as resumable work: yields once per simplex step (a handful of evaluations of f). */
export function* nelderMeadMaximiseWork(
  f: (x: readonly number[]) => number,
  start: readonly number[],
  steps: readonly number[],
  tol = 1e-12,
  maxIterations = 4000,
): Work<MaximumNd> {
  const first = yield* simplexRun(f, start, steps, tol, maxIterations);
  const second = yield* simplexRun(f, first.x, steps, tol, maxIterations);
  const best = second.value >= first.value ? second : first;
  return {
    x: best.x,
    value: best.value,
    iterations: first.iterations + second.iterations,
    converged: first.converged && second.converged,
  };
}
