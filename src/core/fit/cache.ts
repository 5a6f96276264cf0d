/**
 * Caches keyed by the data's content, so FIT, FITREPORT and every later function on the same range reuse one
 * result instead of recomputing on each recalculation.
 *
 * A hit is proven, never presumed: each entry keeps its own copy of the numbers, and a lookup is a hit only when
 * the length and every IEEE-754 bit pattern are equal (so −0 ≠ 0 and NaN payloads count, as a refit would see
 * them). The 64-bit hash (two independent 32-bit FNV-1a lanes over the raw bytes) only picks the bucket; two
 * samples with the same hash — such collisions can be constructed — are separate entries. Least-recently-used
 * eviction over at most `entries` entries and `maxNumbers` cached numbers in total (the copies are the memory
 * cost: 8 bytes a number).
 */
import { fitGnoWork, type FitMethod, type GnoFit } from "./fit";
import { runToEnd, type Work } from "../work";

export const CACHE_SIZE = 16;
/** Most numbers all copies in one cache may hold together (4,000,000 numbers = 32 MB). */
export const CACHE_MAX_NUMBERS = 4_000_000;

/** Content hash of a sample for a method (a bucket label, not a proof of equality). */
export function dataKey(data: Float64Array, method: string): string {
  const words = new Uint32Array(data.buffer, data.byteOffset, data.length * 2);
  let h1 = 0x811c9dc5;
  let h2 = 0x01000193 ^ 0x5bd1e995;
  for (let i = 0; i < words.length; i++) {
    const v = words[i];
    h1 = Math.imul(h1 ^ v, 0x01000193) >>> 0;
    h2 = Math.imul(h2 ^ ((v >>> 16) | (v << 16)), 0x01000193) >>> 0;
  }
  return `${method}:${data.length}:${h1.toString(16)}:${h2.toString(16)}`;
}

/** True when a and b have the same length and the same bits in every element. */
export function sameContent(a: Float64Array, b: Float64Array): boolean {
  if (a.length !== b.length) return false;
  if (a.byteOffset % 4 === 0 && b.byteOffset % 4 === 0) {
    const wa = new Uint32Array(a.buffer, a.byteOffset, a.length * 2);
    const wb = new Uint32Array(b.buffer, b.byteOffset, b.length * 2);
    for (let i = 0; i < wa.length; i++) if (wa[i] !== wb[i]) return false;
    return true;
  }
  for (let i = 0; i < a.length; i++) if (!Object.is(a[i], b[i])) return false;
  return true;
}

interface Entry<V> {
  readonly data: Float64Array;
  readonly value: V;
}

/** A least-recently-used cache of values computed from a sample (plus a label for the other inputs). */
export class ContentCache<V> {
  private readonly buckets = new Map<string, Entry<V>[]>();
  private numbers = 0;
  private count = 0;

  constructor(
    private readonly entries = CACHE_SIZE,
    private readonly maxNumbers = CACHE_MAX_NUMBERS,
  ) {}

  /** The value cached for exactly these numbers and this label, or undefined. */
  get(data: Float64Array, label: string): V | undefined {
    return this.getByKey(dataKey(data, label), data);
  }

  /** get with the bucket key already computed (dataKey(data, label)): a miss followed by set hashes once. */
  getByKey(key: string, data: Float64Array): V | undefined {
    const bucket = this.buckets.get(key);
    if (!bucket) return undefined;
    const hit = bucket.find((e) => sameContent(e.data, data));
    if (!hit) return undefined;
    this.buckets.delete(key);
    this.buckets.set(key, bucket);
    return hit.value;
  }

  /** Stores a value for these numbers (a private copy of them is kept). */
  set(data: Float64Array, label: string, value: V): void {
    this.setByKey(dataKey(data, label), data, value);
  }

  /** set with the bucket key already computed (it must be dataKey(data, label) of these very numbers). */
  setByKey(key: string, data: Float64Array, value: V): void {
    if (data.length > this.maxNumbers) return;
    const bucket = this.buckets.get(key) ?? [];
    const at = bucket.findIndex((e) => sameContent(e.data, data));
    if (at >= 0) {
      this.numbers -= bucket[at].data.length;
      this.count--;
      bucket.splice(at, 1);
    }
    bucket.push({ data: data.slice(), value });
    this.numbers += data.length;
    this.count++;
    this.buckets.delete(key);
    this.buckets.set(key, bucket);
    while (this.count > this.entries || this.numbers > this.maxNumbers) {
      const oldest = this.buckets.keys().next().value as string;
      const b = this.buckets.get(oldest)!;
      const gone = b.shift()!;
      this.numbers -= gone.data.length;
      this.count--;
      if (b.length === 0) this.buckets.delete(oldest);
    }
  }

  clear(): void {
    this.buckets.clear();
    this.numbers = 0;
    this.count = 0;
  }

  get size(): number {
    return this.count;
  }
}

const cache = new ContentCache<GnoFit>();

/** The fit of these numbers by this method: computed once, then the same object for the same numbers. */
export function fitGnoCached(data: Float64Array, method: FitMethod = "mle"): GnoFit {
  return runToEnd(fitGnoCachedWork(data, method));
}

/**
 * fitGnoCached as resumable work: a cached fit is returned at once (no step); otherwise the fit runs as
 * fitGnoWork and is stored when it finishes (a canceled fit stores nothing).
 */
export function* fitGnoCachedWork(data: Float64Array, method: FitMethod = "mle"): Work<GnoFit> {
  const key = dataKey(data, method);
  const hit = cache.getByKey(key, data);
  if (hit) return hit;
  const fit = yield* fitGnoWork(data, { method });
  cache.setByKey(key, data, fit); // the fit never writes to data, so the key still holds
  return fit;
}

/**
 * Stores a fit computed elsewhere for these numbers (the pane's worker computes it with fitGnoCachedWork and
 * posts it back; a structured clone keeps every number bit for bit), so later calls in this thread reuse it.
 * An entry already present is kept.
 */
export function rememberFit(data: Float64Array, method: FitMethod, fit: GnoFit): void {
  if (cache.get(data, method) === undefined) cache.set(data, method, fit);
}

/** Empties the cache (tests). */
export function clearFitCache(): void {
  cache.clear();
}
