/**
 * Reference VaR methods a validator compares against: historical simulation (plain and age-weighted), filtered
 * historical simulation, the normal law and the Cornish–Fisher adjustment with modified ES; each also as a
 * ForecastModel for rolling out-of-sample use.
 */
export { ageWeights, EmpiricalLaw, historicalTail, TAIL_MASS_TOLERANCE, type EmpiricalTail } from "./empirical";
export { FilteredLaw, type FilterOutput, type VolatilityFilter } from "./filtered";
export {
  cornishFisherCdf,
  cornishFisherDomainProblem,
  cornishFisherLawShortfallFactor,
  cornishFisherSlope,
  cornishFisherTail,
  cornishFisherZ,
  modifiedShortfallFactor,
  normalTail,
  type MomentSummary,
  type MomentTail,
} from "./moments";
export { cornishFisherModel, filteredHistoricalModel, historicalModel, MIN_MOMENT_WINDOW, normalModel } from "./models";
