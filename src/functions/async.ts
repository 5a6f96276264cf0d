/**
 * The asynchronous, cancelable convention for heavy cell functions.
 *
 * The desktop host restarts an add-in whose JavaScript runtime is unresponsive for about 5 seconds, and a
 * synchronous custom function blocks every other calculation and the pane while it runs. So every function whose
 * work can take more than a few hundred milliseconds is declared `async` with the JSDoc tag `@cancelable`, takes
 * the host's `CustomFunctions.CancelableInvocation` as its last parameter, and drives its core `Work` (see
 * src/core/work.ts) with `runWork`: steps run for at most SLICE_MS, then control returns to the event loop
 * (setTimeout 0), and a cancel from the host (`invocation.onCanceled`: the cell was edited, deleted or its inputs
 * changed again) stops the work at the next slice.
 *
 * Platform documentation: "Make a custom function cancelable" and "Custom functions: asynchronous functions"
 * (learn.microsoft.com/office/dev/add-ins/excel/custom-functions-web-reqs), and the runtime's
 * CancelableInvocation.onCanceled (CustomFunctionsRuntime 1.1).
 */
import type { Work } from "../core/work";
import { CellError, toHostError, type Grid } from "./cells";

/** Longest stretch of work between two returns to the event loop (milliseconds). */
export const SLICE_MS = 40;

/** Thrown (and turned into a #N/A "Canceled") when the host cancels the call. */
export class Canceled extends CellError {
  constructor() {
    super("na", "Canceled: the calculation was stopped before it finished.");
  }
}

/** Lets the event loop run (host messages, other functions, the pane). */
export function yieldToHost(): Promise<void> {
  return new Promise((resolve) => setTimeout(resolve, 0));
}

export interface RunOptions {
  /** Called with the fraction done after each slice. */
  readonly onProgress?: (fraction: number) => void;
  /** Longest stretch between yields; tests may lower it to prove the slicing. */
  readonly sliceMs?: number;
}

/**
 * Drives a Work in time slices, returning to the event loop between slices and stopping when the host cancels.
 * Throws `Canceled` on cancel (the host discards the value of a canceled call; the error is for other callers).
 */
export async function runWork<T>(
  work: Work<T>,
  invocation?: CustomFunctions.CancelableInvocation | null,
  options: RunOptions = {},
): Promise<T> {
  const slice = options.sliceMs ?? SLICE_MS;
  let canceled = false;
  if (invocation) invocation.onCanceled = () => (canceled = true);
  let start = Date.now();
  let fraction = NaN;
  for (;;) {
    const r = work.next();
    if (r.done) return r.value;
    fraction = r.value;
    if (Date.now() - start >= slice) {
      if (options.onProgress) options.onProgress(fraction);
      await yieldToHost();
      if (canceled) {
        work.return(undefined as never);
        throw new Canceled();
      }
      start = Date.now();
    }
  }
}

/** The async twin of cells.ts `guardGrid`: any failure becomes a 1×1 range holding the host error. */
export async function guardGridAsync(body: () => Promise<Grid>): Promise<Grid> {
  try {
    return await body();
  } catch (e) {
    return [[toHostError(e)]];
  }
}
