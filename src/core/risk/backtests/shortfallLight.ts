/**
 * Costanzino & Curran (2018), "A simple traffic light approach to backtesting expected shortfall", Risks 6(1):2
 * (building on their 2015 spectral backtest): the ES "failure rate" of a PIT column. With Vₜ the PIT of the
 * row in the loss tail (uₜ = F(return) for a long position, 1 − uₜ for a short one) and α = 1 − confidence,
 *   Hₜ = (α − Vₜ)⁺ / α,  E Hₜ = α/2,  Var Hₜ = α(4 − 3α)/12  (V uniform under H0),
 *   Z = √T (H̄ − α/2) / √(α(4 − 3α)/12) → N(0, 1),
 * and the zone follows Φ(Z) with the cut-offs of the Basel (1996) VaR traffic light: green below 0.95, red from
 * 0.9999, yellow between (the cut-offs as we recall the paper using them: from memory).
 */
import { normalCdf } from "../../normal";
import type { RiskSide } from "../measures/side";
import { GREEN_LIMIT, RED_LIMIT, type TrafficLight } from "./backtest";

export interface ShortfallTrafficLight {
  readonly confidence: number;
  readonly observations: number;
  /** H̄, the average ES failure measure. */
  readonly failureRate: number;
  /** α/2, its expectation under correct forecasts. */
  readonly expectedRate: number;
  readonly z: number;
  /** Φ(Z). */
  readonly cumulativeProbability: number;
  readonly zone: TrafficLight;
}

/** The ES traffic light of a PIT column (NaN rows skipped). Null when empty or a bad confidence. */
export function shortfallTrafficLight(pit: ArrayLike<number>, confidence: number, side: RiskSide = "long"): ShortfallTrafficLight | null {
  if (!(confidence > 0 && confidence < 1)) return null;
  const alpha = 1 - confidence;
  let T = 0;
  let sum = 0;
  for (let i = 0; i < pit.length; i++) {
    const u = pit[i];
    if (Number.isNaN(u)) continue;
    const v = side === "long" ? u : 1 - u;
    T++;
    if (v < alpha) sum += (alpha - v) / alpha;
  }
  if (T === 0) return null;
  const failureRate = sum / T;
  const sd = Math.sqrt((alpha * (4 - 3 * alpha)) / 12);
  const z = (Math.sqrt(T) * (failureRate - alpha / 2)) / sd;
  const cumulativeProbability = normalCdf(z);
  const zone: TrafficLight = cumulativeProbability >= RED_LIMIT ? "red" : cumulativeProbability >= GREEN_LIMIT ? "yellow" : "green";
  return Object.freeze({ confidence, observations: T, failureRate, expectedRate: alpha / 2, z, cumulativeProbability, zone });
}
