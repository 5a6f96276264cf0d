/**
 * The pane's background worker: the model comparison (five laws fitted by maximum likelihood) can take
 * seconds on 100,000 points, so the page hands it to a Web Worker built from our own bundle — the worker runs
 * the same taskpane.js file (no blob, no eval, same origin, allowed by the page's script-src 'self'). It makes
 * the very call the ASKEW.COMPARE cell function makes: compareFamilies(x, fitGnoCached(x, "mle")).
 */
import { compareFamilies, type ModelComparison } from "../core/compare";
import { fitGnoCached } from "../core/fit";

export interface CompareRequest {
  readonly id: number;
  readonly data: Float64Array;
}

export type CompareReply =
  | { readonly id: number; readonly comparison: ModelComparison }
  | { readonly id: number; readonly error: string };

/** The comparison exactly as the cell function computes it. */
export function compareLikeTheCell(data: Float64Array): ModelComparison {
  return compareFamilies(data, fitGnoCached(data, "mle"));
}

interface WorkerScope {
  onmessage: ((e: MessageEvent<CompareRequest>) => void) | null;
  postMessage(message: CompareReply): void;
}

/** Answers comparison requests inside a worker. */
export function serveComparisons(scope: WorkerScope): void {
  scope.onmessage = (e) => {
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
