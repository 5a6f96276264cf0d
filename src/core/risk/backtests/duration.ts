/**
 * Christoffersen & Pelletier (2004), "Backtesting value-at-risk: a duration-based approach", J. Financial
 * Econometrics 2:84–108: under correct VaR the days between exceptions are memoryless (geometric, in continuous
 * form exponential); clustered exceptions give a decreasing hazard. The durations are fitted by a Weibull law,
 * f(d) = a^b b d^{b−1} exp(−(a d)^b), S(d) = exp(−(a d)^b), and b = 1 (exponential) is tested by LR ~ χ²₁.
 *
 * Durations: with exceptions on days t₁ < … < t_K of T (1-based), the complete durations are tᵢ − tᵢ₋₁; when the
 * series does not start with an exception, the first spell t₁ is censored (it enters through S), and when it
 * does not end with one, the last spell T − t_K is censored too.
 * Likelihood: ℓ(a, b) = n_u(b ln a + ln b) + (b − 1) Σ_U ln d − a^b Σ_all d^b, where U are the n_u complete
 * durations. For fixed b, a^b = n_u / Σ_all d^b, so the profile is
 *   ℓ(b) = n_u ln(n_u / Σ d^b) + n_u ln b + (b − 1) Σ_U ln d − n_u,
 * maximised over b ∈ [0.01, 100] by golden-section search on ln b (which assumes a single maximum; the tests
 * compare the result with Nelder–Mead on the full two-parameter likelihood).
 *
 * Small-sample caution (from the paper, from memory): with the usual one or two years of daily data there are
 * few exceptions, the χ²₁ p-value is unreliable and the authors use Monte Carlo p-values; read this row as
 * supporting evidence only. Not informative with fewer than 2 complete durations.
 */
import { chiSquare1Sf } from "./chiSquare";

export interface DurationTest {
  /** Complete (uncensored) durations. */
  readonly durations: number;
  /** Weibull shape b̂ (1 under H0; below 1 = clustering); NaN when not informative. */
  readonly shape: number;
  readonly statistic: number;
  readonly pValue: number;
  readonly informative: boolean;
}

interface Spell {
  readonly d: number;
  readonly censored: boolean;
}

/** The spells of a 0/1 exception sequence (see the header). */
export function durationSpells(hits: ArrayLike<boolean>): Spell[] {
  const days: number[] = [];
  for (let i = 0; i < hits.length; i++) if (hits[i]) days.push(i + 1);
  const spells: Spell[] = [];
  if (days.length === 0) return spells;
  if (days[0] > 1) spells.push({ d: days[0], censored: true });
  for (let i = 1; i < days.length; i++) spells.push({ d: days[i] - days[i - 1], censored: false });
  const T = hits.length;
  if (days[days.length - 1] < T) spells.push({ d: T - days[days.length - 1], censored: true });
  return spells;
}

/** Weibull profile log-likelihood ℓ(b) of the spells. */
export function weibullProfile(spells: readonly Spell[], b: number): number {
  let nu = 0;
  let sumLog = 0;
  let sumPow = 0;
  for (const s of spells) {
    sumPow += Math.pow(s.d, b);
    if (!s.censored) {
      nu++;
      sumLog += Math.log(s.d);
    }
  }
  return nu * Math.log(nu / sumPow) + nu * Math.log(b) + (b - 1) * sumLog - nu;
}

const GOLDEN = (Math.sqrt(5) - 1) / 2;

/** The duration test of an exception sequence. */
export function durationTest(hits: ArrayLike<boolean>): DurationTest {
  const spells = durationSpells(hits);
  const complete = spells.filter((s) => !s.censored).length;
  if (complete < 2) return Object.freeze({ durations: complete, shape: NaN, statistic: NaN, pValue: NaN, informative: false });
  let lo = Math.log(0.01);
  let hi = Math.log(100);
  const f = (x: number) => weibullProfile(spells, Math.exp(x));
  let x1 = hi - GOLDEN * (hi - lo);
  let x2 = lo + GOLDEN * (hi - lo);
  let f1 = f(x1);
  let f2 = f(x2);
  while (hi - lo > 1e-9) {
    if (f1 < f2) {
      lo = x1;
      x1 = x2;
      f1 = f2;
      x2 = lo + GOLDEN * (hi - lo);
      f2 = f(x2);
    } else {
      hi = x2;
      x2 = x1;
      f2 = f1;
      x1 = hi - GOLDEN * (hi - lo);
      f1 = f(x1);
    }
  }
  const bHat = Math.exp((lo + hi) / 2);
  const statistic = Math.max(0, 2 * (Math.max(f(Math.log(bHat)), f1, f2) - weibullProfile(spells, 1)));
  return Object.freeze({ durations: complete, shape: bHat, statistic, pValue: chiSquare1Sf(statistic), informative: true });
}
