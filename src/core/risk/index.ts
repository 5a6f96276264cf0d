/**
 * Risk layer: VaR and expected shortfall of the generalized normal law, the delta-method and profile-likelihood
 * VaR intervals,
 * rolling out-of-sample VaR, VaR backtests (Kupiec, Christoffersen, traffic light) and returns from prices.
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
export { rollingVar, type RollingVar, type RollingVarOptions } from "./rolling/rolling";
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
