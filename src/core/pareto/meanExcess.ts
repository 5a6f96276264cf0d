/**
 * The sample mean-excess function, the usual picture for choosing a threshold (Davison & Smith 1990; McNeil 1997):
 * for a threshold u on the loss side, e(u) = mean of (u − x) over the returns x < u (on the gain side, of x − u
 * over x > u). Above a threshold where a generalized Pareto tail holds, e(u) is linear in the distance beyond u
 * with slope ξ/(1 − ξ); a flat stretch means ξ ≈ 0, a rising one a heavy tail. Points are taken at order
 * statistics, from the `maxShare` most extreme returns down to `minExceedances` of them.
 */
export interface MeanExcessPoint {
  /** The threshold (a return). */
  readonly threshold: number;
  /** Number of returns beyond it. */
  readonly exceedances: number;
  /** Mean distance beyond it. */
  readonly meanExcess: number;
}

/** e(u) at up to `points` order-statistic thresholds; side "lower" (losses) or "upper". */
export function sampleMeanExcess(
  data: ArrayLike<number>,
  side: "lower" | "upper",
  options: { maxShare?: number; minExceedances?: number; points?: number } = {},
): MeanExcessPoint[] {
  // Work in the tail's own direction, v = x (upper) or −x (lower), sorted descending (most extreme first).
  const desc = Float64Array.from(data, (x) => (side === "lower" ? -x : x))
    .sort()
    .reverse();
  const n = desc.length;
  const maxK = Math.min(n - 1, Math.floor((options.maxShare ?? 0.5) * n));
  const minK = Math.max(1, options.minExceedances ?? 10);
  const points = Math.max(2, options.points ?? 50);
  const out: MeanExcessPoint[] = [];
  if (maxK < minK) return out;
  const prefix = new Float64Array(n + 1);
  for (let i = 0; i < n; i++) prefix[i + 1] = prefix[i] + desc[i];
  const step = Math.max(1, Math.floor((maxK - minK) / (points - 1)));
  for (let k = minK; k <= maxK; k += step) {
    const u = desc[k];
    let m = k;
    while (m > 0 && desc[m - 1] === u) m--;
    if (m === 0) continue;
    const meanExcess = prefix[m] / m - u;
    out.push(Object.freeze({ threshold: side === "lower" ? -u : u, exceedances: m, meanExcess }));
  }
  return out;
}
