/**
 * A generalized normal law as a ForecastLaw: VaR and ES from src/core/risk/measures/tail.ts, the PIT from
 * src/core/gno/cdf.ts. Used by every model whose one-day law is a (scaled) generalized normal: the law fitted to
 * a window ("iid") and the filtered laws of EWMA and GARCH (whose next-day law is GNO(μ + σξ(k), σα(k), k)).
 */
import { cdf, type GnoParams } from "../gno";
import { expectedShortfall, valueAtRisk } from "../risk/measures/tail";
import type { RiskSide } from "../risk/measures/side";
import type { ForecastLaw } from "./law";

export function gnoForecastLaw(p: GnoParams): ForecastLaw {
  return new GnoForecastLaw(p.location, p.scale, p.shape);
}

/**
 * One object per forecast row (a rolling run makes thousands): the methods live on the prototype rather than in
 * per-row closures, and the instance is frozen with its params so no caller can change a forecast afterwards.
 */
class GnoForecastLaw implements ForecastLaw, GnoParams {
  readonly params: readonly number[];
  constructor(
    readonly location: number,
    readonly scale: number,
    readonly shape: number,
  ) {
    this.params = Object.freeze([location, scale, shape]);
    Object.freeze(this);
  }
  valueAtRisk(confidence: number, side: RiskSide): number {
    return valueAtRisk(confidence, this, side);
  }
  expectedShortfall(confidence: number, side: RiskSide): number {
    return expectedShortfall(confidence, this, side);
  }
  cdf(x: number): number {
    return cdf(x, this);
  }
}
