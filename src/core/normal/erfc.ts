/**
 * Error function, complementary error function and the scaled complement erfcx(x) = exp(x²)·erfc(x).
 *
 * Algorithm: W. J. Cody (1969), "Rational Chebyshev approximations for the error function",
 * Math. Comp. 23:631–637, as packaged in SPECFUN CALERF (Cody 1993, ACM TOMS Algorithm 715).
 * Three intervals: |x| ≤ 0.46875 (erf rational in x²), 0.46875 < |x| ≤ 4 (erfcx rational in |x|),
 * |x| > 4 (erfcx as (1/√π − R(1/x²)/x²)/|x|). Coefficients are Cody's, rounded to double.
 * The factor exp(−x²) is formed as exp(−h²)·exp(−(x−h)(x+h)) with h = trunc(16x)/16 so h² is exact and the
 * relative error of erfc stays at a few ulp through the far tail (erfc(26.5) ≈ 1e-307).
 */

const ERF_A = [3.1611237438705656, 113.864154151050156, 377.485237685302021, 3209.37758913846947, 0.185777706184603153] as const;
const ERF_B = [23.6012909523441209, 244.024637934444173, 1282.61652607737228, 2844.23683343917062] as const;
const ERFC_C = [
  0.564188496988670089, 8.88314979438837594, 66.1191906371416295, 298.635138197400131, 881.95222124176909,
  1712.04761263407058, 2051.07837782607147, 1230.33935479799725, 2.15311535474403846e-8,
] as const;
const ERFC_D = [
  15.7449261107098347, 117.693950891312499, 537.181101862009858, 1621.38957456669019, 3290.79923573345963,
  4362.61909014324716, 3439.36767414372164, 1230.33935480374942,
] as const;
const ERFC_P = [
  0.305326634961232344, 0.360344899949804439, 0.125781726111229246, 0.0160837851487422766, 6.58749161529837803e-4,
  0.0163153871373020978,
] as const;
const ERFC_Q = [2.56852019228982242, 1.87295284992346047, 0.527905102951428412, 0.0605183413124413191, 0.00233520497626869185] as const;

/** 1/√π */
const INV_SQRT_PI = 0.56418958354775628695;
const THRESH = 0.46875;
/** Below this erf(x) = 2x/√π to double precision (Cody's XSMALL). */
const X_SMALL = 1.11e-16;
/** Above this 1/√π − R/x² = 1/√π to double precision (Cody's XHUGE). */
const X_HUGE = 6.71e7;

/** erf(x)/x·… rational for |x| ≤ 0.46875: returns erf(x). */
function erfSmall(x: number): number {
  const ysq = Math.abs(x) > X_SMALL ? x * x : 0;
  let num = ERF_A[4] * ysq;
  let den = ysq;
  for (let i = 0; i < 3; i++) {
    num = (num + ERF_A[i]) * ysq;
    den = (den + ERF_B[i]) * ysq;
  }
  return (x * (num + ERF_A[3])) / (den + ERF_B[3]);
}

/** exp(y²)·erfc(y) for y > 0.46875. */
function erfcxPositive(y: number): number {
  if (y <= 4) {
    let num = ERFC_C[8] * y;
    let den = y;
    for (let i = 0; i < 7; i++) {
      num = (num + ERFC_C[i]) * y;
      den = (den + ERFC_D[i]) * y;
    }
    return (num + ERFC_C[7]) / (den + ERFC_D[7]);
  }
  if (y >= X_HUGE) return INV_SQRT_PI / y;
  const ysq = 1 / (y * y);
  let num = ERFC_P[5] * ysq;
  let den = ysq;
  for (let i = 0; i < 4; i++) {
    num = (num + ERFC_P[i]) * ysq;
    den = (den + ERFC_Q[i]) * ysq;
  }
  const r = (ysq * (num + ERFC_P[4])) / (den + ERFC_Q[4]);
  return (INV_SQRT_PI - r) / y;
}

/** exp(−y²) for y ≥ 0 with the exact-square split (only the small remainder carries rounding). */
export function expNegSquare(y: number): number {
  const h = Math.trunc(y * 16) / 16;
  const del = (y - h) * (y + h);
  return Math.exp(-h * h) * Math.exp(-del);
}

/** Scaled complementary error function exp(x²)·erfc(x); finite for x ≥ 0, overflows to +Infinity for x ≪ 0. */
export function erfcx(x: number): number {
  if (Number.isNaN(x)) return NaN;
  const y = Math.abs(x);
  if (y <= THRESH) return Math.exp(x * x) * (1 - erfSmall(x));
  const r = erfcxPositive(y);
  if (x > 0) return r;
  // erfc(−y) = 2 − erfc(y); exp(y²) overflows beyond y ≈ 26.6.
  return 2 * Math.exp(y * y) - r;
}

/** Error function erf(x) = (2/√π)∫₀ˣ e^{−t²} dt; odd, accurate to a few ulp, exact ±1 beyond |x| ≈ 6. */
export function erf(x: number): number {
  if (Number.isNaN(x)) return NaN;
  const y = Math.abs(x);
  if (y <= THRESH) return erfSmall(x);
  const c = y === Infinity ? 0 : expNegSquare(y) * erfcxPositive(y);
  return x > 0 ? 1 - c : c - 1;
}

/** Complementary error function 1 − erf(x), with small relative error in the far right tail (to ~1e-307). */
export function erfc(x: number): number {
  if (Number.isNaN(x)) return NaN;
  const y = Math.abs(x);
  if (y <= THRESH) return 1 - erfSmall(x);
  const c = y === Infinity ? 0 : expNegSquare(y) * erfcxPositive(y);
  return x > 0 ? c : 2 - c;
}

/** Internal: erfcx(y) for y > 0.46875 (used by the normal tail kernels). */
export { erfcxPositive as erfcxTail, THRESH as ERF_SERIES_LIMIT };
/** Internal: erf(x) for |x| ≤ 0.46875 (no checks; used by kernels that have already split on |x|). */
export { erfSmall as erfCentral };
