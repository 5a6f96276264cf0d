/**
 * Long computations as resumable work, so that no caller is ever blocked for long.
 *
 * A long core computation is written as a generator of type `Work<T>`: it `yield`s a progress fraction in [0, 1]
 * (or NaN when unknown) after every small unit of work — one window fit, one bootstrap replicate, one block of
 * simulated paths — and `return`s its result. A unit must stay small (a few milliseconds on a typical machine);
 * a loop whose single iteration can be long yields inside it too.
 *
 * Who drives it decides how it is interleaved: `runToEnd` runs it synchronously (tests, a Web Worker, the
 * bench); the cell adapters drive it in time slices that yield to the host's event loop and stop on
 * cancellation (src/functions/async.ts); the pane drives it the same way with a progress bar.
 *
 * Every Work also has a bound on its total units that the caller can state in advance (the adapters refuse
 * inputs beyond it with a message), so the worst case is known, not discovered.
 */

/** A resumable computation: yields progress fractions, returns its result. */
export type Work<T> = Generator<number, T, void>;

/** Runs a Work synchronously to the end; onProgress sees every yielded fraction. */
export function runToEnd<T>(work: Work<T>, onProgress?: (fraction: number) => void): T {
  for (;;) {
    const r = work.next();
    if (r.done) return r.value;
    if (onProgress) onProgress(r.value);
  }
}

/** A Work that is already finished (for code paths that need no steps). */
// eslint-disable-next-line require-yield
export function* done<T>(value: T): Work<T> {
  return value;
}

/**
 * Runs `work` as a stage of a larger Work whose progress runs from `from` to `to`: each inner fraction f is
 * reported as from + f·(to − from); an unknown inner fraction (NaN) is reported as `from`.
 */
export function* stage<T>(work: Work<T>, from: number, to: number): Work<T> {
  for (;;) {
    const r = work.next();
    if (r.done) return r.value;
    yield Number.isNaN(r.value) ? from : from + Math.min(1, Math.max(0, r.value)) * (to - from);
  }
}

/** Runs `work`, reporting progress() instead of the inner fractions at each of its steps. */
export function* reporting<T>(work: Work<T>, progress: () => number): Work<T> {
  for (;;) {
    const r = work.next();
    if (r.done) return r.value;
    yield progress();
  }
}
