/**
 * Model "iid": the generalized normal law fitted to the window, unconditionally (the original ROLLVAR).
 * Method "mle": maximum likelihood, warm-started from the previous row's solution moved by one Newton step for the
 * value that left the window and the value that entered it (src/core/fit/slideStart.ts, O(1)), and ending with one
 * unverified Newton step once the predicted gain is below WARM_ONE_STEP_GAIN: most rows then cost one pass over
 * the window, and every forecast stays within 1e-6 relative of a cold, fully converged fit (worst measured 6.9e-7
 * over four seeded series, windows 60–500; test/core/risk/rollingModels.test.ts checks 2e-6). Where maximum likelihood has no
 * regular maximum (fitGnoQuick then returns the L-moment estimate with converged = false) the row carries a note,
 * so an output never mixes the two estimators unannounced. Method "auto": the same, but such rows take the
 * L-moment forecast without a note (the user asked for the mix). Method "lmom": the method of L-moments, from a
 * sliding sorted window (SlidingLMoments: one insertion and one deletion per row, no re-sort, no likelihood pass);
 * each estimate equals the batch estimator's (fitGnoQuick with method "lmom") exactly. Windows of extreme scale
 * (spread below 1e-100 or a value beyond 1e100 in magnitude, where the batch path's moment checks decide) go
 * through the batch path itself, so messages and numbers stay the batch path's.
 */
import { fitGnoQuick, SlidingLMoments, type FitMethod, type QuickFit, type SlideFrom } from "../../../fit";
import type { GnoParams } from "../../../gno";
import { gnoForecastLaw } from "../../../forecast/gnoLaw";
import type { ForecastModel, ModelForecast } from "../../../forecast/law";
import type { ModelOptions } from "../registry";

/** Predicted-gain threshold for the warm one-step finish (log-likelihood units). */
export const WARM_ONE_STEP_GAIN = 1e-5;

export const IID_METHODS = ["mle", "lmom", "auto"] as const;
export type IidMethod = (typeof IID_METHODS)[number];

/** Running totals a caller may read after a run (bench, the rollingVar summary). */
export interface IidCounters {
  iterations: number;
  unconverged: number;
}

/**
 * What a maximum-likelihood row hands to the next: its converged parameters, the Hessian there and its window
 * (a view into the run's returns, so the next row can tell whether its window moved on by exactly one value).
 */
export interface IidFitState {
  readonly params: GnoParams;
  readonly hessian: Float64Array | null;
  readonly window: Float64Array;
}

/** State of a row: the previous converged fit (mle, auto) or the sliding sorted window (lmom). */
export type IidState = IidFitState | SlidingLMoments;

/** The previous fit moved on by one value, when `window` is the previous window shifted by one in the same returns. */
function slideFrom(previous: IidFitState, window: Float64Array): SlideFrom | undefined {
  const w = previous.window;
  const n = window.length;
  if (!previous.hessian || w.length !== n || w.buffer !== window.buffer || window.byteOffset !== w.byteOffset + Float64Array.BYTES_PER_ELEMENT) {
    return undefined;
  }
  return { params: previous.params, hessian: previous.hessian, removed: w[0], added: window[n - 1] };
}

export interface IidModel extends ForecastModel<IidState> {
  readonly counters: IidCounters;
}

const fmt = (x: number): string => String(Number(x.toPrecision(4)));

export function createIidModel(options: ModelOptions = {}): IidModel {
  const method = (options.method ?? "mle") as IidMethod;
  if (!IID_METHODS.includes(method)) throw new RangeError(`method for model "iid" must be one of ${IID_METHODS.map((m) => `"${m}"`).join(", ")}`);
  const fitMethod: FitMethod = method === "lmom" ? "lmom" : "mle";
  const warm = options.warmStart !== false;
  const counters: IidCounters = { iterations: 0, unconverged: 0 };
  if (method === "lmom") return slidingLMomentModel(counters);
  return {
    name: "iid",
    counters,
    forecast(window: Float64Array, previousState: IidState | null): ModelForecast<IidState> {
      const previous = previousState instanceof SlidingLMoments ? null : previousState;
      let fit: QuickFit;
      try {
        fit = fitGnoQuick(
          window,
          warm && previous
            ? { method: fitMethod, start: previous.params, slide: slideFrom(previous, window), oneStepGain: WARM_ONE_STEP_GAIN }
            : { method: fitMethod },
        );
      } catch (e) {
        return { law: null, state: null, note: `No forecast: ${e instanceof Error ? e.message : String(e)}.` };
      }
      counters.iterations += fit.iterations;
      if (!fit.converged) counters.unconverged++;
      const law = gnoForecastLaw(fit.params);
      const state: IidFitState | null = fit.converged ? { params: fit.params, hessian: fit.hessian ?? null, window } : null;
      if (!fit.converged && method === "mle") {
        const p = fit.params;
        return {
          law,
          state,
          note: `Maximum likelihood has no regular maximum for this window (the likelihood rises toward the edge of the data); the L-moment fit (location ${fmt(p.location)}, scale ${fmt(p.scale)}, shape ${fmt(p.shape)}) is not shown as a maximum-likelihood forecast. Use method "auto" to accept it, or "lmom".`,
        };
      }
      return { law, state };
    },
  };
}

/** Smallest spread and largest magnitude the sliding path handles itself (beyond: the batch path decides). */
const SLIDING_MIN_SPREAD = 1e-100;
const SLIDING_MAX_MAGNITUDE = 1e100;

/** Method "lmom" over a sliding sorted window; the state is the window itself (kept even on declined rows). */
function slidingLMomentModel(counters: IidCounters): IidModel {
  return {
    name: "iid",
    counters,
    forecast(window: Float64Array, previous: IidState | null): ModelForecast<IidState> {
      if (window.length < 4) return batchLMoments(window, null);
      const f = previous instanceof SlidingLMoments && previous.window === window.length ? previous : new SlidingLMoments(window.length);
      f.slideTo(window);
      const sorted = f.sortedView();
      const lo = sorted[0];
      const hi = sorted[sorted.length - 1];
      const e = hi - lo >= SLIDING_MIN_SPREAD && Math.max(-lo, hi) <= SLIDING_MAX_MAGNITUDE ? f.estimate() : null;
      if (!e) return batchLMoments(window, f);
      return { law: gnoForecastLaw(e.params), state: f };
    },
  };
}

/** The batch estimator's answer for a window the sliding path does not decide (its message when it throws). */
function batchLMoments(window: Float64Array, state: SlidingLMoments | null): ModelForecast<IidState> {
  try {
    return { law: gnoForecastLaw(fitGnoQuick(window, { method: "lmom" }).params), state };
  } catch (e) {
    return { law: null, state, note: `No forecast: ${e instanceof Error ? e.message : String(e)}.` };
  }
}
