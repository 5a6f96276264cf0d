/**
 * Student t location-scale law (location μ, scale s > 0, degrees of freedom ν), for model comparison.
 *
 * log f = lnΓ((ν+1)/2) − lnΓ(ν/2) − ½ ln(νπ) − ln s − ((ν+1)/2) log1p(z²/ν), z = (x − μ)/s (textbook density).
 * CDF: for t ≤ 0, F = ½ I_{ν/(ν+t²)}(ν/2, ½) (Abramowitz & Stegun 26.7.1 via 26.5.27); the quantile solves F = p
 * by safeguarded Newton, and for ν ≥ 1e5 uses the expansion in 1/ν of Abramowitz & Stegun 26.7.5 (four terms).
 *
 * Written in η = 1/ν so that the normal law is the point η = 0 of a smooth family:
 *   log f = C(η) − ln s − A(η, z²),  A(η, q) = (1+η)/(2η) · log1p(ηq) = ½(1+η) q g(ηq),  g(y) = log1p(y)/y,
 *   C(η) = −½ ln 2π + D(1/(2η)),  D(x) = lnΓ(x+½) − lnΓ(x) − ½ ln x.
 * D has the asymptotic series Σ_{m≥1} (2^{1−2m} − 2) B_{2m} / (2m(2m−1) x^{2m−1}) = −1/(8x) + 1/(192x³) − 1/(640x⁵) + …
 * (from the expansion of ln Γ(x + a) in Bernoulli polynomials, B_k(½) = (2^{1−k} − 1)B_k; DLMF 5.11.8 and 24.4.27),
 * used for x ≥ 20 with seven terms, and the recurrence Γ(x+1) = xΓ(x) below. g and its derivatives use their
 * power series for ηq < 0.05 (no cancellation at the normal end). All derivatives below are derived here.
 *
 * Fitting by maximum likelihood in θ = (μ, ln s, η) with η in [1/NU_CAP, 1/NU_MIN]: a start from the median and
 * the scaled MAD with η chosen on a 6-point grid (three EM steps of Dempster, Laird & Rubin 1977 at each: weights
 * w = (1+η)/(1+ηz²), μ = Σwx/Σw, s² = Σw(x−μ)²/n), then Newton's method with the analytic score and Hessian,
 * Levenberg damping when −H is not positive definite, Armijo backtracking, and η held on a bound while the score
 * points outward. Converged: Newton decrement below 1e-10 with −H positive definite on the free coordinates.
 * ν ≥ 2.01 keeps a variance; the supremum can be the normal law itself (ν → ∞), so the upper end is a cap
 * NU_CAP = 1e8, where the log-likelihood is within about 1e-8·n·|excess kurtosis| of the normal's; a fit there
 * is reported as `atNormalLimit`.
 */
import { lnGamma, regularizedBeta } from "../special";
import { normalQuantile } from "../normal";
import { choleskySolve, dampedSolve } from "../fit/newton";
import { runToEnd, type Work } from "../work";
import { sortedCopy } from "../sort";

export const NU_MIN = 2.01;
/** Largest ν reported: the normal limit, ν → ∞, is shown as ν = NU_CAP. */
export const NU_CAP = 1e8;
const ETA_MIN = 1 / NU_CAP;
const ETA_MAX = 1 / NU_MIN;
/** Observations per chunk of a likelihood pass (one yield per chunk). */
const CHUNK = 131_072;
const HALF_LOG_2PI = 0.9189385332046728;

export interface StudentTParams {
  readonly location: number;
  readonly scale: number;
  readonly dof: number;
}

function valid(p: StudentTParams): boolean {
  return Number.isFinite(p.location) && p.scale > 0 && Number.isFinite(p.scale) && p.dof > 0;
}

// coefficients c_m of D(x) = Σ c_m x^{−(2m−1)}, m = 1..7
const D_SERIES = [-1 / 8, 1 / 192, -1 / 640, 17 / 14336, -31 / 18432, 691 / 180224, -5461 / 425984];

/** C(η) = lnΓ((ν+1)/2) − lnΓ(ν/2) − ½ ln(νπ) with ν = 1/η, and its first two derivatives in η. */
export function tConstant(eta: number): { c: number; c1: number; c2: number } {
  if (eta <= 0.025) {
    // x = 1/(2η) ≥ 20: C = −½ ln 2π + Σ c_m (2η)^{2m−1}
    let c = 0;
    let c1 = 0;
    let c2 = 0;
    for (let m = D_SERIES.length; m >= 1; m--) {
      const k = D_SERIES[m - 1] * 2 ** (2 * m - 1);
      const p = 2 * m - 1;
      c = c * eta * eta + k;
      c1 = c1 * eta * eta + k * p;
      c2 = c2 * eta * eta + k * p * (p - 1);
    }
    // c holds Σ k η^{2m−2}: one more η; c1 = Σ k p η^{p−1}; c2 = Σ k p(p−1) η^{p−2}
    return { c: -HALF_LOG_2PI + c * eta, c1, c2: eta > 0 ? c2 / eta : 0 };
  }
  const x = 1 / (2 * eta);
  let y = x;
  let d = 0;
  let d1 = 0;
  let d2 = 0;
  // D(x) = D(y) + ½ ln(y/x) − Σ_{j<m} ln((x+j+½)/(x+j)), y = x + m ≥ 20
  while (y < 20) {
    d -= Math.log1p(0.5 / y);
    d1 -= 1 / (y + 0.5) - 1 / y;
    d2 -= -1 / ((y + 0.5) * (y + 0.5)) + 1 / (y * y);
    y += 1;
  }
  d += 0.5 * Math.log(y / x);
  d1 += 0.5 * (1 / y - 1 / x);
  d2 += 0.5 * (-1 / (y * y) + 1 / (x * x));
  const t = 1 / y;
  let tp = t;
  for (let m = 1; m <= D_SERIES.length; m++) {
    const cm = D_SERIES[m - 1];
    const p = 2 * m - 1;
    d += cm * tp; // t^{p}
    d1 -= cm * p * tp * t; // t^{p+1}
    d2 += cm * p * (p + 1) * tp * t * t; // t^{p+2}
    tp *= t * t;
  }
  return { c: -HALF_LOG_2PI + d, c1: -2 * x * x * d1, c2: 8 * x * x * x * d1 + 4 * x * x * x * x * d2 };
}

/** g(y) = log1p(y)/y and its first two derivatives, y ≥ 0 (series below 0.05: 18 terms, error < 1e-17). */
let G0 = 0;
let G1 = 0;
let G2 = 0;
function gTriple(y: number): void {
  if (y < 0.05) {
    // g = Σ (−y)^k/(k+1), g' = Σ k(−1)^k y^{k−1}/(k+1), g'' = Σ k(k−1)(−1)^k y^{k−2}/(k+1)
    let a = 0;
    let b = 0;
    let c = 0;
    for (let k = 18; k >= 0; k--) {
      const s = (k & 1 ? -1 : 1) / (k + 1);
      a = a * y + s;
      if (k >= 1) b = b * y + k * s;
      if (k >= 2) c = c * y + k * (k - 1) * s;
    }
    G0 = a;
    G1 = b;
    G2 = c;
    return;
  }
  const l = Math.log1p(y);
  const r = 1 / (1 + y);
  G0 = l / y;
  G1 = (y * r - l) / (y * y);
  G2 = (-y * y * r * r - 2 * y * r + 2 * l) / (y * y * y);
}

/** Log-likelihood of the data; NaN for invalid parameters. Accurate up to ν = ∞ (the normal law). */
export function studentTLogLikelihood(data: ArrayLike<number>, p: StudentTParams): number {
  if (!valid(p)) return NaN;
  const n = data.length;
  const eta = 1 / p.dof;
  const c = tConstant(eta).c - Math.log(p.scale);
  const half = 0.5 * (1 + eta);
  let sum = 0;
  for (let i = 0; i < n; i++) {
    const z = (data[i] - p.location) / p.scale;
    const q = z * z;
    const y = eta * q;
    if (y < 0.05) {
      gTriple(y);
      sum += half * q * G0;
    } else sum += (half / eta) * Math.log1p(y);
  }
  return n * c - sum;
}

/** Standard t CDF with ν degrees of freedom. */
export function studentTStandardCdf(t: number, nu: number): number {
  if (Number.isNaN(t) || !(nu > 0)) return NaN;
  if (t === -Infinity) return 0;
  if (t === Infinity) return 1;
  const tail = 0.5 * regularizedBeta(nu / (nu + t * t), nu / 2, 0.5);
  return t <= 0 ? tail : 1 - tail;
}

function standardLogPdf(t: number, nu: number): number {
  return lnGamma((nu + 1) / 2) - lnGamma(nu / 2) - 0.5 * Math.log(nu * Math.PI) - ((nu + 1) / 2) * Math.log1p((t * t) / nu);
}

/** Standard t quantile: solves F(t) = p (p in (0,1)); ±Infinity at 1 and 0, NaN outside [0, 1]. */
export function studentTStandardQuantile(p: number, nu: number): number {
  if (!(p >= 0 && p <= 1) || !(nu > 0)) return NaN;
  if (p === 0) return -Infinity;
  if (p === 1) return Infinity;
  if (p === 0.5) return 0;
  if (p > 0.5) return -studentTStandardQuantile(1 - p, nu);
  if (nu >= 1e5) {
    // Abramowitz & Stegun 26.7.5: t = x + g1/ν + g2/ν² + g3/ν³ + g4/ν⁴, x = Φ⁻¹(p); next term O(ν⁻⁵)
    const x = normalQuantile(p);
    const x2 = x * x;
    const g1 = (x * (x2 + 1)) / 4;
    const g2 = (x * ((5 * x2 + 16) * x2 + 3)) / 96;
    const g3 = (x * (((3 * x2 + 19) * x2 + 17) * x2 - 15)) / 384;
    const g4 = (x * ((((79 * x2 + 776) * x2 + 1482) * x2 - 1920) * x2 - 945)) / 92160;
    const e = 1 / nu;
    return x + e * (g1 + e * (g2 + e * (g3 + e * g4)));
  }
  let lo = -1;
  while (studentTStandardCdf(lo, nu) > p) lo *= 2;
  let hi = 0;
  let t = Math.max(lo, Math.min(normalQuantile(p), -1e-3));
  for (let i = 0; i < 200; i++) {
    const f = studentTStandardCdf(t, nu) - p;
    if (f > 0) hi = t;
    else lo = t;
    let next = t - f / Math.exp(standardLogPdf(t, nu));
    if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
    if (Math.abs(next - t) <= 1e-15 * Math.abs(t)) return next;
    t = next;
  }
  return t;
}

/** Quantile of the location-scale law. */
export function studentTQuantile(prob: number, p: StudentTParams): number {
  if (!valid(p)) return NaN;
  return p.location + p.scale * studentTStandardQuantile(prob, p.dof);
}

export interface StudentTFit {
  readonly params: StudentTParams;
  readonly logLikelihood: number;
  /** Newton ended at a maximum (decrement below 1e-10, −H positive definite on the free coordinates). */
  readonly converged: boolean;
  /** ν at its lower bound NU_MIN. */
  readonly atBound: boolean;
  /** ν at its cap NU_CAP: the best t is the normal law (ν → ∞). */
  readonly atNormalLimit: boolean;
  /** Score in (μ·s, ln s, η) at the end point (μ's entry times the scale, so all three are per unit step). */
  readonly gradient: readonly number[];
}

/** Value, score and Hessian in (μ, ln s, η); the μ row and column multiplied by s (steps in units of s). */
interface TDerivatives {
  value: number;
  gradient: Float64Array;
  hessian: Float64Array;
}

/** Sums of one chunk into acc: [ΣA, g_m, g_a, g_e, h_mm, h_ma, h_aa, h_me, h_ae, h_ee] (of −ΣA, μ scaled by s). */
function tPass(data: ArrayLike<number>, from: number, to: number, mu: number, s: number, eta: number, acc: Float64Array): void {
  const inv = 1 / s;
  const h1 = 0.5 * (1 + eta);
  let sA = 0, gm = 0, ga = 0, ge = 0, hmm = 0, hma = 0, haa = 0, hme = 0, hae = 0, hee = 0;
  for (let i = from; i < to; i++) {
    const z = (data[i] - mu) * inv;
    const q = z * z;
    const y = eta * q;
    gTriple(y);
    const r = 1 / (1 + y);
    const Aq = h1 * r;
    const Aqq = -h1 * eta * r * r;
    const Aqe = 0.5 * (1 - q) * r * r;
    sA += h1 * q * G0;
    const Ae = 0.5 * q * G0 + h1 * q * q * G1;
    const Aee = q * q * G1 + h1 * q * q * q * G2;
    // q derivatives (μ scaled by s): q_m = −2z, q_a = −2q, q_mm = 2, q_ma = 4z, q_aa = 4q
    const qm = -2 * z;
    const qa = -2 * q;
    gm -= Aq * qm;
    ga -= Aq * qa;
    ge -= Ae;
    hmm -= Aqq * qm * qm + 2 * Aq;
    hma -= Aqq * qm * qa + 4 * Aq * z;
    haa -= Aqq * qa * qa + 4 * Aq * q;
    hme -= Aqe * qm;
    hae -= Aqe * qa;
    hee -= Aee;
  }
  acc[0] += sA; acc[1] += gm; acc[2] += ga; acc[3] += ge; acc[4] += hmm;
  acc[5] += hma; acc[6] += haa; acc[7] += hme; acc[8] += hae; acc[9] += hee;
}

/** Log-likelihood, score and Hessian in (μ, ln s, η), μ scaled by s; null for invalid values (one yield per chunk). */
function* tDerivativesWork(data: ArrayLike<number>, mu: number, logScale: number, eta: number): Work<TDerivatives | null> {
  const s = Math.exp(logScale);
  if (!(s > 0 && s < Infinity && Number.isFinite(mu) && eta >= 0 && eta <= ETA_MAX)) return null;
  const n = data.length;
  const acc = new Float64Array(10);
  for (let from = 0; from < n; from += CHUNK) {
    tPass(data, from, Math.min(n, from + CHUNK), mu, s, eta, acc);
    if (from + CHUNK < n) yield NaN;
  }
  const k = tConstant(eta);
  const value = n * (k.c - logScale) - acc[0];
  if (!Number.isFinite(value)) return null;
  return {
    value,
    gradient: new Float64Array([acc[1], acc[2] - n, acc[3] + n * k.c1]),
    hessian: new Float64Array([acc[4], acc[5], acc[7], acc[5], acc[6], acc[8], acc[7], acc[8], acc[9] + n * k.c2]),
  };
}

/** Score and Hessian at a point (for tests): θ = (μ, ln s, η), μ's row and column times s. */
export function studentTDerivatives(data: ArrayLike<number>, mu: number, logScale: number, eta: number): TDerivatives | null {
  return runToEnd(tDerivativesWork(data, mu, logScale, eta));
}

/** One EM step at fixed η from (μ, s), in one pass (sums about `centre` to keep them small). */
function emStep(data: ArrayLike<number>, eta: number, mu: number, s: number, centre: number): { mu: number; s: number } {
  const n = data.length;
  const inv2 = 1 / (s * s);
  let sw = 0, swx = 0, swxx = 0;
  for (let i = 0; i < n; i++) {
    const d = data[i] - mu;
    const w = (1 + eta) / (1 + eta * d * d * inv2);
    const c = data[i] - centre;
    sw += w;
    swx += w * c;
    swxx += w * c * c;
  }
  const m = swx / sw;
  const v = Math.max(swxx / n - (m * m * sw) / n, 0);
  return { mu: centre + m, s: Math.sqrt(v) };
}

const ETA_GRID = [ETA_MIN, 0.02, 0.08, 0.18, 0.3, 0.45];
/** Most Newton passes from a given start. */
export const T_POLISH_PASSES = 60;

/** Maximum-likelihood fit with ν in [NU_MIN, NU_CAP], started from the median and the scaled MAD. */
export function fitStudentT(data: ArrayLike<number>, start?: StudentTParams): StudentTFit {
  return runToEnd(fitStudentTWork(data, start));
}

/**
 * fitStudentT as resumable work: yields after the sorts for the start, after each grid point of the start, and
 * after every chunk of CHUNK observations of each Newton pass (line-search trials included). `start` (e.g. a fit
 * on a subsample) replaces the median/MAD start and its grid. At most 100 Newton steps of at most 31 passes each;
 * from a `start`, at most T_POLISH_PASSES passes in all.
 */
export function* fitStudentTWork(data: ArrayLike<number>, start?: StudentTParams): Work<StudentTFit> {
  const n = data.length;
  let th: number[];
  if (start && valid(start)) {
    th = [start.location, Math.log(start.scale), Math.min(ETA_MAX, Math.max(ETA_MIN, 1 / start.dof))];
  } else {
    const sorted = sortedCopy(data);
    const median = n % 2 ? sorted[(n - 1) / 2] : 0.5 * (sorted[n / 2 - 1] + sorted[n / 2]);
    const dev = Float64Array.from(sorted, (x) => Math.abs(x - median)).sort();
    const mad = n % 2 ? dev[(n - 1) / 2] : 0.5 * (dev[n / 2 - 1] + dev[n / 2]);
    const s0 = mad > 0 ? 1.4826 * mad : sorted[n - 1] > sorted[0] ? (sorted[n - 1] - sorted[0]) / 4 : 1;
    yield NaN;
    th = [median, Math.log(s0), ETA_GRID[0]];
    let bestV = -Infinity;
    for (const eta of ETA_GRID) {
      let mu = median;
      let s = s0;
      for (let k = 0; k < 3; k++) {
        const r = emStep(data, eta, mu, s, median);
        if (!(r.s > 0)) break;
        mu = r.mu;
        s = r.s;
      }
      const v = studentTLogLikelihood(data, { location: mu, scale: s, dof: 1 / eta });
      yield NaN;
      if (v > bestV) {
        bestV = v;
        th = [mu, Math.log(s), eta];
      }
    }
  }
  let cur = yield* tDerivativesWork(data, th[0], th[1], th[2]);
  yield NaN;
  // from a given start (all of a possibly large sample): at most T_POLISH_PASSES passes
  const maxPasses = start ? T_POLISH_PASSES : Infinity;
  let passes = 1;
  let converged = false;
  let fixed = th[2] <= ETA_MIN || th[2] >= ETA_MAX;
  let pinned = false;
  for (let it = 0; it < 100 && cur && passes < maxPasses; it++) {
    const g = cur.gradient;
    const H = cur.hessian;
    if (fixed && !pinned && ((th[2] <= ETA_MIN && g[2] > 0) || (th[2] >= ETA_MAX && g[2] < 0))) fixed = false;
    const free = fixed ? [0, 1] : [0, 1, 2];
    const m = free.length;
    const gD = new Float64Array(m);
    const A = new Float64Array(m * m);
    for (let i = 0; i < m; i++) {
      gD[i] = g[free[i]];
      for (let j = 0; j < m; j++) A[i * m + j] = -H[free[i] * 3 + free[j]];
    }
    let step = choleskySolve(A, gD, m);
    let slope = 0;
    if (step) {
      for (let i = 0; i < m; i++) slope += gD[i] * step[i];
      if (slope / 2 < 1e-10) {
        converged = true;
        break;
      }
    } else {
      step = dampedSolve(A, gD, m);
      if (!step) break;
      for (let i = 0; i < m; i++) slope += gD[i] * step[i];
    }
    const sv = [0, 0, 0];
    for (let i = 0; i < m; i++) sv[free[i]] = step[i];
    if (!fixed && ((th[2] <= ETA_MIN && sv[2] < 0) || (th[2] >= ETA_MAX && sv[2] > 0))) {
      fixed = true;
      pinned = true;
      continue;
    }
    // steps capped at one scale unit in μ and ln s, 0.1 in η
    const big = Math.max(Math.abs(sv[0]), Math.abs(sv[1]), 10 * Math.abs(sv[2]));
    let t = big > 1 ? 1 / big : 1;
    let hitBound = false;
    if (!fixed && th[2] + t * sv[2] < ETA_MIN) {
      t = (ETA_MIN - th[2]) / sv[2];
      hitBound = true;
    } else if (!fixed && th[2] + t * sv[2] > ETA_MAX) {
      t = (ETA_MAX - th[2]) / sv[2];
      hitBound = true;
    }
    const s = Math.exp(th[1]);
    let accepted = false;
    for (let tries = 0; tries < 30 && passes < maxPasses; tries++) {
      passes++;
      const nt = [th[0] + t * sv[0] * s, th[1] + t * sv[1], th[2] + t * sv[2]];
      if (hitBound && tries === 0) nt[2] = sv[2] < 0 ? ETA_MIN : ETA_MAX;
      nt[2] = Math.min(ETA_MAX, Math.max(ETA_MIN, nt[2]));
      const next = yield* tDerivativesWork(data, nt[0], nt[1], nt[2]);
      yield NaN;
      if (next && next.value >= cur.value + 1e-4 * t * slope) {
        th = nt;
        cur = next;
        accepted = true;
        pinned = false;
        if (hitBound && tries === 0) fixed = true;
        break;
      }
      t *= 0.5;
    }
    if (!accepted) break;
  }
  const eta = th[2];
  const params = { location: th[0], scale: Math.exp(th[1]), dof: eta <= ETA_MIN ? NU_CAP : 1 / eta };
  return {
    params,
    logLikelihood: studentTLogLikelihood(data, params),
    converged,
    atBound: eta >= ETA_MAX,
    atNormalLimit: eta <= ETA_MIN,
    gradient: cur ? Array.from(cur.gradient) : [NaN, NaN, NaN],
  };
}
