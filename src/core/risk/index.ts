/**
 * Risk layer: VaR and expected shortfall of the generalized normal law, the delta-method and profile-likelihood
 * VaR intervals,
 * rolling out-of-sample VaR, VaR backtests (Kupiec, Christoffersen, traffic light, durations), ES backtests
 * (Z1/Z2, exceedance residuals, multinomial, tail LR, ES traffic light), desk rules, P&L attribution and returns.
 */
export { RISK_SIDES, type RiskSide } from "./measures/side";
export { expectedShortfall, reflect, tailMeanFactor, tailRisk, valueAtRisk, type TailRisk } from "./measures/tail";
export { quantileGradient, reducedQuantileShapeDerivatives, valueAtRiskGradient, varInterval, type VarInterval } from "./intervals/varInterval";
export {
  varProfile,
  varProfileInterval,
  varProfileIntervalWork,
  type FitSummary,
  type ProfilePoint,
  type VarProfile,
  type VarProfileInterval,
} from "./intervals/varProfile";
export {
  rollingForecasts,
  rollingModelForecasts,
  rollingUnits,
  rollingVar,
  type RollingForecasts,
  type RollingVar,
  type RollingVarOptions,
} from "./rolling/rolling";
export { createModel, FORECAST_MODELS, modelNames, type ModelFactory, type ModelOptions } from "./rolling/registry";
export { rollingCacheKey, cachedRolling, storeRolling, rollingCacheStats, clearRollingCache, sameContent, ROLLING_CACHE_SIZE } from "./rolling/cache";
export {
  backtestVar,
  exceptionSequence,
  GREEN_LIMIT,
  independenceStatistic,
  kupiecStatistic,
  RED_LIMIT,
  trafficLight,
  transitionCounts,
  type IndependenceTest,
  type LikelihoodRatioTest,
  type TrafficLight,
  type TransitionCounts,
  type VarBacktest,
} from "./backtests/backtest";
export { binomialCdf, binomialLogCdf, binomialQuantile } from "./backtests/binomial";
export { chiSquare1Sf, chiSquare2Sf } from "./backtests/chiSquare";
export { periodReturn, returnsFromPrices, RETURN_KINDS, type ReturnKind } from "./returns";
export { chiSquareSf, upperGammaRegularized } from "../special/incompleteGamma";
export { durationTest, type DurationTest } from "./backtests/duration";
export {
  shortfallZ,
  z2PValueFromLaws,
  z2PValueMatchedTails,
  z2SimulatedPValue,
  Z2_CRITICAL_001,
  Z2_CRITICAL_5,
  Z2_CRITICAL_CONFIDENCE,
  type ShortfallZ,
  type SimulatedPValue,
} from "./backtests/shortfallZ";
export { exceedanceResiduals, exceedanceResidualTest, type ExceedanceResidualTest } from "./backtests/exceedanceResiduals";
export { multinomialLevels, multinomialTest, type MultinomialTest } from "./backtests/multinomial";
export { tailLikelihoodTest, type TailLikelihoodTest } from "./backtests/tailLikelihood";
export { shortfallTrafficLight, type ShortfallTrafficLight } from "./backtests/shortfallLight";
export { deskTest, multiplierFor, multiplierZone, DESK_LIMIT_975, DESK_LIMIT_99, DESK_WINDOW, type DeskTest, type RegulatoryZone } from "./backtests/desk";
export { attributionTest, ksTwoSample, spearman, type AttributionTest } from "./backtests/attribution";
