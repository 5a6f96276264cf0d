/**
 * Scoring functions for VaR and ES forecasts (lower is better), written for positive-loss VaR/ES as everywhere
 * in Askew. With α = 1 − c, on the long side the forecast return quantile is v = −VaR and e = −ES; the short side
 * is the long side of −r (r → −r, same VaR and ES).
 *
 *   Tick (quantile) loss of v at level α (Koenker & Bassett 1978; strictly consistent for the quantile):
 *     T(r, v) = (α − 1{r ≤ v})(r − v)   ≥ 0.
 *   FZ0 loss (Fissler & Ziegel 2016 class; the zero-degree-homogeneous member, Patton, Ziegel & Chen 2019,
 *   J. Econometrics 211, eq. for L_FZ0 — from memory, checked by hand in the tests):
 *     FZ0(r, v, e) = −(1/(α e))·1{r ≤ v}(v − r) + v/e + ln(−e) − 1,   defined for e < 0 (ES > 0).
 *   It is strictly consistent for the (VaR, ES) pair, so the true pair has the lowest expected FZ0 loss; values
 *   can be negative (only differences between forecasts mean anything). Algebraic check: the Fissler–Ziegel form
 *   (1{r ≤ v} − α)(G1(v) − G1(r)) + G2(e)(e − v + 1{r ≤ v}(v − r)/α) − 𝒢2(e) with G1 = 0, G2(x) = −1/x,
 *   𝒢2(x) = −ln(−x) (x < 0) expands to exactly the line above; the tests check strict consistency by simulation.
 * Both are NaN where an input is NaN; FZ0 is NaN where ES ≤ 0.
 */
import type { RiskSide } from "../risk/measures/side";

/** Tick loss of a VaR forecast for the realised return r. */
export function tickLoss(r: number, valueAtRisk: number, confidence: number, side: RiskSide = "long"): number {
  if (!(confidence > 0 && confidence < 1)) return NaN;
  const alpha = 1 - confidence;
  const x = side === "short" ? -r : r;
  const v = -valueAtRisk;
  return (alpha - (x <= v ? 1 : 0)) * (x - v);
}

/** FZ0 joint loss of a (VaR, ES) forecast for the realised return r; NaN when ES ≤ 0. */
export function fz0Loss(r: number, valueAtRisk: number, expectedShortfall: number, confidence: number, side: RiskSide = "long"): number {
  if (!(confidence > 0 && confidence < 1) || !(expectedShortfall > 0)) return NaN;
  const alpha = 1 - confidence;
  const x = side === "short" ? -r : r;
  const v = -valueAtRisk;
  const e = -expectedShortfall;
  const hit = x <= v ? (v - x) / (alpha * e) : 0;
  return -hit + v / e + Math.log(-e) - 1;
}

/** Mean scores of a forecast column. */
export interface ForecastScores {
  /** Rows with a return, a VaR and an ES (the rows scored). */
  readonly observations: number;
  readonly meanTickLoss: number;
  readonly meanFz0Loss: number;
  /** First scored row (0-based) whose ES is ≤ 0, where FZ0 is undefined; −1 when none. */
  readonly firstNonPositiveEs: number;
  /** Per-row losses (NaN where the row is skipped), for the Diebold–Mariano test. */
  readonly tick: Float64Array;
  readonly fz0: Float64Array;
}

/**
 * Scores of VaR/ES columns against realised returns; rows where any of the three is NaN are skipped (gaps).
 * Pass `es` = null to score the VaR alone (FZ0 then NaN).
 */
export function scoreForecasts(
  returns: ArrayLike<number>,
  valueAtRisk: ArrayLike<number>,
  es: ArrayLike<number> | null,
  confidence: number,
  side: RiskSide = "long",
): ForecastScores {
  const n = returns.length;
  const tick = new Float64Array(n).fill(NaN);
  const fz0 = new Float64Array(n).fill(NaN);
  let count = 0;
  let sumTick = 0;
  let sumFz0 = 0;
  let firstNonPositiveEs = -1;
  for (let i = 0; i < n; i++) {
    const r = returns[i];
    const v = valueAtRisk[i];
    const e = es === null ? 0 : es[i];
    if (!Number.isFinite(r) || !Number.isFinite(v) || !Number.isFinite(e)) continue;
    count++;
    tick[i] = tickLoss(r, v, confidence, side);
    sumTick += tick[i];
    if (es !== null) {
      if (!(e > 0) && firstNonPositiveEs < 0) firstNonPositiveEs = i;
      fz0[i] = fz0Loss(r, v, e, confidence, side);
      sumFz0 += fz0[i];
    }
  }
  return {
    observations: count,
    meanTickLoss: count > 0 ? sumTick / count : NaN,
    meanFz0Loss: count > 0 && es !== null && firstNonPositiveEs < 0 ? sumFz0 / count : NaN,
    firstNonPositiveEs,
    tick,
    fz0,
  };
}
