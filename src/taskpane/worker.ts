/**
 * The pane's background worker: the model comparison (five laws fitted by maximum likelihood) can take
 * seconds on 100,000 points, so the page hands it to a Web Worker built from our own bundle — the worker runs
 * the same taskpane.js file (no blob, no eval, same origin, allowed by the page's script-src 'self'). It makes
 * the very call the ASKEW.COMPARE cell function makes: compareFamilies(x, fitGnoCached(x, "mle")).
 */
import { compareFamilies, type ModelComparison } from "../core/compare";
import { fitGnoCached } from "../core/fit";
import type { Work } from "../core/work";
import { volBacktestWork, type VolResult, type VolSpec } from "./volView";

export interface CompareRequest {
  readonly id: number;
  readonly data: Float64Array;
}

/** A rolling volatility/backtest run (volView.ts) for the worker. */
export interface VolRequest {
  readonly kind: "vol";
  readonly id: number;
  readonly data: Float64Array;
  readonly spec: VolSpec;
}

export type VolReply =
  | { readonly id: number; readonly progress: number }
  | { readonly id: number; readonly result: VolResult }
  | { readonly id: number; readonly error: string };

/** Longest stretch of work between two progress messages (ms). */
const PROGRESS_MS = 100;

export type CompareReply =
  | { readonly id: number; readonly comparison: ModelComparison }
  | { readonly id: number; readonly error: string };

/** The comparison exactly as the cell function computes it. */
export function compareLikeTheCell(data: Float64Array): ModelComparison {
  return compareFamilies(data, fitGnoCached(data, "mle"));
}

interface WorkerScope {
  onmessage: ((e: MessageEvent<CompareRequest | VolRequest>) => void) | null;
  postMessage(message: CompareReply | VolReply): void;
}

/** Runs a volatility/backtest request to the end, posting the fraction done at most every PROGRESS_MS. */
function serveVol(scope: WorkerScope, req: VolRequest): void {
  try {
    const work = volBacktestWork(req.data, req.spec);
    let last = Date.now();
    for (;;) {
      const r = work.next();
      if (r.done) {
        scope.postMessage({ id: req.id, result: r.value });
        return;
      }
      if (Date.now() - last >= PROGRESS_MS) {
        scope.postMessage({ id: req.id, progress: r.value });
        last = Date.now();
      }
    }
  } catch (err) {
    scope.postMessage({ id: req.id, error: err instanceof Error ? err.message : String(err) });
  }
}

/** Answers comparison and volatility/backtest requests inside a worker. */
export function serveComparisons(scope: WorkerScope): void {
  scope.onmessage = (e) => {
    if ("kind" in e.data && e.data.kind === "vol") {
      serveVol(scope, e.data);
      return;
    }
    const { id, data } = e.data;
    try {
      scope.postMessage({ id, comparison: compareLikeTheCell(data) });
    } catch (err) {
      scope.postMessage({ id, error: err instanceof Error ? err.message : String(err) });
    }
  };
}

/**
 * Runs comparisons in a worker started from `scriptUrl` (the pane's own bundle); falls back to running them
 * in the page when workers are unavailable. `cancel()` stops a running comparison (the worker is ended and a
 * new one started on the next request).
 */
export class ComparisonRunner {
  private worker: Worker | null = null;
  private nextId = 1;
  private pending = new Map<number, { resolve: (c: ModelComparison) => void; reject: (e: Error) => void }>();
  /** True after a request ran in the page because no worker could be started. */
  ranInPage = false;

  constructor(private readonly scriptUrl: string | null) {}

  private start(): Worker | null {
    if (this.worker) return this.worker;
    if (!this.scriptUrl || typeof Worker === "undefined") return null;
    try {
      const w = new Worker(this.scriptUrl);
      w.onmessage = (e: MessageEvent<CompareReply>) => {
        const p = this.pending.get(e.data.id);
        if (!p) return;
        this.pending.delete(e.data.id);
        if ("comparison" in e.data) p.resolve(e.data.comparison);
        else p.reject(new Error(e.data.error));
      };
      w.onerror = (e) => {
        e.preventDefault();
        this.fail(new Error(`the background worker failed: ${e.message}`));
      };
      this.worker = w;
      return w;
    } catch {
      return null;
    }
  }

  private fail(err: Error): void {
    for (const p of this.pending.values()) p.reject(err);
    this.pending.clear();
    this.worker?.terminate();
    this.worker = null;
  }

  compare(data: Float64Array): Promise<ModelComparison> {
    const w = this.start();
    if (!w) {
      this.ranInPage = true;
      return Promise.resolve().then(() => compareLikeTheCell(data));
    }
    const id = this.nextId++;
    return new Promise((resolve, reject) => {
      this.pending.set(id, { resolve, reject });
      w.postMessage({ id, data } satisfies CompareRequest);
    });
  }

  cancel(reason: Error): void {
    if (this.pending.size > 0) this.fail(reason);
  }
}

/** Drives a Work in the page in slices of `sliceMs`, yielding to the event loop between slices. */
export async function driveInPage<T>(work: Work<T>, onProgress: (f: number) => void, isCancelled: () => boolean, sliceMs = 40): Promise<T> {
  let start = Date.now();
  for (;;) {
    const r = work.next();
    if (r.done) return r.value;
    if (Date.now() - start >= sliceMs) {
      onProgress(r.value);
      await new Promise((resolve) => setTimeout(resolve, 0));
      if (isCancelled()) {
        work.return(undefined as never);
        throw new VolCancelled();
      }
      start = Date.now();
    }
  }
}

export class VolCancelled extends Error {
  constructor() {
    super("cancelled");
  }
}

/**
 * Runs the volatility/backtest view's Work in a worker of its own (started from the pane's bundle for each run,
 * ended when the run finishes), so the page stays responsive through thousands of window fits; falls back to
 * time-sliced work in the page when no worker can start. `cancel()` ends the worker at once.
 */
export class VolRunner {
  private worker: Worker | null = null;
  private reject: ((e: Error) => void) | null = null;
  private pageRun: { cancelled: boolean } | null = null;
  /** Where the last run went. */
  ranIn: "worker" | "page" | null = null;

  constructor(private readonly scriptUrl: string | null) {}

  run(data: Float64Array, spec: VolSpec, onProgress: (fraction: number) => void): Promise<VolResult> {
    this.cancel();
    let w: Worker | null = null;
    if (this.scriptUrl && typeof Worker !== "undefined") {
      try {
        w = new Worker(this.scriptUrl);
      } catch {
        w = null;
      }
    }
    if (!w) {
      this.ranIn = "page";
      const token = { cancelled: false };
      this.pageRun = token;
      return driveInPage(volBacktestWork(data, spec), onProgress, () => token.cancelled).finally(() => {
        if (this.pageRun === token) this.pageRun = null;
      });
    }
    this.ranIn = "worker";
    this.worker = w;
    const worker = w;
    return new Promise<VolResult>((resolve, reject) => {
      this.reject = reject;
      const done = (): void => {
        worker.terminate();
        if (this.worker === worker) {
          this.worker = null;
          this.reject = null;
        }
      };
      worker.onmessage = (e: MessageEvent<VolReply>) => {
        const m = e.data;
        if ("progress" in m) onProgress(m.progress);
        else if ("result" in m) {
          done();
          resolve(m.result);
        } else {
          done();
          reject(new Error(m.error));
        }
      };
      worker.onerror = (e) => {
        e.preventDefault();
        done();
        reject(new Error(`the background worker failed: ${e.message}`));
      };
      worker.postMessage({ kind: "vol", id: 1, data, spec } satisfies VolRequest);
    });
  }

  /** Stops the running computation (if any); its promise rejects with VolCancelled. */
  cancel(): void {
    if (this.pageRun) this.pageRun.cancelled = true;
    if (this.worker) {
      this.worker.terminate();
      this.worker = null;
      const r = this.reject;
      this.reject = null;
      r?.(new VolCancelled());
    }
  }

  get busy(): boolean {
    return this.worker !== null || this.pageRun !== null;
  }
}
