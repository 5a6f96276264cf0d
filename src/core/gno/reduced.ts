/**
 * The reduced (standard normal) variate of the GNO law and its inverse, with the cancellation near k = 0 and
 * near the support edge designed out.
 *
 * y(x) = −ln(w)/k with w = 1 − k(x − ξ)/α, y = (x − ξ)/α at k = 0 (Hosking & Wallis 1997, App. A.8).
 * - Small |k t| (t = (x − ξ)/α): y = t·log1p(−kt)/(−kt), with a series for log1p(u)/u when |u| < 1e-8, so
 *   shapes down to 1e-12, subnormal shapes and exactly 0 all keep full relative accuracy.
 * - Near the edge (w ≤ ½): w is formed from error-free transformations (Knuth TwoSum, Dekker TwoProduct) of
 *   α − k(x − ξ), so its relative error stays at a few ulp even when w ≈ 1e-12, and y = −ln(w)/k.
 * Inverse: x(z) = ξ + α·g(z), g(z) = −expm1(−kz)/k, with g = z(1 + u/2 + u²/6), u = −kz, when |u| < 1e-5.
 */
import type { GnoParams } from "./params";
import { isValidParams } from "./params";

const SPLITTER = 134217729; // 2^27 + 1, Dekker's splitting constant for doubles

/** log1p(u)/u, continuous through u = 0. */
function log1pRatio(u: number): number {
  if (Math.abs(u) < 1e-8) return 1 - u / 2 + (u * u) / 3;
  return Math.log1p(u) / u;
}

/** w = 1 − k(x − ξ)/α with a few ulp of relative error even when w is tiny (used near the edge only). */
function edgeDistance(x: number, p: GnoParams): number {
  const { location: xi, scale: a, shape: k } = p;
  // TwoSum: d + dErr = x − ξ exactly.
  const d = x - xi;
  const bb = d - x;
  const dErr = x - (d - bb) + (-xi - bb);
  // TwoProduct (Dekker): prod + prodErr = k·d exactly, barring overflow.
  const prod = k * d;
  const ck = SPLITTER * k;
  const kh = ck - (ck - k);
  const kl = k - kh;
  const cd = SPLITTER * d;
  const dh = cd - (cd - d);
  const dl = d - dh;
  const prodErr = kh * dh - prod + kh * dl + kl * dh + kl * dl;
  if (!Number.isFinite(prodErr)) return 1 - prod / a;
  return (a - prod - prodErr - k * dErr) / a;
}

/**
 * Reduced variate y(x) for valid params: −Infinity below a lower edge, +Infinity above an upper edge
 * (and at the edge itself), NaN for invalid params or NaN x.
 */
export function reducedVariate(x: number, p: GnoParams): number {
  if (!isValidParams(p) || Number.isNaN(x)) return NaN;
  const k = p.shape;
  const t = (x - p.location) / p.scale;
  if (k === 0 || !Number.isFinite(t)) {
    if (k === 0 || t === 0) return t;
    // |x| infinite: on the unbounded side y → ±∞ with the sign of t; on the bounded side beyond the edge.
    return k * t > 0 ? (k > 0 ? Infinity : -Infinity) : t;
  }
  const kt = k * t;
  if (kt < 0.5) return t * log1pRatio(-kt);
  if (kt >= 1) return k > 0 ? Infinity : -Infinity;
  const w = edgeDistance(x, p);
  if (!(w > 0)) return k > 0 ? Infinity : -Infinity;
  return -Math.log(w) / k;
}

/** g(z) = (x(z) − ξ)/α = −expm1(−kz)/k (z at k = 0); z = ±Infinity map to the edge or ±Infinity. */
export function reducedQuantile(z: number, k: number): number {
  if (k === 0) return z;
  const u = -k * z;
  if (Math.abs(u) < 1e-5) return z * (1 + u / 2 + (u * u) / 6);
  return -Math.expm1(u) / k;
}
