/**
 * Returns from a price series: log returns ln(P_t/P_{t−1}) = log1p((P_t − P_{t−1})/P_{t−1}) and simple returns
 * (P_t − P_{t−1})/P_{t−1}. Both are formed from the price difference so that small moves keep their digits; a
 * log return of a large move (|b/a − 1| > 1/2, where log1p's argument has lost digits to the division) is
 * ln(b) − ln(a) instead, which stays accurate down to a near-total loss.
 *
 * Total: a return is NaN when either price is missing (NaN), not finite or not positive. The output is one
 * shorter than the input (empty for fewer than 2 prices).
 */
export type ReturnKind = "log" | "simple";

export const RETURN_KINDS: readonly ReturnKind[] = ["log", "simple"];

/** One-period return from price a to price b. */
export function periodReturn(a: number, b: number, kind: ReturnKind = "log"): number {
  if (!(a > 0 && b > 0 && a < Infinity && b < Infinity)) return NaN;
  const rel = (b - a) / a;
  if (kind === "simple") return rel;
  return Math.abs(rel) <= 0.5 ? Math.log1p(rel) : Math.log(b) - Math.log(a);
}

/** Returns of a price series, one shorter than the series. */
export function returnsFromPrices(prices: ArrayLike<number>, kind: ReturnKind = "log"): Float64Array {
  const n = Math.max(0, prices.length - 1);
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) out[i] = periodReturn(prices[i], prices[i + 1], kind);
  return out;
}
