/**
 * Rolling runs cached by content, so ROLLVAR, ROLLES and ROLLPIT over the same column with the same window, model,
 * method and decay fit each window once (a sheet usually holds the three side by side). The forecast laws do not
 * depend on the confidence level or the side, so those are not part of the key.
 *
 * Key: the content hash of the returns (fit/cache.ts dataKey: two FNV-1a hashes of the IEEE-754 bytes, length,
 * first and last values) plus every argument the run depends on. A hit is proven, not trusted: the stored copy of
 * the returns must equal the new ones value by value (blank rows, held as NaN, equal each other). Least recently
 * used eviction over ROLLING_CACHE_SIZE runs (a 20,000-row run holds 20,000 small law objects).
 */
import { dataKey } from "../../fit";
import type { ModelOptions } from "./registry";
import type { RollingForecasts } from "./rolling";

export const ROLLING_CACHE_SIZE = 8;

interface Entry {
  readonly values: Float64Array;
  readonly run: RollingForecasts;
}

const cache = new Map<string, Entry>();
const stats = { hits: 0, misses: 0, stored: 0 };

/** The key of a run: content hash of the returns plus window, model, method and decay. */
export function rollingCacheKey(values: Float64Array, window: number, model: string, options: ModelOptions): string {
  return `${dataKey(values, "mle")}|w${window}|${model}|${options.method ?? ""}|${options.lambda ?? ""}|${options.warmStart === false ? "cold" : "warm"}`;
}

/** Same numbers in the same rows (NaN equals NaN; -0 and 0 differ, as their bytes do). */
export function sameContent(a: Float64Array, b: Float64Array): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (!Object.is(a[i], b[i])) return false;
  return true;
}

/** The stored run for this key when its returns equal `values` exactly; undefined otherwise. */
export function cachedRolling(key: string, values: Float64Array): RollingForecasts | undefined {
  const hit = cache.get(key);
  if (!hit || !sameContent(hit.values, values)) {
    stats.misses++;
    return undefined;
  }
  cache.delete(key);
  cache.set(key, hit);
  stats.hits++;
  return hit.run;
}

/** Stores a finished run (with its own copy of the returns). */
export function storeRolling(key: string, values: Float64Array, run: RollingForecasts): void {
  cache.delete(key);
  cache.set(key, { values: Float64Array.from(values), run });
  stats.stored++;
  while (cache.size > ROLLING_CACHE_SIZE) cache.delete(cache.keys().next().value as string);
}

/** Hits, misses and runs stored (= runs computed by the cells) since the last clear (tests, bench). */
export function rollingCacheStats(): { hits: number; misses: number; stored: number; size: number } {
  return { ...stats, size: cache.size };
}

/** Empties the cache and its counters (tests). */
export function clearRollingCache(): void {
  cache.clear();
  stats.hits = 0;
  stats.misses = 0;
  stats.stored = 0;
}
