/**
 * Risk over more than one day: the exact law of the sum of h i.i.d. one-day draws (sumLaw.ts), seeded path
 * simulation of conditional-volatility models (paths.ts), and the liquidity-horizon cascade (liquidity.ts).
 */
export { horizonLaw, horizonValueAtRisk, horizonExpectedShortfall, MAX_HORIZON, MAX_GRID, MAX_HORIZON_SHAPE } from "./sumLaw";
export type { HorizonLaw, LatticeAccuracy } from "./sumLaw";
export { simulateSums, simulatedTail, garchSumVariance, MAX_PATHS, MAX_SIMULATED_STEPS, BATCHES } from "./paths";
export type { PathModel, SimulationOptions, SimulatedSums, SimulatedTail } from "./paths";
export { liquidityAdjustedEs, DEFAULT_LIQUIDITY_HORIZONS } from "./liquidity";
