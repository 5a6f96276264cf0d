/**
 * Historical simulation: VaR and ES read off the (optionally weighted) empirical law of a sample of returns.
 *
 * Definitions (the same in every Askew function and model that uses historical returns):
 *   Each observation x_i carries a weight w_i > 0 (1 for plain historical simulation; age weights below).
 *   Losses on the chosen side are L_i = −x_i (long) or L_i = x_i (short). Sort the losses from worst to best and
 *   let the tail mass be M = (1 − c)·Σw. Walk down the sorted losses accumulating weight W:
 *   - VaR is the first loss at which W reaches M — the lower (1 − c) quantile inf{x : F(x) ≥ 1 − c} of the
 *     returns for the long side (numpy percentile method "inverted_cdf"), mirrored for the short side. With equal
 *     weights this is the ⌈n(1 − c)⌉-th worst loss.
 *   - ES is the weight-averaged loss over exactly the mass M from the worst end: every loss met before VaR counts
 *     with its full weight, the VaR observation with the remaining weight M − W (the fractional index). With equal
 *     weights and m = n(1 − c): ES = (L_(1) + … + L_(⌊m⌋) + (m − ⌊m⌋)·L_(⌊m⌋+1))/m. This is the exact expected
 *     shortfall (the tail integral of the quantile function) of the weighted empirical law, so ES ≥ VaR always.
 *   - Ties need no rule: tied losses are equal, so the order within them never changes a result.
 *   - Binary rounding: a cumulative weight within a relative 1e-10 of M counts as reaching it, so that
 *     1 − 0.99 = 0.010000000000000009 at n = 200 gives exactly 2 tail observations, not a third.
 *   - When M is less than the worst observation's weight (e.g. fewer than 1/(1 − c) equal-weight returns), VaR and
 *     ES are both the worst loss: the sample cannot say more; `tailBeyondSample` flags it.
 *   The CDF (for the PIT of a realised return) is the right-continuous F(x) = Σ_{x_i ≤ x} w_i / Σw.
 *
 * Age weights (Boudoukh, Richardson & Whitelaw 1998, "The best of both worlds", Risk 11(5)): with decay λ in (0, 1],
 * the return of age a (a = 0 the most recent, the last in the window) weighs λ^a(1 − λ)/(1 − λ^n) — proportional
 * to λ^a, which is what we store (the normalisation cancels). λ = 1 is plain historical simulation. Boudoukh et al.
 * interpolate between adjacent order statistics; we keep the convention above instead, so that integer weights give
 * exactly the plain result on replicated rows and every function reads the tail the same way.
 */
import type { RiskSide } from "../risk/measures/side";
import { sortedCopy } from "../sort";

/** Relative tolerance on the tail mass for binary rounding (see the file header). */
export const TAIL_MASS_TOLERANCE = 1e-10;

/** VaR and ES of an empirical law on one side, as positive losses. */
export interface EmpiricalTail {
  readonly valueAtRisk: number;
  readonly expectedShortfall: number;
  /** True when the tail mass is within the single worst observation's weight (VaR = ES = worst loss). */
  readonly tailBeyondSample: boolean;
}

/** Weights λ^a of the returns in a window, oldest first (a = n − 1 … 0). λ = 1 gives all ones. */
export function ageWeights(n: number, decay: number): Float64Array {
  const w = new Float64Array(n);
  if (!(decay > 0 && decay <= 1)) return w.fill(NaN);
  if (decay === 1) return w.fill(1);
  const logDecay = Math.log(decay);
  for (let i = 0; i < n; i++) w[i] = Math.exp((n - 1 - i) * logDecay);
  return w;
}

/**
 * The weighted empirical law of a sample: sorted once, answers VaR/ES on either side and the CDF.
 * Total on its domain: NaN answers for an empty sample, non-finite values or a non-positive total weight.
 */
export class EmpiricalLaw {
  /** Returns sorted ascending. */
  readonly sorted: Float64Array;
  /** Weight of each sorted return (unnormalised). */
  readonly weights: Float64Array;
  /** Cumulative weights of the sorted returns: cumulative[i] = Σ_{j ≤ i} weights[j]. */
  private readonly cumulative: Float64Array;
  readonly totalWeight: number;
  private readonly valid: boolean;

  constructor(returns: ArrayLike<number>, weights: ArrayLike<number> | null = null) {
    const n = returns.length;
    let valid = n > 0 && (weights === null || weights.length === n);
    for (let i = 0; i < n && valid; i++) valid = Number.isFinite(returns[i]) && (weights === null || (weights[i] >= 0 && Number.isFinite(weights[i])));
    this.sorted = new Float64Array(n);
    this.weights = new Float64Array(n);
    this.cumulative = new Float64Array(n);
    if (weights === null) {
      this.sorted.set(sortedCopy(returns));
      this.weights.fill(1);
    } else if (valid) {
      const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => returns[a] - returns[b]);
      order.forEach((k, i) => {
        this.sorted[i] = returns[k];
        this.weights[i] = weights[k];
      });
    }
    let total = 0;
    for (let i = 0; i < n; i++) {
      total += this.weights[i];
      this.cumulative[i] = total;
    }
    this.totalWeight = total;
    this.valid = valid && total > 0;
  }

  /** VaR and ES at confidence c on the side, by the walk in the file header. */
  tail(confidence: number, side: RiskSide = "long"): EmpiricalTail {
    const n = this.sorted.length;
    if (!this.valid || !(confidence > 0 && confidence < 1)) return { valueAtRisk: NaN, expectedShortfall: NaN, tailBeyondSample: false };
    const mass = (1 - confidence) * this.totalWeight;
    const reach = mass * (1 - TAIL_MASS_TOLERANCE);
    const long = side === "long";
    let seen = 0;
    let sum = 0;
    let first = true;
    for (let step = 0; step < n; step++) {
      const i = long ? step : n - 1 - step;
      const w = this.weights[i];
      if (w === 0) continue;
      const loss = long ? -this.sorted[i] : this.sorted[i];
      if (seen + w >= reach) {
        sum += loss * (mass - seen);
        return { valueAtRisk: loss, expectedShortfall: sum / mass, tailBeyondSample: first && mass < w * (1 - TAIL_MASS_TOLERANCE) };
      }
      sum += loss * w;
      seen += w;
      first = false;
    }
    // Unreachable for a valid law (the walk covers the whole weight); kept total.
    return { valueAtRisk: NaN, expectedShortfall: NaN, tailBeyondSample: false };
  }

  valueAtRisk(confidence: number, side: RiskSide = "long"): number {
    return this.tail(confidence, side).valueAtRisk;
  }

  expectedShortfall(confidence: number, side: RiskSide = "long"): number {
    return this.tail(confidence, side).expectedShortfall;
  }

  /** F(x) = weight of the returns ≤ x over the total weight (right-continuous). */
  cdf(x: number): number {
    if (!this.valid || Number.isNaN(x)) return NaN;
    let lo = 0;
    let hi = this.sorted.length;
    while (lo < hi) {
      const mid = (lo + hi) >>> 1;
      if (this.sorted[mid] <= x) lo = mid + 1;
      else hi = mid;
    }
    return lo === 0 ? 0 : this.cumulative[lo - 1] / this.totalWeight;
  }
}

/** Historical-simulation VaR and ES of a sample (age-weighted when decay < 1). */
export function historicalTail(returns: ArrayLike<number>, confidence: number, side: RiskSide = "long", decay = 1): EmpiricalTail {
  const weights = decay === 1 ? null : ageWeights(returns.length, decay);
  return new EmpiricalLaw(returns, weights).tail(confidence, side);
}
