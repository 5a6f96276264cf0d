/**
 * Binomial distribution of an exception count: log-probabilities and the cumulative distribution.
 *
 * The probability mass is built by the ratio recursion P(j+1)/P(j) = (n-j)/(j+1) · p/(1-p), started from
 * ln P(0) = n·ln(1-p) (log1p), and summed in log space with a running log-sum-exp, so no term underflows
 * before it is added and no factorial is formed. Every term is exact up to rounding (≈ j·ε relative after
 * j steps), which is ample for the traffic-light cut-offs of a VaR backtest (n up to tens of thousands).
 *
 * Total functions: NaN outside the domain (n not a whole number ≥ 0, p outside [0, 1]); exact 0/1 at the edges.
 */

function validCount(n: number): boolean {
  return Number.isInteger(n) && n >= 0;
}

function logAddExp(a: number, b: number): number {
  if (a === -Infinity) return b;
  if (b === -Infinity) return a;
  return a > b ? a + Math.log1p(Math.exp(b - a)) : b + Math.log1p(Math.exp(a - b));
}

/**
 * ln P(X ≤ x) for X ~ Binomial(n, p); x is floored. −Infinity when x < 0 (or the mass below x is 0), 0 when x ≥ n.
 */
export function binomialLogCdf(x: number, n: number, p: number): number {
  if (!validCount(n) || !(p >= 0 && p <= 1) || Number.isNaN(x)) return NaN;
  const top = Math.floor(x);
  if (top < 0) return -Infinity;
  if (top >= n) return 0;
  if (p === 0) return 0;
  if (p === 1) return -Infinity;
  const logRatio = Math.log(p) - Math.log1p(-p);
  let logTerm = n * Math.log1p(-p);
  let acc = logTerm;
  for (let j = 0; j < top; j++) {
    logTerm += Math.log((n - j) / (j + 1)) + logRatio;
    acc = logAddExp(acc, logTerm);
  }
  return Math.min(acc, 0);
}

/** P(X ≤ x) for X ~ Binomial(n, p); x is floored. */
export function binomialCdf(x: number, n: number, p: number): number {
  return Math.exp(binomialLogCdf(x, n, p));
}

/**
 * The smallest count x with P(X ≤ x) ≥ level, for X ~ Binomial(n, p) and level in (0, 1]; NaN otherwise.
 * One pass over the mass function.
 */
export function binomialQuantile(level: number, n: number, p: number): number {
  if (!validCount(n) || !(p >= 0 && p <= 1) || !(level > 0 && level <= 1)) return NaN;
  if (p === 0) return 0;
  if (p === 1) return n;
  const logLevel = Math.log(level);
  const logRatio = Math.log(p) - Math.log1p(-p);
  let logTerm = n * Math.log1p(-p);
  let acc = logTerm;
  for (let j = 0; j < n; j++) {
    if (acc >= logLevel) return j;
    logTerm += Math.log((n - j) / (j + 1)) + logRatio;
    acc = logAddExp(acc, logTerm);
  }
  return n;
}
