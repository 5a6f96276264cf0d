/**
 * The body of the spliced law by maximum likelihood given its thresholds. The spliced likelihood factorizes:
 *   ℓ = Σ_{u_L ≤ xᵢ ≤ u_U} ln f_b(xᵢ) + n_L·ln F_b(u_L) + n_U·ln(1 − F_b(u_U)) + (tail terms in ξ, β only),
 * so the body's estimate maximizes the body likelihood with the tail observations censored at the thresholds
 * (it is the spliced law's maximum-likelihood body, and it makes the tail masses F_b(u) follow the counts beyond
 * the thresholds rather than the body's compromise with the extremes). Maximized by BFGS with the analytic
 * gradient (src/core/vol/maximize.ts) in θ = (ξ, ln α, k), scaled at the start by the full-data observed
 * information. Censored terms: d ln Φ(y)/dθ = λ(y)·∂y/∂θ, λ = φ/Φ, with
 *   ∂y/∂ξ = −E/α,  ∂y/∂ln α = −tE,  ∂y/∂k = y²·g(ky),  t = (u − ξ)/α, E = 1/(1 − kt), g(z) = (eᶻ − 1 − z)/z²
 * (as in src/core/fit/likelihood.ts; g by its series below |z| = 0.5).
 * As resumable work (fitCensoredBodyWork): one step for the split of the data, the full-data information at the
 * start as a chunked pass, then one step per likelihood pass of the search (at most 300).
 */
import { likelihoodDerivatives, likelihoodDerivativesWork } from "../fit";
import { reducedVariate, type GnoParams } from "../gno";
import { logNormalCdf } from "../normal";
import { runToEnd, stage, type Work } from "../work";
import { maximizeBfgsWork } from "../vol/maximize";

const HALF_LOG_2PI = 0.9189385332046728;

function gSeries(z: number): number {
  if (Math.abs(z) >= 0.5) return (Math.expm1(z) - z) / (z * z);
  let s = 0;
  let term = 0.5;
  for (let n = 0; n < 18; n++) {
    s += term;
    term *= z / (n + 3);
  }
  return s;
}

/** ln Φ(±y(u)) and its gradient in (ξ, ln α, k); sign +1 for F_b(u), −1 for 1 − F_b(u). */
function censoredTerm(u: number, p: GnoParams, sign: number): { value: number; gradient: number[] } | null {
  const y = reducedVariate(u, p);
  if (!Number.isFinite(y)) return null;
  const t = (u - p.location) / p.scale;
  const e = 1 / (1 - p.shape * t);
  const value = logNormalCdf(sign * y);
  const lambda = Math.exp(-0.5 * y * y - HALF_LOG_2PI - value);
  const dy = [-e / p.scale, -t * e, y * y * gSeries(p.shape * y)];
  return { value, gradient: dy.map((d) => sign * lambda * d) };
}

export interface CensoredBodyFit {
  readonly params: GnoParams;
  readonly logLikelihood: number;
  readonly converged: boolean;
  readonly reason: string;
}

/** Body ML with the observations below `lower` and above `upper` censored there (null: no tail on that side). */
export function fitCensoredBody(data: ArrayLike<number>, lower: number | null, upper: number | null, start: GnoParams): CensoredBodyFit {
  return runToEnd(fitCensoredBodyWork(data, lower, upper, start));
}

/** fitCensoredBody as resumable work: yields after the split, within the start's information pass, after every pass. */
export function* fitCensoredBodyWork(data: ArrayLike<number>, lower: number | null, upper: number | null, start: GnoParams): Work<CensoredBodyFit> {
  // two passes into a typed array (no growing array): the same observations in the same order
  let nL = 0;
  let nU = 0;
  for (let i = 0; i < data.length; i++) {
    const x = data[i];
    if (lower !== null && x < lower) nL++;
    else if (upper !== null && x > upper) nU++;
  }
  const body = new Float64Array(data.length - nL - nU);
  for (let i = 0, j = 0; i < data.length; i++) {
    const x = data[i];
    if (!((lower !== null && x < lower) || (upper !== null && x > upper))) body[j++] = x;
  }
  yield 0.02;
  // the scaling matrix depends on the start only: one (chunked) pass over all the data, made once
  const full = yield* stage(likelihoodDerivativesWork(data, start.location, Math.log(start.scale), start.shape, true), 0.02, 0.1);
  const startOuter = full ? Float64Array.from(full.hessian, (h) => -h) : undefined;
  const objective = (th: Float64Array, wantOuter: boolean) => {
    const d = likelihoodDerivatives(body, th[0], th[1], th[2], false);
    const p = { location: th[0], scale: Math.exp(th[1]), shape: th[2] };
    const gradient = new Float64Array(3);
    if (!d || !Number.isFinite(d.value)) return { value: -Infinity, gradient };
    let value = d.value;
    for (let i = 0; i < 3; i++) gradient[i] = d.gradient[i];
    for (const [u, n, sign] of [
      [lower, nL, 1],
      [upper, nU, -1],
    ] as const) {
      if (u === null || n === 0) continue;
      const c = censoredTerm(u, p, sign);
      if (!c || !Number.isFinite(c.value)) return { value: -Infinity, gradient };
      value += n * c.value;
      for (let i = 0; i < 3; i++) gradient[i] += n * c.gradient[i];
    }
    const outer = wantOuter && startOuter ? Float64Array.from(startOuter) : undefined;
    return { value, gradient, outer };
  };
  const r = yield* stage(maximizeBfgsWork(objective, Float64Array.of(start.location, Math.log(start.scale), start.shape), { maxEvaluations: 300, gainTolerance: 1e-9 }), 0.1, 1);
  return Object.freeze({
    params: Object.freeze({ location: r.x[0], scale: Math.exp(r.x[1]), shape: r.x[2] }),
    logLikelihood: r.value,
    converged: r.converged,
    reason: r.reason,
  });
}
