/**
 * Student t location-scale law (location μ, scale s > 0, degrees of freedom ν), for model comparison.
 *
 * log f = lnΓ((ν+1)/2) − lnΓ(ν/2) − ½ ln(νπ) − ln s − ((ν+1)/2) log1p(z²/ν), z = (x − μ)/s
 * (textbook densities; log-likelihoods recomputed with scipy 1.17 outside the repo, as in scipy.stats.t). CDF: for t ≤ 0, F = ½ I_{ν/(ν+t²)}(ν/2, ½) (Abramowitz & Stegun 26.7.1
 * via 26.5.27); the quantile solves F = p by safeguarded Newton.
 *
 * Fitting by maximum likelihood: for fixed ν, the EM iteration of Dempster, Laird & Rubin (1977) with weights
 * w = (ν+1)/(ν + z²) gives μ = Σwx/Σw, s² = Σw(x−μ)²/n and never lowers the likelihood (Liu & Rubin 1995, ECME);
 * ν is profiled: a log-spaced grid of 17 values on [NU_MIN, NU_MAX] then golden-section search on ln ν between the
 * best grid point's neighbours. We bound ν to [2.01, 200]: above 2 so the law has a variance, 200 is
 * indistinguishable from the normal for daily-return sample sizes (our choice; a range suggested to us from memory is (2, 200]).
 */
import { lnGamma, regularizedBeta } from "../special";
import { normalQuantile } from "../normal";
import { goldenMaximiseWork } from "./optimize";
import { runToEnd, type Work } from "../work";

export const NU_MIN = 2.01;
export const NU_MAX = 200;

export interface StudentTParams {
  readonly location: number;
  readonly scale: number;
  readonly dof: number;
}

function valid(p: StudentTParams): boolean {
  return Number.isFinite(p.location) && p.scale > 0 && Number.isFinite(p.scale) && p.dof > 0;
}

/** Log-likelihood of the data; NaN for invalid parameters. */
export function studentTLogLikelihood(data: ArrayLike<number>, p: StudentTParams): number {
  if (!valid(p)) return NaN;
  const n = data.length;
  const nu = p.dof;
  const c = lnGamma((nu + 1) / 2) - lnGamma(nu / 2) - 0.5 * Math.log(nu * Math.PI) - Math.log(p.scale);
  let sum = 0;
  for (let i = 0; i < n; i++) {
    const z = (data[i] - p.location) / p.scale;
    sum += Math.log1p((z * z) / nu);
  }
  return n * c - ((nu + 1) / 2) * sum;
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
  readonly converged: boolean;
  readonly atBound: boolean;
}

interface LocScale {
  location: number;
  scale: number;
}

function emForDof(data: ArrayLike<number>, nu: number, start: LocScale, maxIterations: number): { ls: LocScale; converged: boolean } {
  const n = data.length;
  let mu = start.location;
  let s2 = start.scale * start.scale;
  for (let it = 0; it < maxIterations; it++) {
    let sw = 0;
    let swx = 0;
    for (let i = 0; i < n; i++) {
      const r = data[i] - mu;
      const w = (nu + 1) / (nu + (r * r) / s2);
      sw += w;
      swx += w * data[i];
    }
    const muNew = swx / sw;
    let ss = 0;
    for (let i = 0; i < n; i++) {
      const r = data[i] - muNew;
      ss += ((nu + 1) / (nu + (r * r) / s2)) * r * r;
    }
    const s2New = ss / n;
    const done = Math.abs(muNew - mu) <= 1e-12 * Math.sqrt(s2New) && Math.abs(s2New - s2) <= 1e-12 * s2New;
    mu = muNew;
    s2 = s2New;
    if (done) return { ls: { location: mu, scale: Math.sqrt(s2) }, converged: true };
  }
  return { ls: { location: mu, scale: Math.sqrt(s2) }, converged: false };
}

/** Maximum-likelihood fit with ν in [NU_MIN, NU_MAX], started from the median and the scaled MAD. */
export function fitStudentT(data: ArrayLike<number>): StudentTFit {
  return runToEnd(fitStudentTWork(data));
}

/**
 * fitStudentT as resumable work: yields after the sorts for the start, after each point of the ν profile (one EM
 * run and one log-likelihood), each golden-section evaluation and the final EM run. Same result as fitStudentT.
 */
export function* fitStudentTWork(data: ArrayLike<number>): Work<StudentTFit> {
  const n = data.length;
  const sorted = Float64Array.from(data).sort();
  const median = n % 2 ? sorted[(n - 1) / 2] : 0.5 * (sorted[n / 2 - 1] + sorted[n / 2]);
  const dev = Float64Array.from(sorted, (x) => Math.abs(x - median)).sort();
  const mad = n % 2 ? dev[(n - 1) / 2] : 0.5 * (dev[n / 2 - 1] + dev[n / 2]);
  let warm: LocScale = { location: median, scale: mad > 0 ? 1.4826 * mad : 1 };
  yield NaN;
  const profile = (logNu: number): number => {
    const nu = Math.exp(logNu);
    const r = emForDof(data, nu, warm, 300);
    warm = r.ls;
    return studentTLogLikelihood(data, { location: r.ls.location, scale: r.ls.scale, dof: nu });
  };
  const a = Math.log(NU_MIN);
  const b = Math.log(NU_MAX);
  const grid = 16;
  let bestI = 0;
  let bestV = -Infinity;
  const starts: LocScale[] = [];
  for (let i = grid; i >= 0; i--) {
    const v = profile(a + ((b - a) * i) / grid);
    yield NaN;
    starts[i] = warm;
    if (v > bestV) {
      bestV = v;
      bestI = i;
    }
  }
  warm = starts[bestI];
  const lo = a + ((b - a) * Math.max(0, bestI - 1)) / grid;
  const hi = a + ((b - a) * Math.min(grid, bestI + 1)) / grid;
  const g = (yield* goldenMaximiseWork(profile, lo, hi, 1e-6)).x;
  const nu = Math.exp(g);
  const final = emForDof(data, nu, warm, 5000);
  yield NaN;
  const params = { location: final.ls.location, scale: final.ls.scale, dof: nu };
  const atBound = nu <= NU_MIN * 1.001 || nu >= NU_MAX / 1.001;
  return { params, logLikelihood: studentTLogLikelihood(data, params), converged: final.converged, atBound };
}
