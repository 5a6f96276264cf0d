/**
 * Reading pasted text or a dropped file in the page without freezing it: the stepped reader (parseColumnWork)
 * driven in short time slices, with a pause between slices (the page repaints and takes a Cancel click), progress
 * reports, and a stop on Cancel. No DOM here: the pane passes callbacks.
 *
 * Why in the page and not in the background worker: the text already lives in the page (the paste box or the
 * file just read), the reader is linear (about 2 s of work for a million lines on a loaded machine, see
 * bench/parse.ts), and a 20 ms slice keeps every pause short; a worker would first copy tens of megabytes of
 * text across, and would still need this path where no worker can start.
 */
import { parseColumnWork, type ParsedColumn } from "./parse";

/** Longest stretch of reading between two pauses (ms), as the pane's other in-page work. */
export const READ_SLICE_MS = 20;

/** Thrown when the user cancels while the text is being read. */
export class ReadCancelled extends Error {
  constructor() {
    super("Reading cancelled.");
    this.name = "ReadCancelled";
  }
}

export interface ReadProgress {
  /** Fraction of the reading done (0 to 1, approximate). */
  readonly fraction: number;
  /** Steps the reader has yielded so far (one per LINES_PER_STEP lines per pass). */
  readonly yields: number;
  /** Pauses so far: the number of times the page got control back while reading. */
  readonly slices: number;
  readonly done: boolean;
}

export interface ReadControl {
  /** Checked after every pause; true stops the reading with ReadCancelled. */
  readonly isCancelled: () => boolean;
  readonly onProgress?: (p: ReadProgress) => void;
  readonly sliceMs?: number;
  /** Pause between slices (default: a zero-delay timer, which lets the page repaint and handle clicks). */
  readonly pause?: () => Promise<void>;
  /** Lines per reader step (default LINES_PER_STEP; tests use small steps). */
  readonly linesPerStep?: number;
}

export interface ReadOutcome {
  readonly column: ParsedColumn;
  readonly yields: number;
  readonly slices: number;
}

const nextTick = (): Promise<void> => new Promise((resolve) => setTimeout(resolve, 0));

/**
 * Reads one column of numbers from text in slices of at most `sliceMs` of work (plus one reader step). Rejects
 * with the reader's InputProblem for bad input, or ReadCancelled when `isCancelled` turns true.
 */
export async function readColumnInSlices(text: string, control: ReadControl): Promise<ReadOutcome> {
  const sliceMs = control.sliceMs ?? READ_SLICE_MS;
  const pause = control.pause ?? nextTick;
  const work = parseColumnWork(text, control.linesPerStep);
  let yields = 0;
  let slices = 0;
  let fraction = 0;
  let start = Date.now();
  for (;;) {
    const r = work.next();
    if (r.done) {
      control.onProgress?.({ fraction: 1, yields, slices, done: true });
      return { column: r.value, yields, slices };
    }
    yields++;
    if (Number.isFinite(r.value)) fraction = r.value;
    if (Date.now() - start >= sliceMs) {
      slices++;
      control.onProgress?.({ fraction, yields, slices, done: false });
      await pause();
      if (control.isCancelled()) {
        work.return(undefined as never);
        throw new ReadCancelled();
      }
      start = Date.now();
    }
  }
}
