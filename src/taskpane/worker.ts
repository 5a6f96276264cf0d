/**
 * The pane's background worker: the model comparison (five laws fitted by maximum likelihood), the goodness-of-fit
 * bootstrap and the profile-likelihood VaR intervals can each take seconds on large or degenerate samples, so the
 * page hands them to a Web Worker built from our own bundle — the worker runs the same taskpane.js file (no blob,
 * no eval, same origin, allowed by the page's script-src 'self'). It makes the very calls the cell functions make:
 * ASKEW.COMPARE's compareFamilies(x, fitGnoCached(x, "mle")), ASKEW.GOF's bootstrap of the fitted law and
 * ASKEW.VARCI's default profile interval. Canceling ends the worker at once; a new one starts on the next request.
 * Without a worker the same Work runs in the page in short slices, checking for a cancel between slices.
 */
import { compareFamiliesWork, type ModelComparison } from "../core/compare";
import { fitGnoCached, fitGnoCachedWork, type FitMethod, type GnoFit } from "../core/fit";
import { testGnoFittedWork, type GnoGofResult } from "../core/gof";
import { RISK_SIDES, varProfileIntervalWork, type RiskSide } from "../core/risk";
import { runToEnd, type Work } from "../core/work";
import { volBacktestWork, type VolResult, type VolSpec } from "./volView";

/** Confidence levels and sides whose VaR intervals the pane shows (the order of Evidence.intervals). */
export interface IntervalSpec {
  readonly confidence: number;
  readonly side: RiskSide;
}

/** A VaR interval as the pane shows it: the ends, NaN where the data cannot bound them (with the reason). */
export interface PaneInterval {
  readonly lower: number;
  readonly valueAtRisk: number;
  readonly upper: number;
  readonly reason?: string;
}

/** The page's heavy evidence: GOF with bootstrap p-values and one profile VaR interval per spec (null: none). */
export interface Evidence {
  readonly gof: GnoGofResult;
  readonly intervals: readonly (PaneInterval | null)[];
}

export type JobRequest =
  | { readonly id: number; readonly kind: "fit"; readonly data: Float64Array; readonly method: FitMethod }
  | { readonly id: number; readonly kind: "compare"; readonly data: Float64Array }
  | { readonly id: number; readonly kind: "evidence"; readonly data: Float64Array; readonly method: FitMethod; readonly resamples: number; readonly specs: readonly IntervalSpec[] };

export type JobReply =
  | { readonly id: number; readonly fit: GnoFit }
  | { readonly id: number; readonly comparison: ModelComparison }
  | { readonly id: number; readonly evidence: Evidence }
  | { readonly id: number; readonly error: string };

/** The comparison exactly as the cell function computes it. */
export function compareLikeTheCell(data: Float64Array): Work<ModelComparison> {
  return compareFamiliesWork(data, fitGnoCached(data, "mle"));
}

/**
 * GOF as ASKEW.GOF(data, , resamples) computes it (the pane's fit method), then for each spec the interval
 * ASKEW.VARCI(data, confidence, side) gives by default: the profile-likelihood 95% interval of the
 * maximum-likelihood fit (none when that fit is irregular, as the cell's #N/A).
 */
export function* evidenceLikeTheCells(data: Float64Array, method: FitMethod, resamples: number, specs: readonly IntervalSpec[]): Work<Evidence> {
  const gof = yield* testGnoFittedWork(data, { method, fit: fitGnoCached(data, method), resamples });
  const mle = fitGnoCached(data, "mle");
  const intervals: (PaneInterval | null)[] = [];
  for (const s of specs) {
    if (!mle.regular || !RISK_SIDES.includes(s.side)) {
      intervals.push(null);
      continue;
    }
    const ci = yield* varProfileIntervalWork(data, mle, s.confidence, s.side, 0.95);
    intervals.push({ lower: ci.lower, valueAtRisk: ci.valueAtRisk, upper: ci.upper, ...(ci.reason === undefined ? {} : { reason: ci.reason }) });
  }
  return { gof, intervals };
}

function answer(req: JobRequest): JobReply {
  // the fit stays in the worker's cache, so the evidence and comparison jobs that follow reuse it
  if (req.kind === "fit") return { id: req.id, fit: runToEnd(fitGnoCachedWork(req.data, req.method)) };
  if (req.kind === "compare") return { id: req.id, comparison: runToEnd(compareLikeTheCell(req.data)) };
  return { id: req.id, evidence: runToEnd(evidenceLikeTheCells(req.data, req.method, req.resamples, req.specs)) };
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

interface WorkerScope {
  onmessage: ((e: MessageEvent<JobRequest | VolRequest>) => void) | null;
  postMessage(message: JobReply | VolReply): void;
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

/** Answers requests inside a worker (jobs, and volatility/backtest runs with progress). */
export function serveComparisons(scope: WorkerScope): void {
  scope.onmessage = (e) => {
    const req = e.data;
    if (req.kind === "vol") {
      serveVol(scope, req);
      return;
    }
    try {
      scope.postMessage(answer(req));
    } catch (err) {
      scope.postMessage({ id: e.data.id, error: err instanceof Error ? err.message : String(err) });
    }
  };
}

/** Longest stretch of in-page work between two pauses (milliseconds), when no worker is available. */
export const PAGE_SLICE_MS = 20;

/**
 * Runs a Work in the page in slices of PAGE_SLICE_MS, pausing (a zero-delay timer) between slices so the page
 * repaints and the Cancel button is heard; rejects with `canceled()` once isCancelled() is true.
 */
export async function runInPage<T>(work: Work<T>, isCancelled: () => boolean, canceled: () => Error, sliceMs = PAGE_SLICE_MS): Promise<T> {
  let start = Date.now();
  for (;;) {
    const r = work.next();
    if (r.done) return r.value;
    if (Date.now() - start >= sliceMs) {
      await new Promise((resolve) => setTimeout(resolve, 0));
      if (isCancelled()) {
        work.return(undefined as never);
        throw canceled();
      }
      start = Date.now();
    }
  }
}

type Pending = { resolve: (r: JobReply) => void; reject: (e: Error) => void };

/**
 * Runs jobs in a worker started from `scriptUrl` (the pane's own bundle); falls back to running them in the page
 * (sliced, cancelable) when workers are unavailable. `cancel()` stops the running jobs (the worker is ended and a
 * new one started on the next request).
 */
export class ComparisonRunner {
  private worker: Worker | null = null;
  private nextId = 1;
  private pending = new Map<number, Pending>();
  private pageCancel: Error | null = null;
  /** True after a request ran in the page because no worker could be started. */
  ranInPage = false;

  constructor(private readonly scriptUrl: string | null) {}

  private start(): Worker | null {
    if (this.worker) return this.worker;
    if (!this.scriptUrl || typeof Worker === "undefined") return null;
    try {
      const w = new Worker(this.scriptUrl);
      w.onmessage = (e: MessageEvent<JobReply>) => {
        const p = this.pending.get(e.data.id);
        if (!p) return;
        this.pending.delete(e.data.id);
        if ("error" in e.data) p.reject(new Error(e.data.error));
        else p.resolve(e.data);
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

  private send(req: JobRequest): Promise<JobReply> {
    const w = this.start();
    if (!w) {
      this.ranInPage = true;
      this.pageCancel = null;
      const work: Work<JobReply> =
        req.kind === "fit"
          ? (function* () {
              return { id: req.id, fit: yield* fitGnoCachedWork(req.data, req.method) };
            })()
          : req.kind === "compare"
          ? (function* () {
              return { id: req.id, comparison: yield* compareLikeTheCell(req.data) };
            })()
          : (function* () {
              return { id: req.id, evidence: yield* evidenceLikeTheCells(req.data, req.method, req.resamples, req.specs) };
            })();
      return runInPage(work, () => this.pageCancel !== null, () => this.pageCancel!);
    }
    return new Promise((resolve, reject) => {
      this.pending.set(req.id, { resolve, reject });
      w.postMessage(req);
    });
  }

  /** fitGnoCached(data, method), computed in the worker (or sliced in the page); the same numbers bit for bit. */
  async fit(data: Float64Array, method: FitMethod): Promise<GnoFit> {
    const r = await this.send({ id: this.nextId++, kind: "fit", data, method });
    if (!("fit" in r)) throw new Error("unexpected reply to a fit request");
    return r.fit;
  }

  async compare(data: Float64Array): Promise<ModelComparison> {
    const r = await this.send({ id: this.nextId++, kind: "compare", data });
    if (!("comparison" in r)) throw new Error("unexpected reply to a comparison");
    return r.comparison;
  }

  async evidence(data: Float64Array, method: FitMethod, resamples: number, specs: readonly IntervalSpec[]): Promise<Evidence> {
    const r = await this.send({ id: this.nextId++, kind: "evidence", data, method, resamples, specs });
    if (!("evidence" in r)) throw new Error("unexpected reply to a goodness-of-fit request");
    return r.evidence;
  }

  cancel(reason: Error): void {
    this.pageCancel = reason;
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
