/**
 * Generalized Pareto tails and the spliced law (generalized normal body, Pareto tails beyond thresholds).
 * A room of its own, named for the law it adds: `risk/measures/tail.ts` already means "VaR/ES of the law".
 * gpd.ts (the Pareto law of excesses), likelihood.ts (score and observed information), estimate.ts (maximum
 * likelihood by Grimshaw's reduction, probability-weighted moments), spliced.ts (density, CDF, quantile, VaR,
 * ES, moments, edges, draws, the 9 cells), forecastLaw.ts (as a ForecastLaw), fitTails.ts (fit to returns).
 */
export * from "./gpd";
export { gpdLogLikelihood, gpdDerivatives, type GpdDerivatives } from "./likelihood";
export * from "./estimate";
export * from "./spliced";
export { splicedForecastLaw } from "./forecastLaw";
export * from "./residualTails";
export * from "./meanExcess";
export * from "./fitTails";
