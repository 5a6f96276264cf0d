/**
 * In-place ascending sort of a Float64Array of finite numbers.
 *
 * From BUCKET_MIN values on: a distribution (bucket) sort — one pass assigns each value to one of n equal-width
 * buckets over [min, max] (the bucket index floor((x − min)·n/(max − min)) is monotone in x, so the buckets in
 * order are already in order), one pass scatters, and each bucket is finished by insertion sort (or by introsort
 * when it holds more than BUCKET_CROWD values, so a crowded bucket — an outlier squeezing the rest together —
 * costs O(k log k), never O(k²)). Expected O(n) for data with a density (returns, draws); on random data it is
 * 4–5× faster than a comparison sort, whose time goes mostly into mispredicted branches.
 * Below BUCKET_MIN, and for any bucket that needs it: introsort (Musser 1997, "Introspective sorting and selection
 * algorithms", Software: Practice and Experience 27(8)) — quicksort with median-of-three pivots, insertion sort for
 * short ranges, heapsort once the recursion is 2·log2(n) deep, so the worst case stays O(n log n) on any input.
 *
 * Why not Float64Array.prototype.sort: in V8 (node 20) it took 113 µs on 1,859 permuted returns against 95 µs
 * for introsort and (bucket sort) about a quarter of that; sorting is the one super-linear step of a fit's start.
 * Ties and signed zeros: the result is ascending by `<`; −0 and +0 compare equal and may come out in either
 * order (the built-in sort puts −0 first) — no caller distinguishes them. NaN is not supported: a NaN anywhere
 * falls back to the built-in sort (NaN last). The bucket path keeps its buffers between calls up to 131,072 values,
 * so repeated sorts (a bootstrap's replicates) allocate nothing.
 */

/** From this many values on, sortFinite distributes into buckets first. */
export const BUCKET_MIN = 256;
/** A bucket with more values than this is finished by introsort instead of insertion sort. */
const BUCKET_CROWD = 32;

/**
 * Buckets and scatter space for the bucket path, kept between calls for up to KEPT_MAX values (a sort runs to
 * completion, never interleaved with another); a longer array gets temporaries, so no big buffer stays alive.
 */
const KEPT_MAX = 1 << 17;
let keptStart = new Int32Array(0);
let keptSpread = new Float64Array(0);

/** Sorts `a` ascending in place and returns it. */
export function sortFinite(a: Float64Array): Float64Array {
  const range = finiteRange(a);
  if (!range) return a.sort();
  const n = a.length;
  if (n >= BUCKET_MIN && bucketInto(a, a, range[0], range[1])) return a;
  if (n > 1) introsort(a, 0, n - 1, depthLimit(n));
  return a;
}

/** A sorted copy of the numbers; the input is left alone. */
export function sortedCopy(data: ArrayLike<number>): Float64Array {
  if (!(data instanceof Float64Array)) return sortFinite(Float64Array.from(data));
  const range = finiteRange(data);
  if (!range) return data.slice().sort();
  const n = data.length;
  if (n >= BUCKET_MIN) {
    const out = new Float64Array(n);
    if (bucketInto(data, out, range[0], range[1])) return out;
  }
  const copy = data.slice();
  if (n > 1) introsort(copy, 0, n - 1, depthLimit(n));
  return copy;
}

/** [min, max] of the values, or null when one is NaN. */
function finiteRange(a: Float64Array): [number, number] | null {
  let min = Infinity;
  let max = -Infinity;
  for (let i = 0; i < a.length; i++) {
    const x = a[i];
    if (x !== x) return null;
    if (x < min) min = x;
    if (x > max) max = x;
  }
  return [min, max];
}

function depthLimit(n: number): number {
  return 2 * Math.floor(Math.log2(Math.max(2, n)));
}

/**
 * The bucket sort of src into dest (dest may be src itself); false, with nothing written, when [min, max] cannot be
 * cut into n buckets (no spread, or a spread that overflows).
 */
function bucketInto(src: Float64Array, dest: Float64Array, min: number, max: number): boolean {
  const n = src.length;
  const scale = n / (max - min);
  if (!(scale > 0 && scale < Infinity)) return false;
  let start: Int32Array;
  let spread: Float64Array;
  if (n > KEPT_MAX) {
    start = new Int32Array(n + 1);
    spread = new Float64Array(n);
  } else {
    if (keptSpread.length < n) {
      keptStart = new Int32Array(n + 1);
      keptSpread = new Float64Array(n);
    } else keptStart.fill(0, 0, n + 1);
    start = keptStart;
    spread = keptSpread;
  }
  const bucket = (x: number): number => {
    const b = ((x - min) * scale) | 0;
    return b >= n ? n - 1 : b;
  };
  for (let i = 0; i < n; i++) start[bucket(src[i]) + 1]++;
  for (let b = 0; b < n; b++) start[b + 1] += start[b];
  // scatter, using start[b] as bucket b's cursor: afterwards start[b] is where bucket b ends
  const target = dest === src ? spread : dest;
  for (let i = 0; i < n; i++) target[start[bucket(src[i])]++] = src[i];
  if (target !== dest) dest.set(target.subarray(0, n));
  const depth = depthLimit(n);
  for (let b = 0; b < n; b++) {
    const lo = b === 0 ? 0 : start[b - 1];
    const hi = start[b] - 1;
    if (hi - lo < 1) continue;
    if (hi - lo < BUCKET_CROWD) insertionSort(dest, lo, hi);
    else introsort(dest, lo, hi, depth);
  }
  return true;
}

function insertionSort(a: Float64Array, lo: number, hi: number): void {
  for (let i = lo + 1; i <= hi; i++) {
    const v = a[i];
    let j = i - 1;
    while (j >= lo && a[j] > v) {
      a[j + 1] = a[j];
      j--;
    }
    a[j + 1] = v;
  }
}

const INSERTION_MAX = 24;

/** Introsort of a[lo..hi] (inclusive) with `depth` quicksort levels before heapsort (0: heapsort at once; tests). */
export function introsort(a: Float64Array, lo: number, hi: number, depth: number): void {
  while (hi - lo > INSERTION_MAX) {
    if (depth === 0) {
      heapsort(a, lo, hi);
      return;
    }
    depth--;
    const mid = (lo + hi) >>> 1;
    let p0 = a[lo];
    let p1 = a[mid];
    const p2 = a[hi];
    if (p1 < p0) {
      const t = p0;
      p0 = p1;
      p1 = t;
    }
    if (p2 < p1) {
      p1 = p2 < p0 ? p0 : p2;
    }
    const pivot = p1;
    let i = lo;
    let j = hi;
    while (i <= j) {
      while (a[i] < pivot) i++;
      while (a[j] > pivot) j--;
      if (i <= j) {
        const t = a[i];
        a[i] = a[j];
        a[j] = t;
        i++;
        j--;
      }
    }
    // recurse into the smaller side, loop on the larger (stack depth ≤ log2 n)
    if (j - lo < hi - i) {
      if (lo < j) introsort(a, lo, j, depth);
      lo = i;
    } else {
      if (i < hi) introsort(a, i, hi, depth);
      hi = j;
    }
  }
  insertionSort(a, lo, hi);
}

function heapsort(a: Float64Array, lo: number, hi: number): void {
  const n = hi - lo + 1;
  const sift = (start: number, end: number): void => {
    let root = start;
    for (;;) {
      let child = 2 * root + 1;
      if (child > end) return;
      if (child + 1 <= end && a[lo + child] < a[lo + child + 1]) child++;
      if (a[lo + root] < a[lo + child]) {
        const t = a[lo + root];
        a[lo + root] = a[lo + child];
        a[lo + child] = t;
        root = child;
      } else return;
    }
  };
  for (let s = (n >>> 1) - 1; s >= 0; s--) sift(s, n - 1);
  for (let end = n - 1; end > 0; end--) {
    const t = a[lo];
    a[lo] = a[lo + end];
    a[lo + end] = t;
    sift(0, end - 1);
  }
}
