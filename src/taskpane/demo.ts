/**
 * The built-in demo data: an invented, simulated scenario (no market data). Deterministic: the draws come
 * from the core's seeded GNO sampler (inversion), so the pane, the tests and the README worked example see
 * the very same numbers.
 */
import { quantile, sample, type GnoParams } from "../core/gno";
import { uniformStream } from "../core/random";
import { innovationLaw } from "../core/vol";

export interface DemoScenario {
  readonly id: string;
  /** Shown wherever the data are shown: says plainly that the data are simulated. */
  readonly title: string;
  readonly params: GnoParams;
  readonly n: number;
  readonly seed: number;
  /**
   * When present the returns follow a simulated GARCH(1,1) with innovations from the standardized generalized
   * normal law of this shape (params are then that innovation law): rₜ = μ + σₜzₜ, σ²ₜ₊₁ = ω + α(rₜ − μ)² + βσ²ₜ,
   * started at the unconditional variance ω / (1 − α − β).
   */
  readonly garch?: { readonly mu: number; readonly omega: number; readonly alpha: number; readonly beta: number; readonly shape: number };
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

/**
 * A third simulated set with volatility clusters (calm spells, then turbulent ones): an invented equity index,
 * 1,000 days, for the volatility and backtest view. Invented parameters, not estimated from any market.
 */
export const CLUSTER_DEMO: DemoScenario = {
  id: "clustered-index",
  title: "Simulated daily returns of an invented equity index with volatility clusters, 1,000 days (not market data)",
  params: innovationLaw(0.25),
  n: 1000,
  seed: 8128,
  garch: { mu: 0.0003, omega: 4e-6, alpha: 0.11, beta: 0.86, shape: 0.25 },
};

export const SCENARIOS: readonly DemoScenario[] = [DEMO, CAPPED_DEMO, CLUSTER_DEMO];

/** The scenario's returns (a fresh array each call). */
export function scenarioData(s: DemoScenario): Float64Array {
  if (!s.garch) return sample(s.params, s.n, s.seed);
  const g = s.garch;
  const z = innovationLaw(g.shape);
  const u = uniformStream(s.seed);
  const out = new Float64Array(s.n);
  let h = g.omega / (1 - g.alpha - g.beta);
  for (let t = 0; t < s.n; t++) {
    out[t] = g.mu + Math.sqrt(h) * quantile(u(), z);
    const e = out[t] - g.mu;
    h = g.omega + g.alpha * e * e + g.beta * h;
  }
  return out;
}
