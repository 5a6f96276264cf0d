/**
 * Diagnostics of a volatility filter: Ljung–Box portmanteau statistic (Ljung & Box 1978, Biometrika 65:297-303)
 *   Q = n(n + 2) Σ_{j=1..m} ρ̂ⱼ²/(n − j),  ~ χ²(m) under no autocorrelation,
 * applied to the squared standardized residuals (McLeod & Li 1983: did the filter remove the clustering?), and
 * with its p-value from the χ² survival function of src/core/special/incompleteGamma.ts.
 */
import { chiSquareSf } from "../special/incompleteGamma";

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
