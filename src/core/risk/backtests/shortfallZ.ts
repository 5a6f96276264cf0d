/**
 * Acerbi & Szekely (2014), "Backtesting expected shortfall" (Risk, December 2014; MSCI research paper): the Z1
 * and Z2 statistics of an ES forecast column, the paper's fixed critical values for Z2 and a seeded simulated
 * p-value for Z2 under the per-row forecast laws.
 *
 * With realised returns X_t, VaR_t and ES_t as positive losses, the loss L_t = −X_t (long side; the short side
 * uses L_t = X_t), the exception flag I_t = 1{L_t > VaR_t}, T rows, N_T = Σ I_t and α = 1 − confidence:
 *   Z1 = 1 − (1/N_T) Σ I_t L_t / ES_t        (undefined when N_T = 0)
 *   Z2 = 1 − Σ I_t L_t / (T α ES_t)
 * Both have expectation 0 under correct forecasts (Z2 exactly, Z1 conditionally on N_T > 0); negative values mean
 * that ES understates the losses (Z1 given the exceptions, Z2 jointly with their frequency). Rows where the
 * return, VaR or ES is missing (NaN) are skipped.
 *
 * Critical values of Z2 at the 97.5% level and T = 250 (the paper reports them stable across Student-t laws):
 * −0.70 at 5% and −1.8 at 0.01% — recalled from the paper, from memory (the text could not be retrieved here).
 *
 * Simulated p-value: under H0 the realised loss of row t is the forecast law's quantile at a uniform draw U_t, and
 * I_t = 1{U_t < α}; so each replicate draws U_t for every row and, for rows in the tail, the loss at level
 * 1 − U_t from the row's law (`tailLoss`). p = (1 + #{Z2* ≤ Z2})/(1 + B) (a Monte Carlo test, Dufour 2006:
 * exact size at levels that are multiples of 1/(B+1)).
 */
import type { ForecastLaw } from "../../forecast/law";
import type { RiskSide } from "../measures/side";
import { uniformStream } from "../../random";
import type { Work } from "../../work";

/** Z2 critical values at the 97.5% level for T = 250 (Acerbi & Szekely 2014; from memory). */
export const Z2_CRITICAL_5 = -0.7;
export const Z2_CRITICAL_001 = -1.8;
/** The confidence level the fixed Z2 critical values belong to. */
export const Z2_CRITICAL_CONFIDENCE = 0.975;

export interface ShortfallZ {
  readonly confidence: number;
  readonly side: RiskSide;
  readonly observations: number;
  readonly exceptions: number;
  /** NaN when there is no exception. */
  readonly z1: number;
  readonly z2: number;
  /** Z2 below the 5% critical value (only meaningful at confidence 0.975). */
  readonly z2Reject5: boolean;
  /** Z2 below the 0.01% critical value. */
  readonly z2Reject001: boolean;
}

/** Loss of a return for a side: −x for long, x for short. */
export function lossOf(x: number, side: RiskSide): number {
  return side === "long" ? -x : x;
}

/** Z1 and Z2 of return / VaR / ES columns (positive losses). Null when no complete row or a bad confidence. */
export function shortfallZ(
  returns: ArrayLike<number>,
  varForecasts: ArrayLike<number>,
  esForecasts: ArrayLike<number>,
  confidence: number,
  side: RiskSide = "long",
): ShortfallZ | null {
  if (!(confidence > 0 && confidence < 1)) return null;
  const alpha = 1 - confidence;
  const n = Math.min(returns.length, varForecasts.length, esForecasts.length);
  let T = 0;
  let exceptions = 0;
  let sum = 0;
  for (let i = 0; i < n; i++) {
    const x = returns[i];
    const v = varForecasts[i];
    const e = esForecasts[i];
    if (Number.isNaN(x) || Number.isNaN(v) || Number.isNaN(e)) continue;
    T++;
    const loss = lossOf(x, side);
    if (loss > v) {
      exceptions++;
      sum += loss / e;
    }
  }
  if (T === 0) return null;
  const z1 = exceptions > 0 ? 1 - sum / exceptions : NaN;
  const z2 = 1 - sum / (T * alpha);
  return Object.freeze({
    confidence,
    side,
    observations: T,
    exceptions,
    z1,
    z2,
    z2Reject5: z2 < Z2_CRITICAL_5,
    z2Reject001: z2 < Z2_CRITICAL_001,
  });
}

/** Row-wise tail quantiles under H0: the loss of row `row` at level 1 − u (u < α). */
export type TailLoss = (row: number, u: number) => number;

export interface SimulatedPValue {
  readonly pValue: number;
  readonly replicates: number;
  readonly seed: number;
}

/**
 * Simulated p-value of an observed Z2 (lower tail): `es[t]` are the rows' ES forecasts, `tailLoss` the rows' loss
 * quantiles. One replicate per yielded step (T uniform draws and about αT quantile calls).
 */
export function* z2SimulatedPValue(
  observed: number,
  es: ArrayLike<number>,
  tailLoss: TailLoss,
  confidence: number,
  replicates: number,
  seed: number,
): Work<SimulatedPValue> {
  const alpha = 1 - confidence;
  const T = es.length;
  const next = uniformStream(seed);
  let atOrBelow = 0;
  for (let b = 0; b < replicates; b++) {
    let sum = 0;
    for (let t = 0; t < T; t++) {
      const u = next();
      if (u < alpha) sum += tailLoss(t, u) / es[t];
    }
    const z = 1 - sum / (T * alpha);
    if (z <= observed) atOrBelow++;
    yield (b + 1) / replicates;
  }
  return Object.freeze({ pValue: (1 + atOrBelow) / (1 + replicates), replicates, seed });
}

/** The simulated Z2 p-value under known per-row forecast laws (their ES at `confidence` is the forecast). */
export function z2PValueFromLaws(
  observed: number,
  laws: readonly ForecastLaw[],
  confidence: number,
  side: RiskSide,
  replicates: number,
  seed: number,
): Work<SimulatedPValue> {
  const es = Float64Array.from(laws, (law) => law.expectedShortfall(confidence, side));
  return z2SimulatedPValue(observed, es, (t, u) => laws[t].valueAtRisk(1 - u, side), confidence, replicates, seed);
}

/**
 * The simulated Z2 p-value when only each row's VaR and ES are known: every row's tail beyond VaR is taken as
 * exponential with the mean excess ES − VaR, L(u) = VaR + (ES − VaR)·ln(α/u) for u < α, the one-parameter tail
 * that reproduces both forecasts exactly. An approximation: heavier true tails make Z2 more dispersed than this.
 */
export function z2PValueMatchedTails(
  observed: number,
  varForecasts: ArrayLike<number>,
  esForecasts: ArrayLike<number>,
  confidence: number,
  replicates: number,
  seed: number,
): Work<SimulatedPValue> {
  const alpha = 1 - confidence;
  return z2SimulatedPValue(
    observed,
    esForecasts,
    (t, u) => varForecasts[t] + (esForecasts[t] - varForecasts[t]) * Math.log(alpha / u),
    confidence,
    replicates,
    seed,
  );
}
