/**
 * Models "ewma" and "garch": the window is filtered (EWMA with λ, default 0.94; or GARCH(1,1) fitted by maximum
 * likelihood, warm-started from the previous row's estimate) and the next return's law is the generalized normal
 * GNO(μ + σₙ₊₁ξ(k), σₙ₊₁α(k), k) of src/core/vol. Method "mle" (default): generalized-normal innovations with the
 * shape by maximum likelihood; "normal": normal innovations (k = 0); "gno-gpd": the same filter, then generalized
 * Pareto tails fitted to the worst and best 10% of the window's standardized residuals and spliced onto the
 * innovation law (src/core/pareto/residualTails.ts); a window whose tails cannot be fitted keeps the plain law
 * with a note. A window whose fit does not converge, or
 * whose innovation shape runs to the cap, gets a note (no silent junk).
 */
import { gnoForecastLaw } from "../../../forecast/gnoLaw";
import { residualTailLaw, splicedForecastLaw } from "../../../pareto";
import { innovationLaw } from "../../../vol/innovation";
import type { ForecastModel, ModelForecast } from "../../../forecast/law";
import { DEFAULT_LAMBDA, fitVolatility, type GarchParams, type Innovations, type VolModelKind } from "../../../vol";
import type { ModelOptions } from "../registry";

export const FILTERED_METHODS = ["mle", "normal", "gno-gpd"] as const;
/** Fewest returns a GARCH window may hold (five parameters need a few hundred returns to be estimated well). */
export const MIN_GARCH_WINDOW = 100;

export interface FilteredState {
  readonly garch: GarchParams | null;
  readonly shape: number;
}

export interface FilteredCounters {
  passes: number;
}

export interface FilteredModel extends ForecastModel<FilteredState> {
  readonly counters: FilteredCounters;
}

function innovationsOf(kind: VolModelKind, options: ModelOptions): Innovations {
  const m = options.method ?? "mle";
  if (!(FILTERED_METHODS as readonly string[]).includes(m)) {
    throw new RangeError(`method for model "${kind}" must be "mle" (generalized-normal innovations), "normal" or "gno-gpd" (with Pareto tails)`);
  }
  return m === "normal" ? "normal" : "gno";
}

function createFiltered(kind: VolModelKind, options: ModelOptions): FilteredModel {
  const innovations = innovationsOf(kind, options);
  const paretoTails = options.method === "gno-gpd";
  const lambda = options.lambda ?? DEFAULT_LAMBDA;
  if (!(lambda > 0 && lambda < 1)) throw new RangeError(`lambda must lie strictly between 0 and 1 (got ${lambda})`);
  const warm = options.warmStart !== false;
  const counters: FilteredCounters = { passes: 0 };
  return {
    name: kind,
    counters,
    forecast(window: Float64Array, previous: FilteredState | null): ModelForecast<FilteredState> {
      if (kind === "garch" && window.length < MIN_GARCH_WINDOW) {
        return { law: null, state: null, note: `No forecast: a GARCH window needs at least ${MIN_GARCH_WINDOW} returns (got ${window.length}).` };
      }
      let s2 = 0;
      let m = 0;
      for (let i = 0; i < window.length; i++) m += window[i];
      m /= window.length;
      for (let i = 0; i < window.length; i++) s2 += (window[i] - m) ** 2;
      if (!(s2 > 0) || !Number.isFinite(s2)) {
        return { law: null, state: null, note: "No forecast: the returns in this row's window are all equal (or too large), so no volatility can be estimated." };
      }
      const est = fitVolatility(window, kind, {
        innovations,
        lambda,
        start: warm && previous?.garch ? previous.garch : undefined,
        startShape: warm && previous ? previous.shape : 0,
      });
      counters.passes += est.passes;
      if (!est.converged) {
        return { law: null, state: null, note: `No forecast: the ${kind.toUpperCase()} fit of this window did not converge (${est.reason}).` };
      }
      const law = gnoForecastLaw(est.nextDay);
      if (!(est.nextSigma > 0) || !Number.isFinite(est.nextSigma)) return { law: null, state: null, note: "No forecast: the next-day volatility is not finite." };
      const state = { garch: est.garch ? est.garch.params : null, shape: est.shape };
      if (paretoTails) {
        const t = residualTailLaw(est.residuals, innovationLaw(est.shape), est.mean, est.nextSigma);
        if (!t.law) return { law, state, note: `Body only (no Pareto tails): ${t.reason}.` };
        return { law: splicedForecastLaw(t.law), state, note: t.note };
      }
      return { law, state };
    },
  };
}

export function createEwmaModel(options: ModelOptions = {}): FilteredModel {
  return createFiltered("ewma", options);
}

export function createGarchModel(options: ModelOptions = {}): FilteredModel {
  return createFiltered("garch", options);
}
