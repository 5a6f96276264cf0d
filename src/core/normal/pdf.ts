/**
 * Standard normal density φ(x) = exp(−x²/2)/√(2π).
 *
 * exp(−x²/2) is formed as exp(−h²/2)·exp(−(x−h)(x+h)/2) with h = trunc(16x)/16, so h²/2 is exact and the
 * relative error stays at a few ulp even where φ is near the underflow threshold (|x| ≈ 38).
 */

/** 1/√(2π) */
export const INV_SQRT_2PI = 0.3989422804014326779399461;

/** exp(−x²/2) with the exact-square split. */
export function expNegHalfSquare(x: number): number {
  const a = Math.abs(x);
  if (a === Infinity) return 0;
  const h = Math.trunc(a * 16) / 16;
  const del = (a - h) * (a + h);
  return Math.exp(-0.5 * h * h) * Math.exp(-0.5 * del);
}

/** Standard normal density φ(x); 0 at ±Infinity, NaN for NaN. */
export function normalPdf(x: number): number {
  if (Number.isNaN(x)) return NaN;
  return INV_SQRT_2PI * expNegHalfSquare(x);
}
