/**
 * Conditional volatility: the standardized generalized-normal innovation law (innovation.ts), EWMA (ewma.ts),
 * GARCH(1,1) likelihood with analytic gradient and its fit (garch.ts, maximize.ts), the innovation shape fit of a
 * two-step EWMA (shapeFit.ts), the filter that gives σₜ, standardized residuals and the next σ (filter.ts), model
 * fits with the next-day law (model.ts), diagnostics (diagnostics.ts) and the report (report.ts).
 */
export { INNOVATION_SHAPE_CAP, innovationEdge, innovationLaw, scaledLaw, standardizedShape, pointScore } from "./innovation";
export type { StandardizedShape, PointScore } from "./innovation";
export { DEFAULT_LAMBDA, ewmaVariances } from "./ewma";
export {
  fitGarch, garchLikelihood, garchVariances, garchVector, garchFromVector, varianceTargetingStart, INNOVATION_KINDS,
} from "./garch";
export type { GarchParams, GarchEstimate, GarchFitOptions, GarchPass, Innovations } from "./garch";
export { maximizeBfgs } from "./maximize";
export { fitInnovationShape, shapeLikelihood } from "./shapeFit";
export { filterReturns, type FilterSpec, type Filtered } from "./filter";
export { fitVolatility, type VolEstimate, type VolFitOptions, type VolModelKind } from "./model";
export { ljungBox, type LjungBox } from "./diagnostics";
export { chiSquareSf, upperGammaRegularized } from "../special/incompleteGamma";
export { garchCovariance, volReport, VOL_MODELS, LJUNG_BOX_LAGS, type ReportedParameter, type VolReport, type VolReportModel } from "./report";
