/**
 * Sliding-window method of L-moments: the window's values are kept sorted and updated by one insertion and one
 * deletion per step (binary search + a block move, O(w) with a tiny constant, no re-sort), and the sample L-moments
 * are the same probability-weighted-moment sums as the batch estimator (sampleStats.ts, Hosking 1990) over that
 * sorted window, so every estimate equals the batch estimate of the same window exactly. No likelihood is computed.
 *
 * Use (one object per series):
 *   const f = new SlidingLMoments(window);
 *   for each usable value v in time order:
 *     if (f.full) { const e = f.estimate(); …forecast from e.params (null: constant window, no law) }
 *     f.push(v);                // when full, the oldest value leaves the window first
 * or, when each step hands over the whole window (a forecast model's forecast(window, state)):
 *   f.slideTo(window); const e = f.estimate();   // one push when the window moved on by one value
 */
import { sampleLMomentsSorted, type SampleLMoments } from "./sampleStats";
import { estimateFromLMoments, type LMomentEstimate } from "./lmomentEstimator";

export class SlidingLMoments {
  /** Values in arrival order (a ring of `window` slots). */
  private readonly ring: Float64Array;
  /** The same values, ascending, in the first `count` slots. */
  private readonly sorted: Float64Array;
  private head = 0;
  private count = 0;

  /** @param window the window length (an integer ≥ 4: L-kurtosis needs four values). */
  constructor(readonly window: number) {
    if (!(Number.isInteger(window) && window >= 4)) throw new RangeError(`the window must be a whole number of at least 4 (got ${window})`);
    this.ring = new Float64Array(window);
    this.sorted = new Float64Array(window);
  }

  /** How many values the window holds now. */
  get size(): number {
    return this.count;
  }

  /** True once the window holds `window` values. */
  get full(): boolean {
    return this.count === this.window;
  }

  /** Adds the newest value (finite numbers only); when the window is full the oldest value leaves it first. */
  push(x: number): void {
    if (!Number.isFinite(x)) throw new RangeError(`only finite numbers enter the window (got ${x})`);
    if (this.count === this.window) this.pop();
    const tail = (this.head + this.count) % this.window;
    this.ring[tail] = x;
    const s = this.sorted;
    const at = upperBound(s, this.count, x);
    s.copyWithin(at + 1, at, this.count);
    s[at] = x;
    this.count++;
  }

  /** Removes and returns the oldest value (NaN when empty). */
  pop(): number {
    if (this.count === 0) return NaN;
    const x = this.ring[this.head];
    this.head = (this.head + 1) % this.window;
    const s = this.sorted;
    const at = upperBound(s, this.count, x) - 1; // the last copy of x: any copy will do, they are equal
    s.copyWithin(at, at + 1, this.count);
    this.count--;
    return x;
  }

  /**
   * Makes the window hold exactly `values` (oldest first, length = window): one push when `values` is the current
   * window moved on by one value (checked in O(w), the usual case in a rolling forecast), else a rebuild from
   * scratch. Returns true when one push sufficed.
   */
  slideTo(values: ArrayLike<number>): boolean {
    const w = this.window;
    if (values.length !== w) throw new RangeError(`slideTo needs exactly ${w} values (got ${values.length})`);
    if (this.count === w) {
      let same = true;
      for (let i = 1; i < w && same; i++) same = this.ring[(this.head + i) % w] === values[i - 1];
      if (same) {
        this.push(values[w - 1]);
        return true;
      }
    }
    this.clear();
    for (let i = 0; i < w; i++) this.push(values[i]);
    return false;
  }

  /** Empties the window. */
  clear(): void {
    this.head = 0;
    this.count = 0;
  }

  /** The window's values, ascending (a view: valid until the next push or pop). */
  sortedView(): Float64Array {
    return this.sorted.subarray(0, this.count);
  }

  /** Sample L-moments of the current window (NaN fields below 4 values). */
  lmoments(): SampleLMoments {
    return sampleLMomentsSorted(this.sortedView());
  }

  /** Hosking's L-moment estimate of the law on the current window; null when it has no spread (or < 4 values). */
  estimate(): LMomentEstimate | null {
    if (this.count < 4) return null;
    return estimateFromLMoments(this.lmoments());
  }
}

/** First index in s[0..n) whose value is greater than x. */
function upperBound(s: Float64Array, n: number, x: number): number {
  let lo = 0;
  let hi = n;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (s[mid] <= x) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}
