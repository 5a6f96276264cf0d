/**
 * Kratz, Lok & McNeil (2018), "Multinomial VaR backtests: a simple implicit approach to backtesting expected
 * shortfall", J. Banking & Finance 88:393–407. VaR is tested at N levels αⱼ = α + (j − 1)(1 − α)/N, j = 1…N, from
 * one PIT column; row t falls in cell Xₜ = #{j : Vₜ > αⱼ} ∈ {0…N}, where Vₜ is the PIT of the loss (1 − uₜ for a
 * long position, uₜ for a short one, uₜ = F(return)). Cell probabilities θ₀ = α, θⱼ = (1 − α)/N for j ≥ 1.
 *
 * Pearson statistic S = Σⱼ (Oⱼ − nθⱼ)²/(nθⱼ) ~ χ²_N asymptotically. Nass (1959), "The χ² test for small
 * expectations in contingency tables", Biometrika 46:365–385, matches the first two moments: with
 * E S = N and Var S = 2N − (N² + 4N + 1)/n + (1/n) Σⱼ 1/θⱼ, c·S ~ χ²_ν where c = 2 E S / Var S and ν = c·E S
 * (KLM recommend this correction for the usual sample sizes; the variance is the exact one of Pearson's statistic,
 * e.g. Cochran 1952).
 */
import type { RiskSide } from "../measures/side";
import { chiSquareSf } from "../../special/incompleteGamma";

/** KLM's recommended number of levels. */
export const MULTINOMIAL_LEVELS = 4;

export interface MultinomialTest {
  readonly confidence: number;
  readonly levels: readonly number[];
  readonly observations: number;
  readonly counts: readonly number[];
  readonly expected: readonly number[];
  readonly pearson: number;
  /** Asymptotic χ²_N p-value. */
  readonly pValue: number;
  readonly nassScale: number;
  readonly nassDegrees: number;
  readonly nassPValue: number;
}

/** αⱼ = α + (j − 1)(1 − α)/N, j = 1…N. */
export function multinomialLevels(confidence: number, n = MULTINOMIAL_LEVELS): number[] {
  return Array.from({ length: n }, (_, j) => confidence + (j * (1 - confidence)) / n);
}

/** The multinomial test on a PIT column (values of F(return) in [0, 1]; NaN rows skipped). Null when empty. */
export function multinomialTest(
  pit: ArrayLike<number>,
  confidence: number,
  side: RiskSide = "long",
  n = MULTINOMIAL_LEVELS,
): MultinomialTest | null {
  if (!(confidence > 0 && confidence < 1) || !(Number.isInteger(n) && n >= 1)) return null;
  const levels = multinomialLevels(confidence, n);
  const counts = new Array<number>(n + 1).fill(0);
  let T = 0;
  for (let i = 0; i < pit.length; i++) {
    const u = pit[i];
    if (Number.isNaN(u)) continue;
    const v = side === "long" ? 1 - u : u;
    let cell = 0;
    while (cell < n && v > levels[cell]) cell++;
    counts[cell]++;
    T++;
  }
  if (T === 0) return null;
  const theta = [confidence, ...new Array<number>(n).fill((1 - confidence) / n)];
  const expected = theta.map((p) => T * p);
  let s = 0;
  let inv = 0;
  for (let j = 0; j <= n; j++) {
    s += (counts[j] - expected[j]) ** 2 / expected[j];
    inv += 1 / theta[j];
  }
  const mean = n;
  const variance = 2 * n - (n * n + 4 * n + 1) / T + inv / T;
  const c = (2 * mean) / variance;
  const nu = c * mean;
  return Object.freeze({
    confidence,
    levels: Object.freeze(levels),
    observations: T,
    counts: Object.freeze(counts),
    expected: Object.freeze(expected),
    pearson: s,
    pValue: chiSquareSf(s, n),
    nassScale: c,
    nassDegrees: nu,
    nassPValue: chiSquareSf(c * s, nu),
  });
}
