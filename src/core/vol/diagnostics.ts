/**
 * Diagnostics of a volatility filter: Ljung–Box portmanteau statistic (Ljung & Box 1978, Biometrika 65:297-303)
 *   Q = n(n + 2) Σ_{j=1..m} ρ̂ⱼ²/(n − j),  ~ χ²(m) under no autocorrelation,
 * applied to the squared standardized residuals (McLeod & Li 1983: did the filter remove the clustering?), and
 * the χ² survival function through the regularized upper incomplete gamma Q(m/2, x/2) (series for x < a + 1,
 * Lentz continued fraction beyond; Press et al., Numerical Recipes 3rd ed. §6.2).
 */
import { lnGamma } from "../special";

/** Regularized upper incomplete gamma Q(a, x) = Γ(a, x)/Γ(a). */
export function upperGammaRegularized(a: number, x: number): number {
  if (!(a > 0) || !(x >= 0)) return NaN;
  if (x === 0) return 1;
  const lead = a * Math.log(x) - x - lnGamma(a);
  if (x < a + 1) {
    let sum = 1 / a;
    let term = sum;
    for (let n = 1; n < 1000; n++) {
      term *= x / (a + n);
      sum += term;
      if (Math.abs(term) < Math.abs(sum) * 1e-16) break;
    }
    return Math.max(0, 1 - sum * Math.exp(lead));
  }
  const tiny = 1e-300;
  let b = x + 1 - a;
  let c = 1 / tiny;
  let d = 1 / b;
  let h = d;
  for (let i = 1; i < 1000; i++) {
    const an = -i * (i - a);
    b += 2;
    d = an * d + b;
    if (Math.abs(d) < tiny) d = tiny;
    c = b + an / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    const del = d * c;
    h *= del;
    if (Math.abs(del - 1) < 1e-16) break;
  }
  return Math.exp(lead) * h;
}

/** P(χ²(df) > x). */
export function chiSquareSf(x: number, df: number): number {
  return upperGammaRegularized(df / 2, x / 2);
}

export interface LjungBox {
  readonly statistic: number;
  readonly lags: number;
  readonly pValue: number;
}

/** Ljung–Box Q over `lags` autocorrelations of x (mean removed). */
export function ljungBox(x: ArrayLike<number>, lags: number): LjungBox {
  const n = x.length;
  let m = 0;
  for (let i = 0; i < n; i++) m += x[i];
  m /= n;
  let c0 = 0;
  for (let i = 0; i < n; i++) c0 += (x[i] - m) * (x[i] - m);
  let q = 0;
  for (let j = 1; j <= lags; j++) {
    let c = 0;
    for (let i = j; i < n; i++) c += (x[i] - m) * (x[i - j] - m);
    const rho = c / c0;
    q += (rho * rho) / (n - j);
  }
  q *= n * (n + 2);
  return { statistic: q, lags, pValue: chiSquareSf(q, lags) };
}
