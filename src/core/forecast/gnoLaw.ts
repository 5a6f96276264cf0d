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
  const params = Object.freeze([p.location, p.scale, p.shape]);
  const law = { location: p.location, scale: p.scale, shape: p.shape };
  return Object.freeze({
    params,
    valueAtRisk: (confidence: number, side: RiskSide) => valueAtRisk(confidence, law, side),
    expectedShortfall: (confidence: number, side: RiskSide) => expectedShortfall(confidence, law, side),
    cdf: (x: number) => cdf(x, law),
  });
}
