/**
 * Chi-square survival function for any positive (also fractional) degrees of freedom, needed where the reference
 * law is not χ²₁ or χ²₂: the multinomial ES backtest with N levels (χ²_N) and Nass's (1959) scaled approximation
 * (χ²_ν with fractional ν).
 *
 * P(χ²_ν > x) = Q(ν/2, x/2), the regularised upper incomplete gamma function, computed as in Press et al.,
 * Numerical Recipes (2nd ed., §6.2): the power series for P(a, x) when x < a + 1 (then Q = 1 − P), otherwise the
 * continued fraction for Q evaluated by the modified Lentz method. Relative accuracy about 1e-14 in the body;
 * the continued fraction keeps relative accuracy far into the upper tail.
 *
 * Total: NaN for NaN or ν ≤ 0, 1 for x ≤ 0, 0 at +Infinity.
 */
import { lnGamma } from "./index";

const EPS = 1e-16;
const TINY = 1e-300;
const MAX_TERMS = 10_000;

/** Regularised upper incomplete gamma Q(a, x) = Γ(a, x)/Γ(a), a > 0, x ≥ 0. */
export function upperGammaRegularized(a: number, x: number): number {
  if (Number.isNaN(a) || Number.isNaN(x) || !(a > 0)) return NaN;
  if (x <= 0) return 1;
  if (x === Infinity) return 0;
  const logPrefix = a * Math.log(x) - x - lnGamma(a);
  if (x < a + 1) {
    // Series: P(a, x) = e^{−x} x^a / Γ(a+1) · Σ x^n / ((a+1)…(a+n)).
    let term = 1 / a;
    let sum = term;
    let ap = a;
    for (let n = 0; n < MAX_TERMS; n++) {
      ap += 1;
      term *= x / ap;
      sum += term;
      if (Math.abs(term) < Math.abs(sum) * EPS) break;
    }
    return Math.max(0, 1 - sum * Math.exp(logPrefix));
  }
  // Continued fraction for Q(a, x) (Lentz).
  let b = x + 1 - a;
  let c = 1 / TINY;
  let d = 1 / b;
  let h = d;
  for (let i = 1; i < MAX_TERMS; i++) {
    const an = -i * (i - a);
    b += 2;
    d = an * d + b;
    if (Math.abs(d) < TINY) d = TINY;
    c = b + an / c;
    if (Math.abs(c) < TINY) c = TINY;
    d = 1 / d;
    const delta = d * c;
    h *= delta;
    if (Math.abs(delta - 1) < EPS) break;
  }
  return Math.exp(logPrefix) * h;
}

/** P(χ²_ν > x) for ν > 0 (fractional ν allowed). */
export function chiSquareSf(x: number, degrees: number): number {
  if (Number.isNaN(x) || Number.isNaN(degrees) || !(degrees > 0)) return NaN;
  if (x <= 0) return 1;
  return upperGammaRegularized(degrees / 2, x / 2);
}
