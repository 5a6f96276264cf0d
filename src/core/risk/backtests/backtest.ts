/**
 * Backtests of a VaR forecast series against realised returns.
 *
 * - Exceptions: for a long position, return < −VaR (the loss exceeds the VaR); for a short position,
 *   return > VaR. Rows where the return or the VaR is missing (NaN) are skipped; the exception sequence is
 *   the one left after skipping, in order.
 * - Kupiec (1995), "Techniques for verifying the accuracy of risk measurement models", J. Derivatives 3:73–84:
 *   proportion-of-failures LR = 2[x ln(x/(Tp)) + (T−x) ln((T−x)/(T(1−p)))] ~ χ²₁, p = 1 − confidence.
 * - Christoffersen (1998), "Evaluating interval forecasts", Int. Econ. Review 39:841–862: independence LR from
 *   the first-order Markov transition counts n_ij (T−1 transitions) ~ χ²₁, and conditional coverage
 *   LR_cc = LR_pof + LR_ind ~ χ²₂.
 *   Conventions (stated, so no edge case is NaN): 0·ln 0 = 0; a row of the transition matrix with no visits
 *   contributes nothing. With no exceptions, only exceptions or fewer than 2 observations, LR_ind is 0 and the
 *   test is flagged as not informative.
 * - Traffic-light zone: Basel Committee on Banking Supervision (1996), "Supervisory framework for the use of
 *   'backtesting' in conjunction with the internal models approach to market risk capital requirements",
 *   Table 2 (250 days, 99%: green 0–4, yellow 5–9, red 10+). Zones follow the binomial cumulative probability
 *   of the exception count: green below 95%, red from 99.99%, yellow between; the same cut-offs are applied
 *   for any number of observations and confidence level. Zero exceptions is always green (with very few
 *   observations even a clean record can have a cumulative probability above 95%).
 */
import { binomialCdf, binomialQuantile } from "./binomial";
import { chiSquare1Sf, chiSquare2Sf } from "./chiSquare";
import type { RiskSide } from "../measures/side";
import { durationTest, type DurationTest } from "./duration";

/** Cumulative binomial probability below which the count is green (BCBS 1996). */
export const GREEN_LIMIT = 0.95;
/** Cumulative binomial probability from which the count is red (BCBS 1996). */
export const RED_LIMIT = 0.9999;

export type TrafficLight = "green" | "yellow" | "red";

export interface LikelihoodRatioTest {
  readonly statistic: number;
  readonly pValue: number;
}

export interface TransitionCounts {
  readonly n00: number;
  readonly n01: number;
  readonly n10: number;
  readonly n11: number;
}

export interface IndependenceTest extends LikelihoodRatioTest {
  /** False when the transition matrix cannot show dependence (no exception, only exceptions, or < 2 observations). */
  readonly informative: boolean;
  readonly transitions: TransitionCounts;
}

export interface VarBacktest {
  readonly confidence: number;
  readonly side: RiskSide;
  readonly observations: number;
  readonly exceptions: number;
  readonly expectedExceptions: number;
  readonly exceptionRate: number;
  readonly expectedRate: number;
  readonly kupiec: LikelihoodRatioTest;
  readonly independence: IndependenceTest;
  readonly conditionalCoverage: LikelihoodRatioTest;
  readonly zone: TrafficLight;
  /** Binomial P(exceptions ≤ observed) under the nominal rate. */
  readonly cumulativeProbability: number;
  /** Largest exception count still green for these observations and confidence. */
  readonly greenMax: number;
  /** Smallest exception count that is red. */
  readonly redFrom: number;
  /** Christoffersen & Pelletier (2004) duration test of the exception sequence (see duration.ts). */
  readonly duration: DurationTest;
}

/** n·ln(a/b) with 0·ln(·) = 0. */
function xLogRatio(n: number, a: number, b: number): number {
  return n === 0 ? 0 : n * Math.log(a / b);
}

/** Kupiec's proportion-of-failures LR for x exceptions in T observations at exception probability p. */
export function kupiecStatistic(exceptions: number, observations: number, p: number): number {
  const x = exceptions;
  const T = observations;
  if (!(T > 0) || !(x >= 0 && x <= T) || !(p > 0 && p < 1)) return NaN;
  const lr = 2 * (xLogRatio(x, x / T, p) + xLogRatio(T - x, (T - x) / T, 1 - p));
  return Math.max(0, lr);
}

/** Christoffersen's independence LR from the transition counts. */
export function independenceStatistic(t: TransitionCounts): number {
  const { n00, n01, n10, n11 } = t;
  const total = n00 + n01 + n10 + n11;
  if (total === 0) return 0;
  const pi = (n01 + n11) / total;
  const row0 = n00 + n01;
  const row1 = n10 + n11;
  let lr = 0;
  if (row0 > 0) {
    const pi0 = n01 / row0;
    lr += xLogRatio(n00, 1 - pi0, 1 - pi) + xLogRatio(n01, pi0, pi);
  }
  if (row1 > 0) {
    const pi1 = n11 / row1;
    lr += xLogRatio(n10, 1 - pi1, 1 - pi) + xLogRatio(n11, pi1, pi);
  }
  return Math.max(0, 2 * lr);
}

/** Counts the first-order transitions of a 0/1 exception sequence. */
export function transitionCounts(hits: ArrayLike<boolean>): TransitionCounts {
  let n00 = 0;
  let n01 = 0;
  let n10 = 0;
  let n11 = 0;
  for (let i = 1; i < hits.length; i++) {
    if (hits[i - 1]) {
      if (hits[i]) n11++;
      else n10++;
    } else if (hits[i]) n01++;
    else n00++;
  }
  return { n00, n01, n10, n11 };
}

/** Exception flags for the rows where both the return and the VaR are numbers (NaN rows skipped). */
export function exceptionSequence(returns: ArrayLike<number>, varForecasts: ArrayLike<number>, side: RiskSide): boolean[] {
  const out: boolean[] = [];
  const n = Math.min(returns.length, varForecasts.length);
  for (let i = 0; i < n; i++) {
    const r = returns[i];
    const v = varForecasts[i];
    if (Number.isNaN(r) || Number.isNaN(v)) continue;
    out.push(side === "long" ? r < -v : r > v);
  }
  return out;
}

/** Traffic-light zone of an exception count by its binomial cumulative probability. */
export function trafficLight(exceptions: number, observations: number, p: number): TrafficLight {
  if (exceptions === 0) return "green";
  const cdf = binomialCdf(exceptions, observations, p);
  if (cdf >= RED_LIMIT) return "red";
  if (cdf >= GREEN_LIMIT) return "yellow";
  return "green";
}

/**
 * Backtest of VaR forecasts (positive losses) against returns at the given confidence. Returns null when no
 * row has both a return and a VaR, or the confidence is outside (0, 1).
 */
export function backtestVar(
  returns: ArrayLike<number>,
  varForecasts: ArrayLike<number>,
  confidence: number,
  side: RiskSide = "long",
): VarBacktest | null {
  if (!(confidence > 0 && confidence < 1)) return null;
  const hits = exceptionSequence(returns, varForecasts, side);
  const T = hits.length;
  if (T === 0) return null;
  const p = 1 - confidence;
  let x = 0;
  for (const h of hits) if (h) x++;
  const pof = kupiecStatistic(x, T, p);
  const transitions = transitionCounts(hits);
  const ind = independenceStatistic(transitions);
  const informative = transitions.n00 + transitions.n01 > 0 && transitions.n10 + transitions.n11 > 0;
  const cc = pof + ind;
  const cumulativeProbability = binomialCdf(x, T, p);
  const greenMax = Math.max(0, binomialQuantile(GREEN_LIMIT, T, p) - 1);
  const redFrom = Math.max(1, binomialQuantile(RED_LIMIT, T, p));
  return Object.freeze({
    confidence,
    side,
    observations: T,
    exceptions: x,
    expectedExceptions: T * p,
    exceptionRate: x / T,
    expectedRate: p,
    kupiec: Object.freeze({ statistic: pof, pValue: chiSquare1Sf(pof) }),
    independence: Object.freeze({ statistic: ind, pValue: chiSquare1Sf(ind), informative, transitions: Object.freeze(transitions) }),
    conditionalCoverage: Object.freeze({ statistic: cc, pValue: chiSquare2Sf(cc) }),
    zone: trafficLight(x, T, p),
    cumulativeProbability,
    greenMax,
    redFrom,
    duration: durationTest(hits),
  });
}
