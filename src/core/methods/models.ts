/**
 * The reference VaR methods as ForecastModels for rolling out-of-sample use: "hs" (historical simulation,
 * age-weighted when a decay is given), "normal", "cf" (Cornish–Fisher with modified ES) and "fhs" (filtered
 * historical simulation over a volatility filter passed in). Each forecast sees only its window; none carries
 * state. The laws delegate to empirical.ts, moments.ts and filtered.ts; no formula is written twice.
 */
import { sampleMoments } from "../fit/sampleStats";
import type { ForecastLaw, ForecastModel, ModelForecast } from "../forecast/law";
import { normalCdf } from "../normal";
import type { RiskSide } from "../risk/measures/side";
import { ageWeights, EmpiricalLaw } from "./empirical";
import { FilteredLaw, type VolatilityFilter } from "./filtered";
import { cornishFisherCdf, cornishFisherDomainProblem, cornishFisherTail, normalTail, type MomentSummary } from "./moments";

/** Fewest returns a window needs for a moment-based forecast (skewness and kurtosis need a few). */
export const MIN_MOMENT_WINDOW = 4;

function none<S>(note: string): ModelForecast<S> {
  return { law: null, state: null, note };
}

/** Historical simulation (decay 1: equal weights; decay in (0, 1): age weights λ^age). */
export function historicalModel(decay = 1): ForecastModel<null> {
  return {
    name: "hs",
    forecast(window: Float64Array): ModelForecast<null> {
      if (window.length < 1) return none("the window is empty");
      if (!(decay > 0 && decay <= 1)) return none("the decay must lie in (0, 1]");
      const law = new EmpiricalLaw(window, decay === 1 ? null : ageWeights(window.length, decay));
      return { law, state: null };
    },
  };
}

function summary(window: Float64Array): MomentSummary | string {
  if (window.length < MIN_MOMENT_WINDOW) return `the window holds fewer than ${MIN_MOMENT_WINDOW} returns`;
  const m = sampleMoments(window);
  if (!(m.sd > 0) || !Number.isFinite(m.sd)) return "the returns in the window are all equal";
  return { mean: m.mean, sd: m.sd, skewness: m.skewness, excessKurtosis: m.excessKurtosis };
}

/** The normal law with the window's mean and standard deviation. */
export function normalModel(): ForecastModel<null> {
  return {
    name: "normal",
    forecast(window: Float64Array): ModelForecast<null> {
      const m = summary(window);
      if (typeof m === "string") return none(m);
      const law: ForecastLaw = {
        valueAtRisk: (c: number, side: RiskSide) => normalTail(m, c, side).valueAtRisk,
        expectedShortfall: (c: number, side: RiskSide) => normalTail(m, c, side).expectedShortfall,
        cdf: (x: number) => normalCdf((x - m.mean) / m.sd),
      };
      return { law, state: null };
    },
  };
}

/**
 * Cornish–Fisher VaR with modified ES from the window's moments. Outside the domain of validity the forecast is
 * null with the reason (the expansion is not a distribution there, so it has no VaR, ES or PIT).
 */
export function cornishFisherModel(): ForecastModel<null> {
  return {
    name: "cf",
    forecast(window: Float64Array): ModelForecast<null> {
      const m = summary(window);
      if (typeof m === "string") return none(m);
      const problem = cornishFisherDomainProblem(m.skewness, m.excessKurtosis);
      if (problem) return none(`Cornish–Fisher is outside its domain of validity: ${problem}`);
      const law: ForecastLaw = {
        valueAtRisk: (c: number, side: RiskSide) => cornishFisherTail(m, c, side).valueAtRisk,
        expectedShortfall: (c: number, side: RiskSide) => cornishFisherTail(m, c, side).expectedShortfall,
        cdf: (x: number) => cornishFisherCdf(x, m),
        whyNot: (what: "var" | "es" | "pit", c: number, side: RiskSide) => {
          const t = cornishFisherTail(m, c, side);
          const why = what === "es" ? t.shortfallProblem : what === "var" ? t.problem : null;
          return why ? `Cornish–Fisher gives no ${what === "es" ? "modified ES" : "VaR"} for this row: ${why}.` : undefined;
        },
      };
      return { law, state: null };
    },
  };
}

/** Filtered historical simulation over `filter` (e.g. an EWMA or GARCH filter from the volatility layer). */
export function filteredHistoricalModel(filter: VolatilityFilter, name = "fhs"): ForecastModel<null> {
  return {
    name,
    forecast(window: Float64Array): ModelForecast<null> {
      if (window.length < 1) return none("the window is empty");
      const f = filter(window);
      if (f === null) return none("the volatility filter could not be fitted to this window");
      if (typeof f === "string") return none(f);
      if (!(f.nextSigma > 0) || !Number.isFinite(f.nextSigma) || f.residuals.length < 1) {
        return none("the volatility filter gave no usable next-day volatility or residuals");
      }
      for (let i = 0; i < f.residuals.length; i++) {
        if (!Number.isFinite(f.residuals[i])) return none("the volatility filter gave a non-finite residual");
      }
      const law = new FilteredLaw(f.residuals, f.nextSigma, f.nextMean ?? 0);
      return f.note ? { law, state: null, note: f.note } : { law, state: null };
    },
  };
}
