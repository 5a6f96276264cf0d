/**
 * The built-in demo data: an invented, simulated scenario (no market data). Deterministic: the draws come
 * from the core's seeded GNO sampler (inversion), so the pane, the tests and the README worked example see
 * the very same numbers.
 */
import { sample, type GnoParams } from "../core/gno";

export interface DemoScenario {
  readonly id: string;
  /** Shown wherever the data are shown: says plainly that the data are simulated. */
  readonly title: string;
  readonly params: GnoParams;
  readonly n: number;
  readonly seed: number;
}

/** Simulated daily returns of an invented commodity book: left-skewed (sharp drops), 750 trading days. */
export const DEMO: DemoScenario = {
  id: "commodity-book",
  title: "Simulated daily returns of an invented commodity book, 750 days (not market data)",
  params: { location: 0.0006, scale: 0.0115, shape: 0.22 },
  n: 750,
  seed: 20250417,
};

/**
 * A second simulated set whose fitted upper edge sits close to the largest return: an invented "capped
 * upside" strategy (strongly left-skewed, short-option-like). Used to show the edge warnings.
 */
export const CAPPED_DEMO: DemoScenario = {
  id: "capped-upside",
  title: "Simulated daily returns of an invented capped-upside strategy, 500 days (not market data)",
  params: { location: 0.004, scale: 0.006, shape: 1.1 },
  n: 500,
  seed: 7351,
};

export const SCENARIOS: readonly DemoScenario[] = [DEMO, CAPPED_DEMO];

/** The scenario's returns (a fresh array each call). */
export function scenarioData(s: DemoScenario): Float64Array {
  return sample(s.params, s.n, s.seed);
}
