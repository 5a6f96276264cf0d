/**
 * The law of the sum of h independent one-day draws of the generalized normal (GNO) law: distribution function,
 * survival, density, quantile, and h-day VaR / expected shortfall on either side, to 1e-8 relative or better
 * for h = 1 … 250, |k| ≤ MAX_HORIZON_SHAPE = 0.75 and tail probabilities down to about 1e-8 (measured in
 * docs/notes/horizon.md: 1e-12…1e-9 for |k| ≤ 0.5; beyond |k| ≈ 0.8 accuracy collapses, so larger shapes give NaN).
 *
 * Exact cases: h = 1 is the one-day closed form (src/core/risk/measures/tail.ts, bit for bit); k = 0 is the
 * normal law N(hξ, hα²), computed from the normal formula exactly.
 *
 * Otherwise, in reduced units (S = hξ + α·T, T = U₁ + … + U_h, U ~ GNO(0, 1, k)), condition on the first
 * m = h − 1 days:
 *   P(T ≤ t) = E[F₁(t − T_m)],   E[T·1{T ≤ t}] = E[T_m·F₁(t − T_m) + M₁(t − T_m)],
 * where F₁ and the one-day partial mean M₁(v) = E[U·1{U ≤ v}] = −B(y(v), k) are exact closed forms
 * (B as in tail.ts), and the expectation over T_m is a sum over a uniform lattice carrying the density of T_m.
 * The lattice is built by sampling the one-day density at spacing δ (spectrally accurate: the density is smooth
 * and, at the edge, flat to every order) and raising its discrete Fourier transform to the power m (FFT,
 * circular domain wide enough that nothing wraps). Upper-tail quantities use the survival function and the
 * upper partial mean B(−y, −k) directly, never 1 − (something close to 1).
 *
 * Why convolution on a grid rather than inverting the characteristic function: the CF of this law has no closed
 * form (lognormal family), so every CF value would itself be an oscillatory integral; the lattice gets the same
 * spectral accuracy with one FFT, and the conditioning step keeps the exact one-day tail in every term.
 *
 * Grid design (reduced units): one-day truncation at |z| = 8.5 on the bounded side and 8 on the heavy side
 * (Φ(−8) ≈ 6e-16), spacing δ = 0.5·e^{−5|k|} (the density's local width near z is e^{−kz}: resolved out to
 * |z| = 5), domain (m − 1)μ + [a, b] ± 12√m·σ; the sampled one-day law is normalized to mass 1 and the lattice
 * rescaled after the FFT. At most MAX_GRID lattice points: beyond that the spacing is widened and
 * `accuracy.coarse` is set (only near |k| = 0.75 at long horizons); the lattice's mean and variance errors are
 * reported either way.
 */
import { cdf, isValidParams, moments, pdf, reducedQuantile, sf, type GnoParams } from "../../gno";
import { normalCdf, normalPdf, normalQuantile, normalSf } from "../../normal";
import type { RiskSide } from "../measures/side";
import { expectedShortfall, tailMeanFactor, valueAtRisk } from "../measures/tail";
import { fft } from "./fft";

/** Longest horizon (days) accepted. */
export const MAX_HORIZON = 250;
/**
 * Largest |shape| for which h ≥ 2 is computed: up to here the lattice meets 1e-8 relative (measured against direct
 * integration, docs/notes/horizon.md); beyond it the edge spike and the long tail need more points than the
 * MAX_GRID bound allows, and the figures are NaN (the adapters say why and point to simulation).
 */
export const MAX_HORIZON_SHAPE = 0.75;
/** Most lattice points for the density of the first h − 1 days. */
export const MAX_GRID = 1 << 16;

const TRUNCATION_Z = 8.5;
const HEAVY_Z = 8;
const RESOLVE_Z = 5;
const RESOLUTION = 0.5;
const DOMAIN_SDS = 12;
const NEGLIGIBLE_WEIGHT = 1e-26;

/** How well the lattice for the first h − 1 days represents their sum (reduced units). */
export interface LatticeAccuracy {
  /** Lattice points carrying weight (0 when no lattice is needed: h = 1 or k = 0). */
  readonly points: number;
  /** Spacing in reduced units (scale 1). */
  readonly spacing: number;
  /** |lattice mean − exact mean| / exact sd of the (h − 1)-day sum. */
  readonly meanError: number;
  /** |lattice variance / exact variance − 1|. */
  readonly varianceError: number;
  /** True when MAX_GRID forced a wider spacing than the accuracy target needs. */
  readonly coarse: boolean;
}

interface Lattice {
  readonly at: Float64Array;
  readonly weight: Float64Array;
  /** cumWeight[i] = Σ_{j<i} weight[j]; cumMoment[i] = Σ_{j<i} weight[j]·at[j] (length n + 1). */
  readonly cumWeight: Float64Array;
  readonly cumMoment: Float64Array;
  /** One-day truncation points in reduced units: beyond them F₁ is 0 or 1 to about 1e-17. */
  readonly oneDayLow: number;
  readonly oneDayHigh: number;
  readonly accuracy: LatticeAccuracy;
}

function nextPow2(n: number): number {
  let p = 1;
  while (p < n) p *= 2;
  return p;
}

/** Lattice (points, weights) for the density of U₁ + … + U_m, U ~ GNO(0, 1, k), k ≠ 0, m ≥ 1. */
function sumLattice(k: number, m: number): Lattice {
  const unit: GnoParams = { location: 0, scale: 1, shape: k };
  const mom = moments(unit);
  const mu = mom.mean;
  const sd = mom.sd;
  // The heavy side (z → +∞ for k < 0, z → −∞ for k > 0) is cut at HEAVY_Z; the bounded side costs nothing.
  const a = reducedQuantile(k > 0 ? -HEAVY_Z : -TRUNCATION_Z, k);
  const b = reducedQuantile(k < 0 ? HEAVY_Z : TRUNCATION_Z, k);
  const spread = DOMAIN_SDS * Math.sqrt(m) * sd;
  const lo = Math.max(m * a, (m - 1) * mu + a - spread);
  const hi = Math.min(m * b, (m - 1) * mu + b + spread);
  let delta = Math.min(RESOLUTION * Math.exp(-Math.abs(k) * RESOLVE_Z), RESOLUTION * sd);
  let span = Math.max(hi - lo, b - a);
  let coarse = false;
  if (Math.ceil(span / delta) + 2 > MAX_GRID) {
    delta = span / (MAX_GRID - 4);
    coarse = true;
  }
  const n1 = Math.floor((b - a) / delta) + 1;
  const size = nextPow2(Math.max(n1, Math.ceil(span / delta) + 2));
  span = size * delta;
  const re = new Float64Array(size);
  const im = new Float64Array(size);
  const c0 = delta / Math.sqrt(2 * Math.PI);
  for (let j = 0; j < n1; j++) {
    const y = reduced(a + j * delta, k);
    if (Number.isFinite(y)) re[j] = c0 * Math.exp(y * (k - y / 2));
  }
  // Normalize the sampled one-day law to mass 1: its small mass error would otherwise grow m-fold in the sum.
  let oneDayMass = 0;
  for (let j = 0; j < n1; j++) oneDayMass += re[j];
  for (let j = 0; j < n1; j++) re[j] /= oneDayMass;
  if (m > 1) {
    fft(re, im);
    for (let j = 0; j < size; j++) {
      const r = Math.hypot(re[j], im[j]);
      if (r === 0) continue;
      const rm = Math.exp(m * Math.log(r));
      const th = m * Math.atan2(im[j], re[j]);
      re[j] = rm * Math.cos(th);
      im[j] = rm * Math.sin(th);
    }
    fft(re, im, true);
    for (let j = 0; j < size; j++) re[j] /= size;
  }
  // Index j sits at m·a + jδ modulo the domain length: position base + iδ (i = 0 … size − 1) is index
  // (first + i) mod size, where base is the first lattice position at or above lo.
  const first = Math.max(0, Math.ceil((lo - m * a) / delta));
  const base = m * a + first * delta;
  const j0 = first % size;
  let kept = 0;
  for (let j = 0; j < size; j++) if (Math.abs(re[j]) > NEGLIGIBLE_WEIGHT) kept++;
  const at = new Float64Array(kept);
  const weight = new Float64Array(kept);
  let s0 = 0;
  let s1 = 0;
  for (let i = 0, n = 0; i < size; i++) {
    const j = (j0 + i) % size;
    const w = re[j];
    if (!(Math.abs(w) > NEGLIGIBLE_WEIGHT)) continue;
    const x = base + i * delta;
    at[n] = x;
    weight[n++] = w;
    s0 += w;
    s1 += w * (x - m * mu);
  }
  let s2 = 0;
  for (let i = 0; i < at.length; i++) s2 += weight[i] * (at[i] - m * mu - s1 / s0) ** 2;
  const accuracy: LatticeAccuracy = Object.freeze({
    points: at.length,
    spacing: delta,
    meanError: Math.abs(s1 / s0) / (Math.sqrt(m) * sd),
    varianceError: Math.abs(s2 / s0 / (m * sd * sd) - 1),
    coarse,
  });
  // FFT rounding leaves the total a few 1e-12 away from 1: rescale so that CDF + survival = 1.
  for (let i = 0; i < at.length; i++) weight[i] /= s0;
  const cumWeight = new Float64Array(at.length + 1);
  const cumMoment = new Float64Array(at.length + 1);
  for (let i = 0; i < at.length; i++) {
    cumWeight[i + 1] = cumWeight[i] + weight[i];
    cumMoment[i + 1] = cumMoment[i] + weight[i] * at[i];
  }
  return { at, weight, cumWeight, cumMoment, oneDayLow: a, oneDayHigh: b, accuracy };
}

const CACHE_SIZE = 8;
const cache = new Map<string, Lattice>();

function cachedLattice(k: number, m: number): Lattice {
  const key = `${k}|${m}`;
  const hit = cache.get(key);
  if (hit) {
    cache.delete(key);
    cache.set(key, hit);
    return hit;
  }
  const made = sumLattice(k, m);
  cache.set(key, made);
  if (cache.size > CACHE_SIZE) cache.delete(cache.keys().next().value as string);
  return made;
}

/** Reduced variate of GNO(0, 1, k) at v (k ≠ 0): −log1p(−kv)/k, ±∞ beyond the edge. */
function reduced(v: number, k: number): number {
  const u = -k * v;
  if (u <= -1) return k > 0 ? Infinity : -Infinity;
  if (Math.abs(u) < 1e-8) return v * (1 - u / 2 + (u * u) / 3);
  return -Math.log1p(u) / k;
}

/** First index i with sorted[i] >= x (sorted.length if none). */
function lowerBound(sorted: Float64Array, x: number): number {
  let lo = 0;
  let hi = sorted.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (sorted[mid] < x) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** h-day law in reduced units: T = U₁ + … + U_h (k ≠ 0, h ≥ 2). */
class ReducedSum {
  /** One-day mean of U (reduced units). */
  private readonly mean1: number;
  constructor(
    readonly k: number,
    readonly lattice: Lattice,
  ) {
    this.mean1 = moments({ location: 0, scale: 1, shape: k }).mean;
  }

  /** Index range [i0, i1) of lattice points t_j with t − b < t_j < t − a (elsewhere F₁(t − t_j) is 0 or 1). */
  private window(t: number): [number, number] {
    const { at, oneDayLow, oneDayHigh } = this.lattice;
    return [lowerBound(at, t - oneDayHigh), lowerBound(at, t - oneDayLow)];
  }

  cdf(t: number): number {
    const { at, weight, cumWeight } = this.lattice;
    const [i0, i1] = this.window(t);
    let s = 0;
    for (let i = i0; i < i1; i++) s += weight[i] * normalCdf(reduced(t - at[i], this.k));
    return cumWeight[i0] + s;
  }

  sf(t: number): number {
    const { at, weight, cumWeight } = this.lattice;
    const [i0, i1] = this.window(t);
    let s = 0;
    for (let i = i0; i < i1; i++) s += weight[i] * normalSf(reduced(t - at[i], this.k));
    return cumWeight[at.length] - cumWeight[i1] + s;
  }

  pdf(t: number): number {
    const { at, weight } = this.lattice;
    const [i0, i1] = this.window(t);
    const k = this.k;
    let s = 0;
    for (let i = i0; i < i1; i++) {
      const y = reduced(t - at[i], k);
      if (Number.isFinite(y)) s += weight[i] * Math.exp(y * (k - y / 2));
    }
    return s / Math.sqrt(2 * Math.PI);
  }

  /** E[T·1{T ≤ t}]: below the window each term is w_j(t_j + μ₁). */
  lowerPartial(t: number): number {
    const { at, weight, cumWeight, cumMoment } = this.lattice;
    const [i0, i1] = this.window(t);
    const k = this.k;
    let s = 0;
    for (let i = i0; i < i1; i++) {
      const y = reduced(t - at[i], k);
      const p = normalCdf(y);
      s += weight[i] * (at[i] * p - tailMeanFactor(y, k, p));
    }
    return cumMoment[i0] + this.mean1 * cumWeight[i0] + s;
  }

  /** E[T·1{T > t}]: above the window each term is w_j(t_j + μ₁). */
  upperPartial(t: number): number {
    const { at, weight, cumWeight, cumMoment } = this.lattice;
    const [i0, i1] = this.window(t);
    const k = this.k;
    const n = at.length;
    let s = 0;
    for (let i = i0; i < i1; i++) {
      const y = reduced(t - at[i], k);
      const q = normalSf(y);
      s += weight[i] * (at[i] * q + tailMeanFactor(-y, -k, q));
    }
    return cumMoment[n] - cumMoment[i1] + this.mean1 * (cumWeight[n] - cumWeight[i1]) + s;
  }

  /** t with cdf(t) = p (upper = false) or sf(t) = p (upper = true); safeguarded Newton inside a bracket. */
  solve(p: number, upper: boolean, guess: number, scale: number): number {
    const g = (t: number) => (upper ? this.sf(t) - p : this.cdf(t) - p);
    // g is increasing for the lower tail, decreasing for the upper tail; orient so that `below` has g < 0 side.
    const dir = upper ? -1 : 1;
    let lo = guess;
    let hi = guess;
    let glo = g(lo);
    let ghi = glo;
    let step = scale;
    for (let i = 0; i < 200 && dir * glo > 0; i++) {
      hi = lo;
      ghi = glo;
      lo -= step;
      step *= 2;
      glo = g(lo);
    }
    step = scale;
    for (let i = 0; i < 200 && dir * ghi < 0; i++) {
      lo = hi;
      glo = ghi;
      hi += step;
      step *= 2;
      ghi = g(hi);
    }
    let t = dir * glo <= 0 && dir * ghi >= 0 ? (Math.abs(ghi) < Math.abs(glo) ? hi : lo) : guess;
    for (let it = 0; it < 100; it++) {
      const gt = g(t);
      if (Math.abs(gt) <= 1e-15 * p) return t;
      if (dir * gt < 0) lo = t;
      else hi = t;
      const density = this.pdf(t);
      let next = density > 0 ? t - gt / (dir * density) : NaN;
      if (!(next >= lo && next <= hi)) next = (lo + hi) / 2;
      // Stop at 1e-13 of the spread: far below the 1e-8 target, above the rounding noise of the tail sums.
      const tol = 1e-13 * (Math.abs(t) + scale);
      if (Math.abs(next - t) <= tol || hi - lo <= tol) return next;
      t = next;
    }
    return t;
  }
}

/** The h-day law of the sum of h i.i.d. GNO draws (plain object of functions; see the file header). */
export interface HorizonLaw {
  readonly params: GnoParams;
  readonly horizon: number;
  cdf(x: number): number;
  sf(x: number): number;
  pdf(x: number): number;
  /** x with P(S ≤ x) = prob. */
  quantile(prob: number): number;
  /** h-day VaR at confidence c as a positive loss. */
  valueAtRisk(confidence: number, side?: RiskSide): number;
  /** h-day expected shortfall at confidence c as a positive loss. */
  expectedShortfall(confidence: number, side?: RiskSide): number;
  readonly accuracy: LatticeAccuracy;
}

const EXACT: LatticeAccuracy = Object.freeze({ points: 0, spacing: 0, meanError: 0, varianceError: 0, coarse: false });

function validHorizon(h: number): boolean {
  return Number.isInteger(h) && h >= 1 && h <= MAX_HORIZON;
}

function invalidLaw(params: GnoParams, horizon: number): HorizonLaw {
  const nan = () => NaN;
  return Object.freeze({ params, horizon, cdf: nan, sf: nan, pdf: nan, quantile: nan, valueAtRisk: nan, expectedShortfall: nan, accuracy: EXACT });
}

const okLevel = (c: number) => c > 0 && c < 1;

/** Normal law N(hξ, hα²) (shape 0): every quantity from the normal formula. */
function normalSum(params: GnoParams, h: number): HorizonLaw {
  const m = h * params.location;
  const s = Math.sqrt(h) * params.scale;
  const varOf = (c: number, side: RiskSide) => {
    if (!okLevel(c)) return NaN;
    const z = normalQuantile(1 - c);
    return side === "short" ? m - s * z : -m - s * z;
  };
  const esOf = (c: number, side: RiskSide) => {
    if (!okLevel(c)) return NaN;
    const tail = 1 - c;
    const z = normalQuantile(tail);
    const excess = (s * normalPdf(z)) / tail;
    return side === "short" ? m + excess : -m + excess;
  };
  return Object.freeze({
    params,
    horizon: h,
    cdf: (x: number) => normalCdf((x - m) / s),
    sf: (x: number) => normalSf((x - m) / s),
    pdf: (x: number) => normalPdf((x - m) / s) / s,
    quantile: (q: number) => (q > 0 && q < 1 ? m + s * normalQuantile(q) : NaN),
    valueAtRisk: (c: number, side: RiskSide = "long") => varOf(c, side),
    expectedShortfall: (c: number, side: RiskSide = "long") => esOf(c, side),
    accuracy: EXACT,
  });
}

function oneDay(params: GnoParams): HorizonLaw {
  return Object.freeze({
    params,
    horizon: 1,
    cdf: (x: number) => cdf(x, params),
    sf: (x: number) => sf(x, params),
    pdf: (x: number) => pdf(x, params),
    quantile: (q: number) => (q > 0 && q < 1 ? params.location + params.scale * reducedQuantile(normalQuantile(q), params.shape) : NaN),
    valueAtRisk: (c: number, side: RiskSide = "long") => valueAtRisk(c, params, side),
    expectedShortfall: (c: number, side: RiskSide = "long") => expectedShortfall(c, params, side),
    accuracy: EXACT,
  });
}

/** The law of the sum of `horizon` i.i.d. draws of GNO(params); NaN-valued for invalid input. */
export function horizonLaw(params: GnoParams, horizon: number): HorizonLaw {
  if (!isValidParams(params) || !validHorizon(horizon)) return invalidLaw(params, horizon);
  if (horizon === 1) return oneDay(params);
  if (params.shape === 0) return normalSum(params, horizon);
  if (Math.abs(params.shape) > MAX_HORIZON_SHAPE) return invalidLaw(params, horizon);
  const { location: xi, scale: alpha, shape: k } = params;
  const h = horizon;
  const sum = new ReducedSum(k, cachedLattice(k, h - 1));
  const unit = moments({ location: 0, scale: 1, shape: k });
  const centre = h * unit.mean;
  const spread = Math.sqrt(h) * unit.sd;
  const toT = (x: number) => (x - h * xi) / alpha;
  /** Cornish–Fisher start for the reduced sum's quantile at probability q (only a starting point). */
  const start = (q: number) => {
    const z = normalQuantile(q);
    const g = unit.skewness / Math.sqrt(h);
    const zc = z + ((z * z - 1) * g) / 6;
    return centre + spread * (Number.isFinite(zc) ? zc : z);
  };
  // t with P(T ≤ t) = q, solved on the tail that holds the smaller probability (relative accuracy in both tails).
  const quantileT = (q: number) => (q <= 0.5 ? sum.solve(q, false, start(q), spread) : sum.solve(1 - q, true, start(q), spread));
  const lowerT = (tail: number) => quantileT(tail);
  const upperT = (tail: number) => quantileT(1 - tail);
  return Object.freeze({
    params,
    horizon: h,
    cdf: (x: number) => sum.cdf(toT(x)),
    sf: (x: number) => sum.sf(toT(x)),
    pdf: (x: number) => sum.pdf(toT(x)) / alpha,
    quantile: (q: number) => {
      if (!(q > 0 && q < 1)) return NaN;
      return h * xi + alpha * quantileT(q);
    },
    valueAtRisk: (c: number, side: RiskSide = "long") => {
      if (!okLevel(c)) return NaN;
      const tail = 1 - c;
      return side === "short" ? h * xi + alpha * upperT(tail) : -(h * xi + alpha * lowerT(tail));
    },
    expectedShortfall: (c: number, side: RiskSide = "long") => {
      if (!okLevel(c)) return NaN;
      const tail = 1 - c;
      if (side === "short") return h * xi + (alpha * sum.upperPartial(upperT(tail))) / tail;
      return -(h * xi + (alpha * sum.lowerPartial(lowerT(tail))) / tail);
    },
    accuracy: sum.lattice.accuracy,
  });
}

/** h-day VaR of the i.i.d. sum (h = 1: exactly the one-day VaR). */
export function horizonValueAtRisk(confidence: number, params: GnoParams, side: RiskSide = "long", horizon = 1): number {
  return horizonLaw(params, horizon).valueAtRisk(confidence, side);
}

/** h-day expected shortfall of the i.i.d. sum (h = 1: exactly the one-day ES). */
export function horizonExpectedShortfall(confidence: number, params: GnoParams, side: RiskSide = "long", horizon = 1): number {
  return horizonLaw(params, horizon).expectedShortfall(confidence, side);
}

