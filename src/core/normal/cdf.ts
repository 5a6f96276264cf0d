/**
 * Standard normal CDF Φ, survival 1 − Φ and ln Φ, built on Cody's erf/erfc rationals (see erfc.ts;
 * W. J. Cody 1969, Math. Comp. 23:631–637; SPECFUN CALERF, ACM TOMS Alg. 715, 1993).
 *
 * Lower tail: Φ(x) = ½·erfcx(|x|/√2)·exp(−x²/2). The scaled complement erfcx is smooth, so rounding x/√2 costs
 * almost nothing, and exp(−x²/2) uses the exact-square split: relative error stays near 1e-15 down to the
 * underflow threshold (Φ(−37.5) ≈ 5e-308). The upper half is 1 − Φ(−x) (there 1 − Φ(−x) ≥ ½, no cancellation).
 * ln Φ(x) for x < −1 is ln(½·erfcx(|x|/√2)) − x²/2: finite and accurate far below the underflow of Φ
 * (e.g. x = −1e4, where Cody's third interval is the asymptotic expansion of erfcx in 1/x²).
 */
import { erfcxTail, ERF_SERIES_LIMIT, erf } from "./erfc";
import { expNegHalfSquare } from "./pdf";

/** Φ(x) for x ≤ 0. */
function lowerTail(x: number): number {
  const t = -x * Math.SQRT1_2;
  if (t <= ERF_SERIES_LIMIT) return 0.5 - 0.5 * erf(t);
  // Φ(−39) ≈ 5e-334 is below the smallest double: 0, and no x² overflow for |x| up to the largest double
  if (x < -39) return 0;
  return 0.5 * erfcxTail(t) * expNegHalfSquare(x);
}

/** Standard normal CDF Φ(x); exact 0 at −Infinity and 1 at +Infinity. */
export function normalCdf(x: number): number {
  if (Number.isNaN(x)) return NaN;
  return x <= 0 ? lowerTail(x) : 1 - lowerTail(-x);
}

/** Standard normal survival function 1 − Φ(x), computed as Φ(−x) (never 1 − Φ). */
export function normalSf(x: number): number {
  return normalCdf(-x);
}

/** ln Φ(x); finite and accurate for x ≪ 0 (≈ −x²/2 − ln(−x√(2π))); −Infinity at −Infinity, 0 at +Infinity. */
export function logNormalCdf(x: number): number {
  if (Number.isNaN(x)) return NaN;
  if (x === -Infinity) return -Infinity;
  if (x === Infinity) return 0;
  if (x >= 0) return Math.log1p(-lowerTail(-x));
  if (x > -1) return Math.log(lowerTail(x));
  const t = -x * Math.SQRT1_2;
  return Math.log(0.5 * erfcxTail(t)) - 0.5 * x * x;
}
