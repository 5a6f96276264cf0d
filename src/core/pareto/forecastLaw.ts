/**
 * The spliced law as a ForecastLaw (src/core/forecast/law.ts): VaR, ES and the PIT of a realised return, with
 * its 9 cells as params. ES that does not exist (loss tail with ξ ≥ 1) is NaN, as the interface asks.
 */
import type { ForecastLaw } from "../forecast/law";
import type { RiskSide } from "../risk/measures/side";
import { splicedCdf, splicedCells, splicedExpectedShortfall, splicedValueAtRisk, type SplicedParams } from "./spliced";

export function splicedForecastLaw(p: SplicedParams): ForecastLaw {
  const params = Object.freeze(splicedCells(p));
  return Object.freeze({
    valueAtRisk: (confidence: number, side: RiskSide) => splicedValueAtRisk(confidence, p, side),
    expectedShortfall: (confidence: number, side: RiskSide) => {
      const es = splicedExpectedShortfall(confidence, p, side);
      return Number.isFinite(es) ? es : NaN;
    },
    cdf: (x: number) => splicedCdf(x, p),
    params,
  });
}
