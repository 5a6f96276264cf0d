/**
 * Test-side simulation of GARCH(1,1) with standardized generalized-normal innovations, written from the published
 * law (Hosking & Wallis 1997, App. A.8: X = ξ + α(1 − e^{−kY})/k, Y standard normal) and its lognormal moments
 * (Johnson, Kotz & Balakrishnan 1994, ch. 14: mean ξ + α(1 − e^{k²/2})/k, variance α²e^{k²}(e^{k²} − 1)/k²),
 * independently of src/core/vol. Draws: the project's seeded uniform stream through Φ⁻¹ (src/core/normal).
 */
import { normalQuantile } from "../../../src/core/normal";
import { uniformStream } from "../../../src/core/random";

/** (ξ, α) of the mean-0 variance-1 law of shape k, from the textbook moment formulas. */
export function standardized(k: number): { xi: number; alpha: number } {
  if (k === 0) return { xi: 0, alpha: 1 };
  const e = Math.exp(k * k);
  const alpha = Math.abs(k) / Math.sqrt(e * (e - 1));
  const xi = -alpha * (1 - Math.exp((k * k) / 2)) / k;
  return { xi, alpha };
}

export interface SimParams {
  mu: number;
  omega: number;
  alpha: number;
  beta: number;
  k: number;
}

/** n returns of the process, started at the unconditional variance; also the true σₜ. */
export function simulateGarch(p: SimParams, n: number, seed: number): { returns: Float64Array; sigmas: Float64Array } {
  const u = uniformStream(seed);
  const s = standardized(p.k);
  const returns = new Float64Array(n);
  const sigmas = new Float64Array(n);
  let h = p.omega / (1 - p.alpha - p.beta);
  for (let t = 0; t < n; t++) {
    const y = normalQuantile(u());
    const z = p.k === 0 ? y : s.xi + (s.alpha * (1 - Math.exp(-p.k * y))) / p.k;
    const sigma = Math.sqrt(h);
    sigmas[t] = sigma;
    returns[t] = p.mu + sigma * z;
    const e = returns[t] - p.mu;
    h = p.omega + p.alpha * e * e + p.beta * h;
  }
  return { returns, sigmas };
}

/**
 * GARCH(1,1) log-likelihood with standardized GNO innovations written from the published density
 * (log f = ky − y²/2 − ln α − ½ ln 2π) and the benchmark's pre-sample rule σ²₁ = ω + (α + β)·mean((r − μ)²).
 * Math functions bound locally (sandbox global lookups are slow).
 */
const { exp, expm1, log, log1p, sqrt, PI } = Math;
export function referenceLogLik(r: ArrayLike<number>, mu: number, omega: number, a: number, b: number, k: number): number {
  const n = r.length;
  let m2 = 0;
  for (let i = 0; i < n; i++) m2 += (r[i] - mu) * (r[i] - mu);
  m2 /= n;
  let xi = 0;
  let al = 1;
  if (k !== 0) {
    // e^{k²} − 1 and e^{k²/2} − 1 as expm1 so the finite differences at k ≈ 1e-8 keep their digits
    al = (k < 0 ? -k : k) / sqrt(exp(k * k) * expm1(k * k));
    xi = (al * expm1((k * k) / 2)) / k;
  }
  let h = omega + (a + b) * m2;
  let s = 0;
  for (let t = 0; t < n; t++) {
    const sig = sqrt(h);
    const z = (r[t] - mu) / sig;
    const tt = (z - xi) / al;
    const u = k * tt;
    if (!(u < 1)) return -Infinity;
    const y = u === 0 ? tt : -log1p(-u) / k;
    s += k * y - 0.5 * y * y - log(al * sig) - 0.5 * log(2 * PI);
    const e = r[t] - mu;
    h = omega + a * e * e + b * h;
  }
  return s;
}
