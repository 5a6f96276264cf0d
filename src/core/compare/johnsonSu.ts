/**
 * Johnson SU law (Johnson 1949, Biometrika 36:149-176): Z = γ + δ asinh((X − ξ)/λ) is standard normal,
 * location ξ, scale λ > 0, shape γ (skew) and δ > 0 (tail weight). With u = (x − ξ)/λ,
 *   log f = ln δ − ln λ − ½ ln 2π − ½ ln(1 + u²) − ½ (γ + δ asinh u)²,
 *   quantile x_p = ξ + λ sinh((z_p − γ)/δ).
 *
 * Maximum likelihood. For fixed (ξ, λ) the (γ, δ) part is a normal regression with closed form: with
 * w = asinh u, δ = 1/sd_n(w) and γ = −δ·mean(w) (derived here). First, Newton's method on all four parameters
 * θ = (ξ, ln λ, γ, ln δ) with the analytic score and Hessian below, from (median, sample sd) and the closed-form
 * (γ, δ), with the same safeguards as the generalized normal fit (Levenberg–Marquardt shift when −H is not positive
 * definite, step caps, Armijo backtracking) and ln λ kept in its box (a step that would leave it stops on the
 * bound, where ln λ stays fixed while the score pushes outward). Newton may crawl down the lognormal ridge (see
 * newtonSu): after 40 steps without convergence it is restarted on the floor of ln λ with the same limiting
 * lognormal (20 steps), and failing that carried on from where it stopped (60 steps). When Newton does not end at a
 * maximum (decrement below 1e-10 with −H positive definite on the free coordinates), the profile in (ξ, ln λ) is
 * maximised by Nelder–Mead (./optimize): a coarse search (tolerance 1e-7) from three starts (median; λ = ½, 1, 2
 * sample sd), then a tight polish (1e-12) from the best, and the better of the two answers is kept.
 *
 * Derivatives (derived here), with r = 1/√(1 + u²), w = asinh u, z = γ + δw, per observation
 * ℓ = ln δ − ln λ + ln r − z²/2 − ½ ln 2π:
 *   w_ξ = −r/λ, w_a = −u r, w_ξξ = −u r³/λ², w_ξa = r³/λ, w_aa = u r³;
 *   (ln r)_ξ = u r²/λ, (ln r)_a = u² r², (ln r)_ξξ = r⁴(u² − 1)/λ², (ln r)_ξa = −u r²(1 + r²(1 − u²))/λ,
 *   (ln r)_aa = −2u² r⁴;  z_ξ = δ w_ξ, z_a = δ w_a, z_γ = 1, z_b = δ w (b = ln δ), z_θφ = δ w_θφ for θ, φ ∈ {ξ, a},
 *   z_ξb = z_ξ, z_ab = z_a, z_bb = z_b;  ∂²ℓ/∂θ∂φ = (ln r)_θφ − z_θ z_φ − z z_θφ (+ the constants' −1, +1 in the score).
 * As λ → ∞ the
 * law tends to the normal, and as λ → 0 with γ → ∓∞ to a shifted lognormal (the generalized normal's own family),
 * so the likelihood may be largest on either boundary: ln λ is kept in [ln(1e-3·sd), ln(1e3·sd)] and reaching a
 * bound is reported as `atNormalLimit` / `atLognormalLimit`.
 */
import { normalQuantile } from "../normal";
import { choleskySolve, dampedSolve } from "../fit/newton";
import { nelderMeadMaximiseWork, type MaximumNd } from "./optimize";
import { reporting, runToEnd, type Work } from "../work";
import { sortedCopy } from "../sort";

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

interface SuDerivatives {
  readonly value: number;
  readonly gradient: Float64Array;
  readonly hessian: Float64Array;
}

/** Observations per chunk of a derivative pass (one yield per chunk). */
const CHUNK = 131_072;

/** One chunk's sums into acc: [Σ ln r, Σz², g_ξ, g_a, g_γ, g_b, h_ξξ, h_ξa, h_ξγ, h_ξb, h_aa, h_aγ, h_ab, h_γb, h_bb]. */
function suPass(data: ArrayLike<number>, from: number, to: number, location: number, inv: number, gamma: number, delta: number, acc: Float64Array): void {
  let sLr = 0, sZ2 = 0;
  let gx = 0, ga = 0, gg = 0, gb = 0;
  let hxx = 0, hxa = 0, hxg = 0, hxb = 0, haa = 0, hag = 0, hab = 0, hgb = 0, hbb = 0;
  for (let i = from; i < to; i++) {
    const u = (data[i] - location) * inv;
    const q = 1 + u * u;
    const r = 1 / Math.sqrt(q);
    const r2 = r * r;
    const r3 = r2 * r;
    const w = Math.asinh(u);
    const z = gamma + delta * w;
    sLr -= 0.5 * Math.log(q);
    sZ2 += z * z;
    const zx = -delta * r * inv;
    const za = -delta * u * r;
    const zb = delta * w;
    gx += u * r2 * inv - z * zx;
    ga += u * u * r2 - z * za;
    gg -= z;
    gb -= z * zb;
    const r4 = r2 * r2;
    hxx += r4 * (u * u - 1) * inv * inv - zx * zx - z * delta * (-u * r3 * inv * inv);
    hxa += (-u * r2 * (1 + r2 * (1 - u * u))) * inv - zx * za - z * delta * r3 * inv;
    haa += -2 * u * u * r4 - za * za - z * delta * u * r3;
    hxg -= zx;
    hag -= za;
    hgb -= zb;
    hxb += -zx * zb - z * zx;
    hab += -za * zb - z * za;
    hbb += -zb * zb - z * zb;
  }
  const v = [sLr, sZ2, gx, ga, gg, gb, hxx, hxa, hxg, hxb, haa, hag, hab, hgb, hbb];
  for (let k = 0; k < 15; k++) acc[k] += v[k];
}

/** johnsonSuDerivatives as resumable work: one yield after each chunk of CHUNK observations but the last. */
function* suDerivativesWork(data: ArrayLike<number>, location: number, logScale: number, gamma: number, logDelta: number): Work<SuDerivatives | null> {
  const lam = Math.exp(logScale);
  const delta = Math.exp(logDelta);
  if (!(lam > 0 && lam < Infinity && delta > 0 && delta < Infinity && Number.isFinite(location) && Number.isFinite(gamma))) return null;
  const n = data.length;
  const acc = new Float64Array(15);
  for (let from = 0; from < n; from += CHUNK) {
    suPass(data, from, Math.min(n, from + CHUNK), location, 1 / lam, gamma, delta, acc);
    if (from + CHUNK < n) yield NaN;
  }
  const [sLr, sZ2, gx, ga, gg, gb, hxx, hxa, hxg, hxb, haa, hag, hab, hgb, hbb] = acc;
  const value = n * (logDelta - logScale - HALF_LOG_2PI) + sLr - 0.5 * sZ2;
  const hgg = -n;
  return {
    value,
    gradient: new Float64Array([gx, ga - n, gg, gb + n]),
    hessian: new Float64Array([hxx, hxa, hxg, hxb, hxa, haa, hag, hab, hxg, hag, hgg, hgb, hxb, hab, hgb, hbb]),
  };
}

/** Log-likelihood, score and Hessian in θ = (ξ, ln λ, γ, ln δ); null for invalid values. */
export function johnsonSuDerivatives(data: ArrayLike<number>, location: number, logScale: number, gamma: number, logDelta: number): SuDerivatives | null {
  return runToEnd(suDerivativesWork(data, location, logScale, gamma, logDelta));
}

interface NewtonSu {
  /** (ξ, ln λ, γ, ln δ) at the end point. */
  readonly theta: number[];
  readonly value: number;
  readonly converged: boolean;
  readonly atBound: boolean;
}

const LN2 = Math.LN2;

/**
 * Derivatives in φ = (ξ, a = ln λ, μ, b = ln δ) with γ = σδ(a − ln 2 − μ), σ = ±1: as λ → 0 with σγ → −∞ the law
 * tends to a lognormal beyond ξ (above it for σ = 1, below for σ = −1) with log-mean μ and log-sd 1/δ, so along that
 * ridge only a moves while γ itself runs off to ∓∞. Chain rule: g_φ = Jᵀg, H_φ = JᵀHJ + g_γ ∇²γ, with
 * ∂γ/∂(a, μ, b) = (σδ, −σδ, γ) and ∂²γ/∂a∂b = σδ, ∂²γ/∂μ∂b = −σδ, ∂²γ/∂b² = γ.
 */
function* ridgeDerivatives(data: ArrayLike<number>, phi: readonly number[], sigma: number): Work<SuDerivatives | null> {
  const delta = Math.exp(phi[3]);
  const sd = sigma * delta;
  const gamma = sd * (phi[1] - LN2 - phi[2]);
  const d = yield* suDerivativesWork(data, phi[0], phi[1], gamma, phi[3]);
  if (!d) return null;
  const g = d.gradient;
  const H = d.hessian;
  // J: rows θ = (ξ, a, γ, b), columns φ = (ξ, a, μ, b)
  const J = [1, 0, 0, 0, 0, 1, 0, 0, 0, sd, -sd, gamma, 0, 0, 0, 1];
  const gp = new Float64Array(4);
  const Hp = new Float64Array(16);
  for (let j = 0; j < 4; j++) {
    let v = 0;
    for (let i = 0; i < 4; i++) v += J[i * 4 + j] * g[i];
    gp[j] = v;
  }
  for (let p = 0; p < 4; p++) {
    for (let q = 0; q < 4; q++) {
      let v = 0;
      for (let i = 0; i < 4; i++) {
        const ji = J[i * 4 + p];
        if (ji === 0) continue;
        for (let k = 0; k < 4; k++) v += ji * H[i * 4 + k] * J[k * 4 + q];
      }
      Hp[p * 4 + q] = v;
    }
  }
  const gg = g[2];
  Hp[1 * 4 + 3] += gg * sd;
  Hp[3 * 4 + 1] += gg * sd;
  Hp[2 * 4 + 3] -= gg * sd;
  Hp[3 * 4 + 2] -= gg * sd;
  Hp[15] += gg * gamma;
  return { value: d.value, gradient: gp, hessian: Hp };
}

/**
 * Safeguarded Newton ascent in φ = (ξ, ln λ, μ, ln δ) (ridgeDerivatives) with ln λ in [lo, hi]; ξ measured in
 * units of max(λ, sample sd) (on the lognormal ridge λ is tiny while ξ, the threshold, moves on the data's scale). Converged: decrement gᵀ(−H)⁻¹g/2 below 1e-10 + 1e-15|ℓ| with −H positive definite on the free
 * coordinates. On the lognormal ridge Newton walks down ln λ by about ½ per step (ℓ approaches its supremum like
 * −c·λ²), so once a full step moves ln λ down by 0.3 to 0.7 while μ and ln δ have settled (each moved < 0.02), the
 * floor itself is tried (at most 3 times) and kept when it is no worse.
 */
function* newtonSu(
  data: ArrayLike<number>,
  start: readonly number[],
  lo: number,
  hi: number,
  sigma: number,
  sd: number,
  maxSteps: number,
  maxPasses = Infinity,
  expand = false,
): Work<NewtonSu> {
  let passes = 1;
  // μ from the start's own ln λ, then ln λ moved into its box: on the ridge that keeps the law nearly the same
  const th = [start[0], Math.min(hi, Math.max(lo, start[1])), start[1] - LN2 - start[2] / (sigma * Math.exp(start[3])), start[3]];
  const out = (value: number, converged: boolean, atBound: boolean): NewtonSu => ({
    theta: [th[0], th[1], sigma * Math.exp(th[3]) * (th[1] - LN2 - th[2]), th[3]],
    value,
    converged,
    atBound,
  });
  let cur = (yield* ridgeDerivatives(data, th, sigma));
  yield NaN;
  let jumps = 3; // tries of the ln λ floor (see above)
  if (!cur || !Number.isFinite(cur.value)) return out(-Infinity, false, false);
  let fixed = false; // ln λ held on a bound
  let pinned = false; // held because the released step pointed out of the box
  for (let it = 0; it < maxSteps && passes < maxPasses; it++) {
    const lam = Math.exp(th[1]);
    const g = cur.gradient;
    const H = cur.hessian;
    if (fixed && !pinned) {
      const b = th[1] <= lo ? lo : hi;
      // release the bound when the score points back inside
      if ((b === lo && g[1] > 0) || (b === hi && g[1] < 0)) fixed = false;
    }
    const free = fixed ? [0, 2, 3] : [0, 1, 2, 3];
    const m = free.length;
    const dsc = [Math.max(lam, sd), 1, 1, 1];
    const gD = new Float64Array(m);
    const A = new Float64Array(m * m);
    for (let i = 0; i < m; i++) {
      gD[i] = g[free[i]] * dsc[free[i]];
      for (let j = 0; j < m; j++) A[i * m + j] = -H[free[i] * 4 + free[j]] * dsc[free[i]] * dsc[free[j]];
    }
    let step = choleskySolve(A, gD, m);
    let damped = false;
    if (step) {
      let dec = 0;
      for (let i = 0; i < m; i++) dec += gD[i] * step[i];
      if (dec / 2 < 1e-10 + 1e-15 * Math.abs(cur.value)) return out(cur.value, true, fixed);
    } else {
      step = dampedSolve(A, gD, m);
      if (!step) break;
      damped = true;
    }
    const s = [0, 0, 0, 0];
    for (let i = 0; i < m; i++) s[free[i]] = step[i] * dsc[free[i]];
    if (!fixed && ((th[1] <= lo && s[1] < 0) || (th[1] >= hi && s[1] > 0))) {
      // released, but Newton's step still leaves the box: hold ln λ on the bound until the point moves
      fixed = true;
      pinned = true;
      continue;
    }
    let big = 0;
    for (let i = 0; i < m; i++) big = Math.max(big, Math.abs(step[i]));
    let t = big > 1 ? 1 / big : 1;
    let slope = 0;
    for (let i = 0; i < m; i++) slope += gD[i] * step[i];
    // a step leaving the ln λ box stops on the bound
    let hitBound = false;
    if (!fixed && th[1] + t * s[1] < lo) {
      t = (lo - th[1]) / s[1];
      hitBound = true;
    } else if (!fixed && th[1] + t * s[1] > hi) {
      t = (hi - th[1]) / s[1];
      hitBound = true;
    }
    let accepted = false;
    const base = th.slice();
    for (let tries = 0; tries < 50 && passes < maxPasses; tries++) {
      passes++;
      const nt = th.map((v, i) => v + t * s[i]);
      if (hitBound && tries === 0) nt[1] = th[1] + t * s[1] < (lo + hi) / 2 ? lo : hi;
      const next = yield* ridgeDerivatives(data, nt, sigma);
      yield NaN;
      if (next && next.value >= cur.value + 1e-4 * t * slope) {
        for (let i = 0; i < 4; i++) th[i] = nt[i];
        cur = next;
        accepted = true;
        pinned = false;
        if (hitBound && tries === 0) fixed = true;
        // (from a given start) −H was not negative definite, e.g. ℓ convex along the lognormal ridge, rising like
        // c·λ²: the damped step is short, so while the value keeps rising it is doubled (at most 8 times, in the box)
        for (let e = 0; expand && damped && tries === 0 && !hitBound && e < 8 && passes < maxPasses; e++) {
          const nt2 = base.map((v, i) => v + 2 * t * s[i]);
          if (!fixed && (nt2[1] < lo || nt2[1] > hi)) break;
          passes++;
          const more = yield* ridgeDerivatives(data, nt2, sigma);
          yield NaN;
          if (!(more && more.value > cur.value)) break;
          for (let i = 0; i < 4; i++) th[i] = nt2[i];
          cur = more;
          t *= 2;
        }
        break;
      }
      t *= 0.5;
    }
    if (!accepted) break;
    if (!fixed && jumps > 0 && t === 1 && s[1] < -0.3 && s[1] > -0.7 && Math.abs(s[2]) < 0.02 && Math.abs(s[3]) < 0.02) {
      jumps--;
      const nt = [th[0], lo, th[2], th[3]];
      const next = yield* ridgeDerivatives(data, nt, sigma);
      yield NaN;
      if (next && next.value >= cur.value) {
        th[1] = lo;
        cur = next;
        fixed = true;
      }
    }
  }
  return out(cur.value, false, fixed);
}

/** Most passes over the data of one Newton run started from a given point (three runs at most). */
export const POLISH_PASSES = 60;

/** Maximum-likelihood fit of the four parameters (needs a sample with spread); `start`: see fitJohnsonSuWork. */
export function fitJohnsonSu(data: ArrayLike<number>, start?: JohnsonSuParams): JohnsonSuFit {
  return runToEnd(fitJohnsonSuWork(data, start));
}

/**
 * fitJohnsonSu as resumable work: yields after each chunk of CHUNK observations of every Newton pass (score and
 * Hessian evaluations, line-search trials included) and after each Nelder–Mead simplex step. The fraction is
 * unknown (NaN). `start` (e.g. the fit on a subsample of the same data) replaces the start from the median and the
 * sample sd; Newton then runs from it on all the data, and the simplex route is taken only if Newton does not end
 * at a maximum. Bound: at most 40 + 20 + 60 Newton steps of at most 51 passes each, then 3 × 150 + 400 simplex steps;
 * from a `start`: 5 probe passes, at most 3 × POLISH_PASSES Newton passes (2 × from a start on the floor), no simplex.
 */
export function* fitJohnsonSuWork(data: ArrayLike<number>, start?: JohnsonSuParams): Work<JohnsonSuFit> {
  const n = data.length;
  let mean = 0;
  for (let i = 0; i < n; i++) mean += data[i] / n;
  let ss = 0;
  for (let i = 0; i < n; i++) ss += (data[i] - mean) ** 2;
  const sd = Math.sqrt(ss / n);
  const capLogScale = Math.log(1e3 * sd);
  const floorLogScale = Math.log(1e-3 * sd);
  let median: number;
  let theta0: number[];
  // σ: the side of the lognormal limit the sample's skew points to (mean above the median: right skew)
  let sigma: number;
  let startOnFloor = false;
  if (start && valid(start)) {
    median = start.location;
    theta0 = [start.location, Math.log(start.scale), start.gamma, Math.log(start.delta)];
    sigma = start.gamma <= 0 ? 1 : -1;
    // A start on the lognormal floor may hide an interior maximum of all the data further up the ridge: probe
    // ln λ = ln sd − 2 … ln sd + 2 with the limiting lognormal kept (ξ, μ, δ fixed, γ moved with ln λ): one pass each
    startOnFloor = Math.log(start.scale) < floorLogScale + 1;
    if (startOnFloor) {
      const mu = theta0[1] - LN2 - start.gamma / (sigma * start.delta);
      let best = johnsonSuLogLikelihood(data, start);
      for (let k = -2; k <= 2; k++) {
        const a = Math.log(sd) + k;
        const gamma = sigma * start.delta * (a - LN2 - mu);
        const v = johnsonSuLogLikelihood(data, { location: start.location, scale: Math.exp(a), gamma, delta: start.delta });
        yield NaN;
        if (v > best) {
          best = v;
          theta0 = [start.location, a, gamma, theta0[3]];
        }
      }
    }
  } else {
    const sorted = sortedCopy(data);
    median = n % 2 ? sorted[(n - 1) / 2] : 0.5 * (sorted[n / 2 - 1] + sorted[n / 2]);
    const s0 = innerShape(data, median, sd);
    theta0 = [median, Math.log(sd), s0.gamma, Math.log(s0.delta)];
    sigma = mean >= median ? 1 : -1;
  }
  yield NaN;
  // from a given start (all of a possibly large sample) at most POLISH_PASSES passes per Newton run
  const passes = start ? POLISH_PASSES : Infinity;
  let nt = yield* newtonSu(data, theta0, floorLogScale, capLogScale, sigma, sd, 40, passes, !!start);
  if (!nt.converged && Number.isFinite(nt.value)) {
    // Newton may crawl down the lognormal ridge (ℓ → its supremum like −c·λ²): restart on the floor of ln λ with
    // the same limiting lognormal (ξ, μ, δ kept: γ moved with ln λ), from where it climbs back if the score says so.
    // Not when a given start was itself on the floor (its probes above already looked the other way).
    let onFloor: NewtonSu | null = null;
    if (!startOnFloor) {
      const [xi, a, g, b] = nt.theta;
      const mu = a - LN2 - g / (sigma * Math.exp(b));
      onFloor = yield* newtonSu(data, [xi, floorLogScale, sigma * Math.exp(b) * (floorLogScale - LN2 - mu), b], floorLogScale, capLogScale, sigma, sd, 20, passes, !!start);
    }
    if (onFloor && onFloor.converged && onFloor.value >= nt.value) nt = onFloor;
    else {
      // not on the ridge after all: carry on from where the first run stopped
      const more = yield* newtonSu(data, nt.theta, floorLogScale, capLogScale, sigma, sd, 60, passes, !!start);
      nt = onFloor && onFloor.value > more.value ? onFloor : more;
    }
  }
  if (nt.converged || (start && Number.isFinite(nt.value))) {
    // from a given start the simplex is not tried: on all of a large sample it would cost hundreds of passes
    const params = { location: nt.theta[0], scale: Math.exp(nt.theta[1]), gamma: nt.theta[2], delta: Math.exp(nt.theta[3]) };
    return {
      params,
      logLikelihood: johnsonSuLogLikelihood(data, params),
      converged: nt.converged,
      atNormalLimit: nt.theta[1] > capLogScale - 0.01,
      atLognormalLimit: nt.theta[1] < floorLogScale + 0.01,
    };
  }
  const profile = (v: readonly number[]): number => {
    if (!(v[1] <= capLogScale && v[1] >= floorLogScale)) return -Infinity;
    const scale = Math.exp(v[1]);
    const { gamma, delta } = innerShape(data, v[0], scale);
    const ll = johnsonSuLogLikelihood(data, { location: v[0], scale, gamma, delta });
    return Number.isNaN(ll) ? -Infinity : ll;
  };
  let best: MaximumNd | null = null;
  for (const f of [0.5, 1, 2]) {
    const r = yield* reporting(nelderMeadMaximiseWork(profile, [median, Math.log(f * sd)], [0.25 * sd, 0.3], 1e-7, 150), () => NaN);
    if (best === null || r.value > best.value) best = r;
  }
  const b = yield* reporting(nelderMeadMaximiseWork(profile, best!.x, [0.05 * sd, 0.05], 1e-11, 400), () => NaN);
  const scale = Math.exp(b.x[1]);
  let params: JohnsonSuParams = { location: b.x[0], scale, ...innerShape(data, b.x[0], scale) };
  let logScale = b.x[1];
  let ll = johnsonSuLogLikelihood(data, params);
  const ntParams = { location: nt.theta[0], scale: Math.exp(nt.theta[1]), gamma: nt.theta[2], delta: Math.exp(nt.theta[3]) };
  if (valid(ntParams) && nt.value > ll) {
    params = ntParams;
    logScale = nt.theta[1];
    ll = johnsonSuLogLikelihood(data, params);
  }
  return {
    params,
    logLikelihood: ll,
    converged: b.converged,
    atNormalLimit: logScale > capLogScale - 0.01,
    atLognormalLimit: logScale < floorLogScale + 0.01,
  };
}
