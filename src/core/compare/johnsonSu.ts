/**
 * Johnson SU law (Johnson 1949, Biometrika 36:149-176): Z = γ + δ asinh((X − ξ)/λ) is standard normal,
 * location ξ, scale λ > 0, shape γ (skew) and δ > 0 (tail weight). With u = (x − ξ)/λ,
 *   log f = ln δ − ln λ − ½ ln 2π − ½ ln(1 + u²) − ½ (γ + δ asinh u)²,
 *   quantile x_p = ξ + λ sinh((z_p − γ)/δ).
 *
 * Maximum likelihood. For fixed (ξ, λ) the (γ, δ) part is a normal regression with closed form: with
 * w = asinh u, δ = 1/sd_n(w) and γ = −δ·mean(w) (derived here). The profile in (ξ, ln λ) is maximised by
 * Nelder–Mead (./optimize): a coarse search (tolerance 1e-7) from three starts (median; λ = ½, 1, 2 sample sd),
 * then a tight polish (1e-12) from the best. As λ → ∞ the
 * law tends to the normal, and as λ → 0 with γ → ∓∞ to a shifted lognormal (the generalized normal's own family),
 * so the likelihood may be largest on either boundary: ln λ is kept in [ln(1e-3·sd), ln(1e3·sd)] and reaching a
 * bound is reported as `atNormalLimit` / `atLognormalLimit`.
 */
import { normalQuantile } from "../normal";
import { nelderMeadMaximise } from "./optimize";

const HALF_LOG_2PI = 0.9189385332046728; // ½ ln 2π

export interface JohnsonSuParams {
  readonly location: number;
  readonly scale: number;
  readonly gamma: number;
  readonly delta: number;
}

function valid(p: JohnsonSuParams): boolean {
  return Number.isFinite(p.location) && p.scale > 0 && Number.isFinite(p.scale) && Number.isFinite(p.gamma) && p.delta > 0 && Number.isFinite(p.delta);
}

/** Log-likelihood of the data; NaN for invalid parameters. */
export function johnsonSuLogLikelihood(data: ArrayLike<number>, p: JohnsonSuParams): number {
  if (!valid(p)) return NaN;
  const n = data.length;
  let sum = 0;
  for (let i = 0; i < n; i++) {
    const u = (data[i] - p.location) / p.scale;
    const z = p.gamma + p.delta * Math.asinh(u);
    sum += -Math.log(Math.hypot(1, u)) - 0.5 * z * z;
  }
  return n * (Math.log(p.delta) - Math.log(p.scale) - HALF_LOG_2PI) + sum;
}

/** Quantile; ±Infinity at 1 and 0, NaN outside [0, 1] or for invalid parameters. */
export function johnsonSuQuantile(prob: number, p: JohnsonSuParams): number {
  if (!valid(p) || !(prob >= 0 && prob <= 1)) return NaN;
  return p.location + p.scale * Math.sinh((normalQuantile(prob) - p.gamma) / p.delta);
}

export interface JohnsonSuFit {
  readonly params: JohnsonSuParams;
  readonly logLikelihood: number;
  readonly converged: boolean;
  readonly atNormalLimit: boolean;
  readonly atLognormalLimit: boolean;
}

function innerShape(data: ArrayLike<number>, location: number, scale: number): { gamma: number; delta: number } {
  const n = data.length;
  let mean = 0;
  let m2 = 0;
  for (let i = 0; i < n; i++) {
    const w = Math.asinh((data[i] - location) / scale);
    const d = w - mean;
    mean += d / (i + 1);
    m2 += d * (w - mean);
  }
  const delta = 1 / Math.sqrt(m2 / n);
  return { gamma: -delta * mean, delta };
}

/** Maximum-likelihood fit of the four parameters (needs a sample with spread). */
export function fitJohnsonSu(data: ArrayLike<number>): JohnsonSuFit {
  const n = data.length;
  const sorted = Float64Array.from(data).sort();
  const median = n % 2 ? sorted[(n - 1) / 2] : 0.5 * (sorted[n / 2 - 1] + sorted[n / 2]);
  let mean = 0;
  for (let i = 0; i < n; i++) mean += data[i] / n;
  let ss = 0;
  for (let i = 0; i < n; i++) ss += (data[i] - mean) ** 2;
  const sd = Math.sqrt(ss / n);
  const capLogScale = Math.log(1e3 * sd);
  const floorLogScale = Math.log(1e-3 * sd);
  const profile = (v: readonly number[]): number => {
    if (!(v[1] <= capLogScale && v[1] >= floorLogScale)) return -Infinity;
    const scale = Math.exp(v[1]);
    const { gamma, delta } = innerShape(data, v[0], scale);
    const ll = johnsonSuLogLikelihood(data, { location: v[0], scale, gamma, delta });
    return Number.isNaN(ll) ? -Infinity : ll;
  };
  let best: ReturnType<typeof nelderMeadMaximise> | null = null;
  for (const f of [0.5, 1, 2]) {
    const r = nelderMeadMaximise(profile, [median, Math.log(f * sd)], [0.25 * sd, 0.3], 1e-7, 150);
    if (best === null || r.value > best.value) best = r;
  }
  const b = nelderMeadMaximise(profile, best!.x, [0.05 * sd, 0.05], 1e-11, 400);
  const scale = Math.exp(b.x[1]);
  const params = { location: b.x[0], scale, ...innerShape(data, b.x[0], scale) };
  return {
    params,
    logLikelihood: johnsonSuLogLikelihood(data, params),
    converged: b.converged,
    atNormalLimit: b.x[1] > capLogScale - 0.01,
    atLognormalLimit: b.x[1] < floorLogScale + 0.01,
  };
}
