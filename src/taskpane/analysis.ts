/**
 * The pane's analysis: the same core calls the cell functions make (fitGnoCached, valueAtRisk,
 * expectedShortfall, the goodness-of-fit bootstrap, the profile VaR interval, compareFamilies…), run as a list of
 * steps with a pause between steps so the page never freezes, with progress reports and cancellation. The heavy
 * steps (the fit, bootstrap, profile intervals, comparison) go to the background worker when one is given (worker.ts), or
 * run in the page in short cancelable slices. No statistics are written here.
 */
import { fitGnoCached, fitGnoCachedWork, rememberFit, type FitMethod, type GnoFit } from "../core/fit";
import { fitNormal, type ModelComparison, type NormalFit } from "../core/compare";
import { DEFAULT_RESAMPLES, MAX_BOOTSTRAP_WORK, MIN_RESAMPLES, type GnoGofResult } from "../core/gof";
import { expectedShortfall, valueAtRisk, type RiskSide } from "../core/risk";
import { compareLikeTheCell, evidenceLikeTheCells, runInPage, type Evidence, type IntervalSpec, type PaneInterval } from "./worker";
import { DEFAULT_TAIL_SHARE, fitSpliced, MIN_EXCEEDANCES, type SplicedFit } from "../core/pareto";
import { sortedCopy } from "../core/sort";

/**
 * Pareto tails on both sides at the default share, exactly as ASKEW.TAILFIT / ASKEW.TAILREPORT(data, , "both")
 * fit them (body from the maximum-likelihood fit cache, method "mle"), or the reason there are none.
 */
export interface PaneTails {
  readonly fit: SplicedFit | null;
  readonly problem: string | null;
}

export const PANE_TAIL_SIDES = "both";

export function paneTails(data: Float64Array): PaneTails {
  const perSide = Math.floor(DEFAULT_TAIL_SHARE * data.length);
  if (perSide < MIN_EXCEEDANCES) {
    return { fit: null, problem: `Pareto tails need at least ${MIN_EXCEEDANCES} returns beyond each threshold: ${data.length} returns leave ${perSide}.` };
  }
  try {
    return { fit: fitSpliced(data, { tailShare: DEFAULT_TAIL_SHARE, sides: PANE_TAIL_SIDES, method: "mle", body: fitGnoCached(data, "mle") }), problem: null };
  } catch (e) {
    return { fit: null, problem: `Cannot fit the tails: ${e instanceof Error ? e.message : String(e)}` };
  }
}

/** Confidence levels the pane reports (common practice: 95% and 99% VaR; 97.5% ES as in the Basel FRTB). */
export const PANE_LEVELS: readonly number[] = [0.95, 0.975, 0.99];
export const PANE_SIDES: readonly RiskSide[] = ["long", "short"];

export interface RiskFigure {
  readonly confidence: number;
  readonly side: RiskSide;
  readonly valueAtRisk: number;
  readonly expectedShortfall: number;
  /** Profile-likelihood 95% interval of the VaR, as ASKEW.VARCI's default (null without a regular ML fit). */
  readonly interval: PaneInterval | null;
}

export interface Analysis {
  readonly data: Float64Array;
  readonly sorted: Float64Array;
  readonly method: FitMethod;
  readonly fit: GnoFit;
  readonly normal: NormalFit;
  readonly risk: readonly RiskFigure[];
  /** KS and AD with parametric-bootstrap p-values (refit per replicate). */
  readonly gof: GnoGofResult;
  readonly comparison: ModelComparison;
  readonly tails: PaneTails;
}

/** Observations refitted between two pauses (replicates × n): about 50 ms of work. */
export const BOOTSTRAP_STEP_WORK = 6000;

/**
 * Bootstrap size for n observations: the cell function's default, cut to its work cap (resamples × n ≤
 * MAX_BOOTSTRAP_WORK) for large samples, never below its minimum; GOF(data, , resamples) gives the same.
 */
export function paneResamples(n: number): number {
  return Math.max(MIN_RESAMPLES, Math.min(DEFAULT_RESAMPLES, Math.floor(MAX_BOOTSTRAP_WORK / n)));
}

/** Thrown when the user cancels a running analysis. */
export class Cancelled extends Error {
  constructor() {
    super("Cancelled.");
    this.name = "Cancelled";
  }
}

export interface Progress {
  readonly done: number;
  readonly total: number;
  readonly step: string;
}

export interface RunControl {
  readonly onProgress?: (p: Progress) => void;
  /** Checked between steps. */
  readonly isCancelled?: () => boolean;
  /** Pause between steps (default: a zero-delay timer, which lets the page repaint and handle clicks). */
  readonly pause?: () => Promise<void>;
  /** Runs fitGnoCached(data, method) (the pane passes a background worker; default: in the page, sliced). */
  readonly fit?: (data: Float64Array, method: FitMethod) => Promise<GnoFit>;
  /** Runs the model comparison (the pane passes a background worker; default: in the page, sliced). */
  readonly compare?: (data: Float64Array) => Promise<ModelComparison>;
  /** Runs the bootstrap and the VaR intervals (the pane passes a background worker; default: in the page, sliced). */
  readonly evidence?: (data: Float64Array, method: FitMethod, resamples: number, specs: readonly IntervalSpec[]) => Promise<Evidence>;
}

const nextTick = (): Promise<void> => new Promise((resolve) => setTimeout(resolve, 0));

/** The (confidence, side) pairs of the risk table, in its order. */
export function riskSpecs(): IntervalSpec[] {
  const out: IntervalSpec[] = [];
  for (const side of PANE_SIDES) for (const c of PANE_LEVELS) out.push({ confidence: c, side });
  return out;
}

/** VaR and ES of the fit for every spec; `intervals` (same order) from the evidence step, null until then. */
export function riskFigures(fit: GnoFit, intervals: readonly (PaneInterval | null)[] = []): RiskFigure[] {
  return riskSpecs().map(({ confidence: c, side }, i) => ({
    confidence: c,
    side,
    valueAtRisk: valueAtRisk(c, fit.params, side),
    expectedShortfall: expectedShortfall(c, fit.params, side),
    interval: intervals[i] ?? null,
  }));
}

/** Runs the analysis step by step; rejects with Cancelled when isCancelled() turns true between steps. */
export async function analyse(
  data: Float64Array,
  method: FitMethod,
  control: RunControl = {},
  resamples: number = paneResamples(data.length),
): Promise<Analysis> {
  const pause = control.pause ?? nextTick;
  const isCancelled = control.isCancelled ?? (() => false);
  const total = 6;
  let done = 0;
  const step = async (name: string, work: () => void): Promise<void> => {
    control.onProgress?.({ done, total, step: name });
    await pause();
    if (isCancelled()) throw new Cancelled();
    work();
    done++;
  };
  const sorted = sortedCopy(data);
  let fit: GnoFit | null = null;
  let normal: NormalFit | null = null;
  const compare = control.compare ?? ((x: Float64Array) => runInPage(compareLikeTheCell(x), isCancelled, () => new Cancelled()));
  const evidence =
    control.evidence ??
    ((x: Float64Array, m: FitMethod, b: number, specs: readonly IntervalSpec[]) => runInPage(evidenceLikeTheCells(x, m, b, specs), isCancelled, () => new Cancelled()));
  const fitting = control.fit ?? ((x: Float64Array, m: FitMethod) => runInPage(fitGnoCachedWork(x, m), isCancelled, () => new Cancelled()));
  // The fit (and, for the tails, the maximum-likelihood fit) runs through the same worker or sliced path; the
  // result is kept in this page's cache so the tails and the views below reuse it instead of refitting here.
  const fitBy = async (m: FitMethod): Promise<GnoFit> => {
    const f = await fitting(data, m);
    if (isCancelled()) throw new Cancelled();
    rememberFit(data, m, f);
    return f;
  };
  control.onProgress?.({ done, total, step: "fitting the law" });
  await pause();
  if (isCancelled()) throw new Cancelled();
  fit = await fitBy(method);
  if (method !== "mle" && Math.floor(DEFAULT_TAIL_SHARE * data.length) >= MIN_EXCEEDANCES) await fitBy("mle");
  done++;
  await step("normal benchmark", () => (normal = fitNormal(data)));
  let tails: PaneTails = { fit: null, problem: null };
  await step("Pareto tails", () => (tails = paneTails(data)));
  // The heavy steps start together (in the background when a worker is given) and are awaited in turn.
  control.onProgress?.({ done, total, step: `goodness of fit (${resamples} bootstrap refits) and VaR intervals` });
  const proving = evidence(data, method, resamples, riskSpecs());
  proving.catch(() => undefined);
  const comparing = compare(data);
  comparing.catch(() => undefined);
  const ev = await proving;
  if (isCancelled()) throw new Cancelled();
  done = total - 1;
  control.onProgress?.({ done, total, step: "comparing laws" });
  const comparison = await comparing;
  if (isCancelled()) throw new Cancelled();
  control.onProgress?.({ done: total, total, step: "done" });
  return { data, sorted, method, fit: fit!, normal: normal!, risk: riskFigures(fit!, ev.intervals), gof: ev.gof, comparison, tails };
}
