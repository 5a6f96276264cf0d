/**
 * Log-likelihood of the generalized normal law and its analytic score and Hessian.
 *
 * logLikelihood sums gno.logPdf over the data with Neumaier's compensated summation (Neumaier 1974,
 * ZAMM 54:39-51); it is −Infinity as soon as one observation lies outside the support.
 *
 * The derivative kernel works in θ = (ξ, a = ln α, k). Per observation, with t = (x − ξ)/α,
 * u = k t, w = 1 − u = e^{−ky} > 0, y = −log1p(−u)/k (y = t at u = 0), E = e^{ky} = 1/w, z = k y:
 *   ℓ = k y − y²/2 − a − ½ ln 2π                                   (log density, gno/logPdf)
 *   y_ξ = −E/α,  y_a = −t E,  y_k = y² g(z),  with g(z) = (e^z − 1 − z)/z², h(z) = 1 + z g(z)
 *   y_ξξ = k E²/α²,  y_ξa = E²/α,  y_aa = E y h,  y_ξk = −E y h/α,  y_ak = −t E y h,
 *   y_kk = y³ (2g² + h g′)
 *   ∂ℓ/∂θ = (k − y) y_θ + [θ=k] y − [θ=a]
 *   ∂²ℓ/∂θ∂φ = −y_θ y_φ + (k − y) y_θφ + [θ=k] y_φ + [φ=k] y_θ
 * (derived here by implicit differentiation of t = (1 − e^{−ky})/k; the dy/dk form avoids the
 * cancellation of t/(k w) − y/k near k = 0). g and g′ use their power series for |z| < 0.5
 * (g = Σ zⁿ/(n+2)!) to n = 7 for |z| < 0.02 and the closed forms beyond (≤ 5e-14 relative in g, 4e-12 in g′ at
 * the switch, falling as |z| grows), so the kernel is exact to rounding at k = 0.
 * The kernel recomputes y (gno/reducedVariate is its definition) because it needs w alongside it.
 */
import { logPdf } from "../gno";
import type { GnoParams } from "../gno";
import type { Work } from "../work";

const HALF_LOG_2PI = 0.9189385332046728; // ½ ln 2π

/** Log-likelihood of the data; −Infinity when any observation is outside the support, NaN for invalid params. */
export function logLikelihood(data: ArrayLike<number>, p: GnoParams): number {
  let sum = 0;
  let comp = 0;
  for (let i = 0; i < data.length; i++) {
    const v = logPdf(data[i], p);
    if (v === -Infinity) return -Infinity;
    if (Number.isNaN(v)) return NaN;
    const s = sum + v;
    comp += Math.abs(sum) >= Math.abs(v) ? sum - s + v : v - s + sum;
    sum = s;
  }
  return sum + comp;
}

/** Count of observations outside the support of p (0 when all are inside). */
export function countOutsideSupport(data: ArrayLike<number>, p: GnoParams): number {
  let c = 0;
  for (let i = 0; i < data.length; i++) if (logPdf(data[i], p) === -Infinity) c++;
  return c;
}

/** Value, score and Hessian in θ = (ξ, ln α, k). Hessian is row-major 3×3. */
export interface LikelihoodDerivatives {
  readonly value: number;
  readonly gradient: Float64Array;
  readonly hessian: Float64Array;
}

// g(z) = Σ_{n≥0} zⁿ/(n+2)!,  coefficients 1/(n+2)! for n = 0..15; g′(z) = Σ_{n≥1} n zⁿ⁻¹/(n+2)!
const G_COEF: number[] = [];
const GP_COEF: number[] = [];
{
  let f = 2;
  for (let n = 0; n < 16; n++) {
    G_COEF.push(1 / f);
    GP_COEF.push(n / f);
    f *= n + 3;
  }
}
/**
 * Below this |z| the kernel sums g's power series (to n = 7); above it, the closed forms. A narrow band keeps the
 * branch predictable (most points take the closed forms; at k = −0.12 the band holds the ~13% of returns within
 * 0.17 scale units of ξ) and costs less than the 16-term series over |z| < 0.5 it replaces: one pass over 1,859
 * permuted returns 58 → 47 µs. The closed forms are accurate enough above 0.02 (see the comment at their use).
 */
const SERIES_Z = 0.02;
const G9 = G_COEF[7];
const GP9 = GP_COEF[7];

/**
 * Value, gradient and Hessian of the log-likelihood at (ξ, a, k); null when an observation lies outside
 * the support or the scale is not positive. `withHessian = false` skips the second derivatives.
 */
let passes = 0;

/** How many derivative passes over data have run in this process (the bench counts a fit's passes with it). */
export function fusedPassCount(): number {
  return passes;
}

export function likelihoodDerivatives(
  data: ArrayLike<number>,
  location: number,
  logScale: number,
  shape: number,
  withHessian = true,
): LikelihoodDerivatives | null {
  const pass = beginPass(location, logScale, shape);
  if (!pass) return null;
  if (!accumulate(data, 0, data.length, pass, withHessian)) return null;
  return finishPass(pass, data.length, logScale);
}

/** Points per block of accumulate, and the block's reduced variates (accumulate is synchronous: never re-entered). */
const BLOCK = 1024;
const Y = new Float64Array(BLOCK);

/** Scratch for swapDerivatives (one observation at a time; never re-entered). */
const SWAP_ONE = new Float64Array(1);
const SWAP_ACC = new Float64Array(11);

/**
 * Score and Hessian of one observation's term for `added` minus those for `removed`, at (ξ, a, k), written into
 * g (3) and h (9, row-major) without allocating: what a window that drops `removed` and takes in `added` changes
 * (slideStart.ts). False when either lies outside the support or the parameters are invalid.
 */
export function swapDerivatives(
  added: number,
  removed: number,
  location: number,
  logScale: number,
  shape: number,
  g: Float64Array,
  h: Float64Array,
): boolean {
  const alpha = Math.exp(logScale);
  if (!(alpha > 0) || !Number.isFinite(alpha) || !Number.isFinite(location) || !Number.isFinite(shape)) return false;
  const invK = 1 / shape;
  const pass: Pass = { location, k: shape, invK, tinyK: !(Math.abs(invK) < Infinity), inv: 1 / alpha, acc: SWAP_ACC };
  g.fill(0);
  h.fill(0);
  for (let side = 0; side < 2; side++) {
    SWAP_ACC.fill(0);
    SWAP_ONE[0] = side === 0 ? added : removed;
    if (!accumulate(SWAP_ONE, 0, 1, pass, true)) return false;
    addDerivatives(pass, side === 0 ? 1 : -1, g, h);
  }
  return true;
}

/**
 * Observations per unit of likelihoodDerivativesWork: a pass over more than this many points yields after each
 * chunk (a pass over 1,000,000 points is 60–130 ms in plain node; a chunk of 131,072 is under ~20 ms).
 */
export const PASS_CHUNK = 131_072;

/**
 * likelihoodDerivatives as resumable work: the same pass, cut into chunks of PASS_CHUNK observations with a yield
 * (NaN) between chunks; the accumulators carry over, so the result is bit-identical. Samples of at most
 * PASS_CHUNK points take no step.
 */
export function* likelihoodDerivativesWork(
  data: ArrayLike<number>,
  location: number,
  logScale: number,
  shape: number,
  withHessian = true,
): Work<LikelihoodDerivatives | null> {
  const pass = beginPass(location, logScale, shape);
  if (!pass) return null;
  const n = data.length;
  for (let from = 0; from < n; from += PASS_CHUNK) {
    if (from > 0) yield NaN;
    if (!accumulate(data, from, Math.min(n, from + PASS_CHUNK), pass, withHessian)) return null;
  }
  return finishPass(pass, n, logScale);
}

/** A pass in progress: the constants of (ξ, a, k) and the running sums (value with its compensation, score, Hessian). */
interface Pass {
  readonly location: number;
  readonly k: number;
  readonly invK: number;
  readonly tinyK: boolean;
  readonly inv: number;
  /** val, comp, Σ rE, Σ t rE, gk, Σ E²(rk − 1), Σ E²(r − t), Σ q, haa, hak, hkk (see accumulate) */
  readonly acc: Float64Array;
}

function beginPass(location: number, logScale: number, shape: number): Pass | null {
  const alpha = Math.exp(logScale);
  if (!(alpha > 0) || !Number.isFinite(alpha) || !Number.isFinite(location) || !Number.isFinite(shape)) return null;
  passes++;
  const k = shape;
  const invK = 1 / k;
  const tinyK = !(Math.abs(invK) < Infinity); // |k| below ~1e-308: divide instead (1/k overflows)
  return { location, k, invK, tinyK, inv: 1 / alpha, acc: new Float64Array(11) };
}

function finishPass(pass: Pass, n: number, logScale: number): LikelihoodDerivatives {
  const value = pass.acc[0] + pass.acc[1] - n * (logScale + HALF_LOG_2PI);
  const gradient = new Float64Array(3);
  const hessian = new Float64Array(9);
  addDerivatives(pass, 1, gradient, hessian);
  gradient[1] -= n; // the Jacobian term of a = ln α, −1 per observation
  return { value, gradient, hessian };
}

/**
 * Adds sign × the score and Hessian held in a pass's sums (without the −n of ∂ℓ/∂a) to g (3) and h (9, row-major):
 * the constant factors 1/α and 1/α² that accumulate leaves out are put back here.
 */
function addDerivatives(pass: Pass, sign: number, g: Float64Array, h: Float64Array): void {
  const acc = pass.acc;
  const inv = pass.inv;
  const hxx = acc[5] * inv * inv;
  const hxa = acc[6] * inv;
  const hxk = acc[7] * inv;
  g[0] += sign * (-acc[2] * inv);
  g[1] += sign * -acc[3];
  g[2] += sign * acc[4];
  h[0] += sign * hxx;
  h[1] += sign * hxa;
  h[2] += sign * hxk;
  h[3] += sign * hxa;
  h[4] += sign * acc[8];
  h[5] += sign * acc[9];
  h[6] += sign * hxk;
  h[7] += sign * acc[9];
  h[8] += sign * acc[10];
}

/**
 * Adds observations from..to−1 to the pass's sums; false as soon as one lies outside the support.
 * The sums are kept with the constant factors 1/α and 1/α² taken out (finishPass puts them back), which leaves
 * fewer live values in the loop: with y_ξ = −E/α and y_a = −tE the terms above become
 *   ∂ℓ/∂ξ = −(1/α) Σ rE,  ∂ℓ/∂a = −Σ t rE (+ the −n of the Jacobian),  r = k − y,
 *   ∂²ℓ/∂ξ² = (1/α²) Σ E²(rk − 1),  ∂²ℓ/∂ξ∂a = (1/α) Σ E²(r − t),  ∂²ℓ/∂a² = Σ E(r y h − t²E),
 *   ∂²ℓ/∂ξ∂k = (1/α) Σ q,  ∂²ℓ/∂a∂k = Σ t q,  q = E(y_k − r y h − 1),
 *   ∂²ℓ/∂k² = Σ y_k(2 − y_k) + r y³(2g² + h g′).
 */
function accumulate(data: ArrayLike<number>, from: number, to: number, pass: Pass, withHessian: boolean): boolean {
  const { location, k, invK, tinyK, inv, acc } = pass;
  let val = acc[0];
  let comp = acc[1];
  let sx = acc[2], sa = acc[3], gk = acc[4];
  let hxx = acc[5], hxa = acc[6], hxk = acc[7], haa = acc[8], hak = acc[9], hkk = acc[10];
  for (let block = from; block < to; block += BLOCK) {
    const end = Math.min(to, block + BLOCK);
    // the reduced variates of the block first, in a loop of their own: log1p is a call, and a call inside the main
    // loop below would spill its eleven running sums to memory at every point (measured: one pass over 1,859
    // returns 47 → 29 µs in plain node). Same arithmetic as before, so the sums are bit-identical.
    for (let i = block; i < end; i++) {
      const t = (data[i] - location) * inv;
      const u = k * t;
      if (!(1 - u > 0)) return false;
      Y[i - block] = u === 0 ? t : tinyK ? -Math.log1p(-u) / k : -Math.log1p(-u) * invK;
    }
    for (let i = block; i < end; i++) {
      const t = (data[i] - location) * inv;
      const u = k * t;
      const w = 1 - u;
      const y = Y[i - block];
      const E = 1 / w;
      const z = k * y;
      let g: number;
      let gp: number;
      if (z < SERIES_Z && z > -SERIES_Z) {
        // 8 terms of g, 7 of g′: the first omitted terms are below 1e-20 relative for |z| < 0.02
        g = G9;
        gp = GP9;
        for (let j = 6; j >= 1; j--) {
          g = g * z + G_COEF[j];
          gp = gp * z + GP_COEF[j];
        }
        g = g * z + G_COEF[0];
      } else {
        // closed forms; e^z − 1 = u E. The subtraction loses about log10(2/|z|) digits: ≤ 8ε/|z| ≈ 5e-14 relative in g
        // and ≤ 12ε/z² ≈ 4e-12 in g′ at |z| = 0.02, falling as |z| grows. g enters the score, where 5e-14 relative
        // moves the maximum by ~1e-14 in k; g′ enters only the Hessian (Newton's direction and the standard errors).
        const iz = 1 / z;
        g = (u * E - z) * iz * iz;
        gp = (1 + (z - 2) * g) * iz;
      }
      const li = z - 0.5 * y * y;
      const s = val + li;
      comp += Math.abs(val) >= Math.abs(li) ? val - s + li : li - s + val;
      val = s;
      const r = k - y;
      const rE = r * E;
      sx += rE;
      sa += t * rE;
      const yk = y * y * g;
      gk += r * yk + y;
      if (withHessian) {
        const h = 1 + z * g;
        const e2 = E * E;
        const ryh = r * y * h;
        const q = E * (yk - ryh - 1);
        hxx += e2 * (r * k - 1);
        hxa += e2 * (r - t);
        haa += E * (ryh - t * t * E);
        hxk += q;
        hak += t * q;
        hkk += yk * (2 - yk) + r * y * y * y * (2 * g * g + h * gp);
      }
    }
  }
  acc[0] = val;
  acc[1] = comp;
  acc[2] = sx;
  acc[3] = sa;
  acc[4] = gk;
  acc[5] = hxx;
  acc[6] = hxa;
  acc[7] = hxk;
  acc[8] = haa;
  acc[9] = hak;
  acc[10] = hkk;
  return true;
}
