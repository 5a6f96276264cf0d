/**
 * Filtered historical simulation (Barone-Adesi, Giannopoulos & Vosper 1999; Hull & White 1998): standardise the
 * window's returns by a volatility filter (EWMA, GARCH…), then rescale the standardised residuals by the filter's
 * next-day volatility. The empirical law of the rescaled residuals is read exactly as historical simulation
 * (empirical.ts: same quantile, ES and CDF conventions).
 *
 * The filter is a parameter, so this file needs no volatility code: any function that maps a window to its
 * standardised residuals z_i = (r_i − μ_i)/σ_i and the next day's mean and σ will do. Scenario returns are
 * μ_next + σ_next·z_i; VaR and ES scale with σ_next, and the CDF is F(x) = F_z((x − μ_next)/σ_next).
 */
import type { RiskSide } from "../risk/measures/side";
import { EmpiricalLaw, type EmpiricalTail } from "./empirical";

/** What a volatility filter returns for one window. */
export interface FilterOutput {
  /** Standardised residuals of the window (any length ≥ 1, no NaN). */
  readonly residuals: ArrayLike<number>;
  /** Forecast volatility of the next return (> 0). */
  readonly nextSigma: number;
  /** Forecast mean of the next return (default 0). */
  readonly nextMean?: number;
  /** A caveat to pass on (e.g. a fallback fit). */
  readonly note?: string;
}

/** A volatility filter: the window (oldest first) to residuals and the next-day σ; null or the reason when it cannot filter. */
export type VolatilityFilter = (window: Float64Array) => FilterOutput | string | null;

/** The filtered-HS law: empirical law of μ + σ·z. */
export class FilteredLaw {
  private readonly residualLaw: EmpiricalLaw;
  constructor(
    residuals: ArrayLike<number>,
    readonly sigma: number,
    readonly mean = 0,
  ) {
    this.residualLaw = new EmpiricalLaw(residuals);
  }

  tail(confidence: number, side: RiskSide = "long"): EmpiricalTail {
    const t = this.residualLaw.tail(confidence, side);
    const shift = side === "long" ? -this.mean : this.mean;
    const ok = this.sigma > 0 && Number.isFinite(this.sigma) && Number.isFinite(this.mean);
    return {
      valueAtRisk: ok ? shift + this.sigma * t.valueAtRisk : NaN,
      expectedShortfall: ok ? shift + this.sigma * t.expectedShortfall : NaN,
      tailBeyondSample: t.tailBeyondSample,
    };
  }

  valueAtRisk(confidence: number, side: RiskSide = "long"): number {
    return this.tail(confidence, side).valueAtRisk;
  }

  expectedShortfall(confidence: number, side: RiskSide = "long"): number {
    return this.tail(confidence, side).expectedShortfall;
  }

  cdf(x: number): number {
    if (!(this.sigma > 0 && Number.isFinite(this.sigma))) return NaN;
    return this.residualLaw.cdf((x - this.mean) / this.sigma);
  }
}
