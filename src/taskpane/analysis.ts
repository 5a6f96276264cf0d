/**
 * The pane's analysis: the same core calls the cell functions make (fitGnoCached, valueAtRisk,
 * expectedShortfall, varInterval, the chunked goodness-of-fit bootstrap, compareFamilies…), run as a list of
 * steps with a pause between steps so the page never freezes, with progress reports and cancellation. No
 * statistics are written here.
 */
import { fitGnoCached, type FitMethod, type GnoFit } from "../core/fit";
import { compareFamilies, fitNormal, type ModelComparison, type NormalFit } from "../core/compare";
import { startGnoBootstrap, DEFAULT_RESAMPLES, type GnoGofResult } from "../core/gof";
import { expectedShortfall, valueAtRisk, varInterval, type RiskSide, type VarInterval } from "../core/risk";

/** Confidence levels the pane reports (common practice: 95% and 99% VaR; 97.5% ES as in the Basel FRTB). */
export const PANE_LEVELS: readonly number[] = [0.95, 0.975, 0.99];
export const PANE_SIDES: readonly RiskSide[] = ["long", "short"];

export interface RiskFigure {
  readonly confidence: number;
  readonly side: RiskSide;
  readonly valueAtRisk: number;
  readonly expectedShortfall: number;
  /** Delta-method 95% interval of the VaR (null without a covariance). */
  readonly interval: VarInterval | null;
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
  readonly comparison: ModelComparison | null;
}

/** Bootstrap replicates run between two pauses. */
export const BOOTSTRAP_CHUNK = 8;

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
}

const nextTick = (): Promise<void> => new Promise((resolve) => setTimeout(resolve, 0));

export function riskFigures(fit: GnoFit): RiskFigure[] {
  const out: RiskFigure[] = [];
  for (const side of PANE_SIDES) {
    for (const c of PANE_LEVELS) {
      out.push({
        confidence: c,
        side,
        valueAtRisk: valueAtRisk(c, fit.params, side),
        expectedShortfall: expectedShortfall(c, fit.params, side),
        interval: fit.covariance ? varInterval(fit.params, fit.covariance, c, side, 0.95) : null,
      });
    }
  }
  return out;
}

/** Runs the analysis step by step; rejects with Cancelled when isCancelled() turns true between steps. */
export async function analyse(
  data: Float64Array,
  method: FitMethod,
  control: RunControl = {},
  resamples: number = DEFAULT_RESAMPLES,
): Promise<Analysis> {
  const pause = control.pause ?? nextTick;
  const chunks = Math.ceil(resamples / BOOTSTRAP_CHUNK);
  const total = 4 + chunks;
  let done = 0;
  const step = async (name: string, work: () => void): Promise<void> => {
    control.onProgress?.({ done, total, step: name });
    await pause();
    if (control.isCancelled?.()) throw new Cancelled();
    work();
    done++;
  };
  const sorted = Float64Array.from(data).sort();
  let fit: GnoFit | null = null;
  let normal: NormalFit | null = null;
  let risk: RiskFigure[] = [];
  let comparison: ModelComparison | null = null;
  await step("fitting the law", () => (fit = fitGnoCached(data, method)));
  await step("normal benchmark", () => (normal = fitNormal(data)));
  await step("VaR and ES", () => (risk = riskFigures(fit!)));
  const boot = startGnoBootstrap(data, { method, fit: fit!, resamples });
  while (!boot.run.progress.done) {
    await step(`goodness of fit: ${boot.run.progress.completed} of ${resamples} bootstrap refits`, () => boot.run.step(BOOTSTRAP_CHUNK));
  }
  done = total - 1;
  await step("comparing laws", () => (comparison = compareFamilies(data, method === "mle" ? fit! : undefined)));
  control.onProgress?.({ done: total, total, step: "done" });
  return { data, sorted, method, fit: fit!, normal: normal!, risk, gof: boot.result(), comparison };
}
