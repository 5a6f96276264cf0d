/**
 * Fit cache keyed by the data's content, so FIT, FITREPORT and every later function on the same range
 * reuse one fit instead of refitting on each recalculation.
 *
 * Key: method, length and two independent 32-bit FNV-1a hashes (different offset bases) over the raw
 * IEEE-754 bytes of the numbers, plus the first and last values as a cheap collision guard. The data are
 * hashed in place (a Uint32Array view of the same buffer; no copy). Least-recently-used eviction over
 * CACHE_SIZE entries, using Map's insertion order.
 */
import { fitGno, type FitMethod, type GnoFit } from "./fit";

export const CACHE_SIZE = 16;
const cache = new Map<string, GnoFit>();

/** Content key of a sample for a method. */
export function dataKey(data: Float64Array, method: FitMethod): string {
  const words = new Uint32Array(data.buffer, data.byteOffset, data.length * 2);
  let h1 = 0x811c9dc5;
  let h2 = 0x01000193 ^ 0x5bd1e995;
  for (let i = 0; i < words.length; i++) {
    const v = words[i];
    h1 = Math.imul(h1 ^ v, 0x01000193) >>> 0;
    h2 = Math.imul(h2 ^ ((v >>> 16) | (v << 16)), 0x01000193) >>> 0;
  }
  const first = data.length > 0 ? data[0] : 0;
  const last = data.length > 0 ? data[data.length - 1] : 0;
  return `${method}:${data.length}:${h1.toString(16)}:${h2.toString(16)}:${first}:${last}`;
}

/** The fit of these numbers by this method: computed once, then the same object for the same numbers. */
export function fitGnoCached(data: Float64Array, method: FitMethod = "mle"): GnoFit {
  const key = dataKey(data, method);
  const hit = cache.get(key);
  if (hit) {
    cache.delete(key);
    cache.set(key, hit);
    return hit;
  }
  const fit = fitGno(data, { method });
  cache.set(key, fit);
  while (cache.size > CACHE_SIZE) cache.delete(cache.keys().next().value as string);
  return fit;
}

/** Empties the cache (tests). */
export function clearFitCache(): void {
  cache.clear();
}
