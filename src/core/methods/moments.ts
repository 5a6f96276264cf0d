/**
 * Moment-based VaR and ES: the normal law and the Cornish–Fisher adjustment, from a sample's mean, standard
 * deviation (n − 1 divisor), skewness S and excess kurtosis K (moment estimators g1, g2: src/core/fit/sampleStats).
 *
 * Normal: with p = 1 − c and z = Φ⁻¹(p), long VaR = −(μ + σz), ES = −μ + σφ(z)/p. The short side is the long
 * side of −X (μ → −μ, S → −S, K unchanged), so one formula serves both, here and for Cornish–Fisher.
 *
 * Cornish–Fisher (Cornish & Fisher 1937; for VaR, Zangari 1996, RiskMetrics Monitor Q2 1996 — formula from memory,
 * checked in the tests against the expansion written out and a published library's check values):
 *   g(z) = z + (z² − 1)S/6 + (z³ − 3z)K/24 − (2z³ − 5z)S²/36,   VaR = −(μ + σ·g(z)).
 *
 * Modified ES (Boudt, Peterson & Croux 2008, J. of Risk 11(2) — from memory, derived here and checked by
 * quadrature): the mean return below g under the second-order Edgeworth density whose quantile the expansion is,
 *   e(x) = φ(x)[1 + S·He3(x)/6 + K·He4(x)/24 + S²·He6(x)/72]   (He = probabilists' Hermite polynomials),
 * divided by p:  ES = −μ + σ·(φ(g)/p)·[1 + S g³/6 + K(g⁴ − 2g² − 1)/24 + S²(g⁶ − 9g⁴ + 9g² + 3)/72].
 * (∫_{−∞}^g x·He_n(x)φ(x)dx = −(He_n(g) + n·He_{n−2}(g))φ(g) from x·He_n = He_{n+1} + n·He_{n−1}.)
 * It approximates the tail average of the Cornish–Fisher quantile, (1/p)∫_0^p g(Φ⁻¹(u))du, and agrees with it to
 * first order in S and K; the two differ at second order (the tests measure by how much). At S = K = 0 both are
 * the normal ES. Far from normal (but inside the domain) the modified ES can fall below the VaR
 * (e.g. S = −0.8, K = 3 at 99%: 3.09σ against a VaR of 3.37σ; measured in the tests); it is then NaN with the
 * reason, never clamped.
 *
 * Domain of validity (Maillard 2012, "A user's guide to the Cornish Fisher expansion", SSRN 1997178): g is a
 * quantile function only where it is increasing. g′(z) = A z² + B z + C with A = K/8 − S²/6, B = S/3,
 * C = 1 − K/8 + 5S²/36 (derived here), so g is increasing on the whole line iff A ≥ 0 and B² ≤ 4AC (A = 0 needs
 * B = 0 and C > 0). Outside that domain the expansion is not a distribution: VaR, ES and CDF are NaN with a reason.
 * Note S and K here are the expansion's parameters; the law they define has other actual moments (Maillard).
 */
import { normalCdf, normalPdf, normalQuantile } from "../normal";
import type { RiskSide } from "../risk/measures/side";

export interface MomentSummary {
  readonly mean: number;
  /** Standard deviation (n − 1 divisor). */
  readonly sd: number;
  readonly skewness: number;
  readonly excessKurtosis: number;
}

/** The Cornish–Fisher transform g(z). */
export function cornishFisherZ(z: number, skewness: number, excessKurtosis: number): number {
  const S = skewness;
  const K = excessKurtosis;
  const z2 = z * z;
  return z + ((z2 - 1) * S) / 6 + ((z2 * z - 3 * z) * K) / 24 - ((2 * z2 * z - 5 * z) * S * S) / 36;
}

/** g′(z), the slope of the Cornish–Fisher transform. */
export function cornishFisherSlope(z: number, skewness: number, excessKurtosis: number): number {
  const A = excessKurtosis / 8 - (skewness * skewness) / 6;
  const B = skewness / 3;
  const C = 1 - excessKurtosis / 8 + (5 * skewness * skewness) / 36;
  return (A * z + B) * z + C;
}

/** Why (S, K) lies outside the domain where the expansion is increasing, or null when it lies inside. */
export function cornishFisherDomainProblem(skewness: number, excessKurtosis: number): string | null {
  const S = skewness;
  const K = excessKurtosis;
  if (!Number.isFinite(S) || !Number.isFinite(K)) return "skewness or excess kurtosis is not finite";
  const A = K / 8 - (S * S) / 6;
  const B = S / 3;
  const C = 1 - K / 8 + (5 * S * S) / 36;
  const at = `skewness ${S.toPrecision(3)} and excess kurtosis ${K.toPrecision(3)}`;
  if (A < 0) return `${at} make the expansion decrease in the far tails (it needs excess kurtosis ≥ 4/3·skewness², here ${((4 / 3) * S * S).toPrecision(3)})`;
  if (A === 0) return B === 0 && C > 0 ? null : `${at} make the expansion flat or decreasing somewhere`;
  if (B * B > 4 * A * C) return `${at} make the expansion decrease between two levels (outside its domain of validity)`;
  return null;
}

export interface MomentTail {
  readonly valueAtRisk: number;
  readonly expectedShortfall: number;
  /** Null when valid; else why VaR/ES are NaN. */
  readonly problem: string | null;
  /** Null when the ES is usable; else why ES alone is NaN (VaR stands). */
  readonly shortfallProblem: string | null;
}

function lossSide(m: MomentSummary, side: RiskSide): MomentSummary {
  return side === "short" ? { mean: -m.mean, sd: m.sd, skewness: -m.skewness, excessKurtosis: m.excessKurtosis } : m;
}

function usable(m: MomentSummary, confidence: number): string | null {
  if (!(confidence > 0 && confidence < 1)) return "confidence must lie strictly between 0 and 1";
  if (!Number.isFinite(m.mean) || !(m.sd > 0) || !Number.isFinite(m.sd)) return "the standard deviation is zero or not finite";
  return null;
}

/** Normal VaR and ES (positive losses) from mean and sd. */
export function normalTail(m: MomentSummary, confidence: number, side: RiskSide = "long"): MomentTail {
  const bad = usable(m, confidence);
  if (bad) return { valueAtRisk: NaN, expectedShortfall: NaN, problem: bad, shortfallProblem: bad };
  const q = lossSide(m, side);
  const p = 1 - confidence;
  const z = normalQuantile(p);
  return { valueAtRisk: -(q.mean + q.sd * z), expectedShortfall: -q.mean + (q.sd * normalPdf(z)) / p, problem: null, shortfallProblem: null };
}

/** Standardised modified-ES factor: E_e[−X·1{X ≤ g}]/p under the Edgeworth density e (positive in the left tail). */
export function modifiedShortfallFactor(g: number, p: number, skewness: number, excessKurtosis: number): number {
  const S = skewness;
  const K = excessKurtosis;
  const g2 = g * g;
  const g4 = g2 * g2;
  const bracket = 1 + (S * g2 * g) / 6 + (K * (g4 - 2 * g2 - 1)) / 24 + (S * S * (g4 * g2 - 9 * g4 + 9 * g2 + 3)) / 72;
  return (normalPdf(g) / p) * bracket;
}

/**
 * Exact tail average of the Cornish–Fisher quantile, (1/p)∫_0^p g(Φ⁻¹(u))du, standardised and as a positive loss:
 * the ES of the law X = μ + σ·g(Z) itself (a law wherever g is increasing). With g written in Hermite polynomials,
 * g = Z + S·He2/6 + K·He3/24 − S²(2He3 + Z)/36, and ∫_{−∞}^z He_n φ = −He_{n−1}(z)φ(z):
 *   (φ(z)/p)·[1 + S z/6 + K(z² − 1)/24 − S²(2z² − 1)/36],  z = Φ⁻¹(p).
 * Never below the VaR −g(z) inside the domain. Offered beside the modified ES (which approximates it) for
 * comparison; the cell functions and the "cf" model report the modified ES, as the trade does.
 */
export function cornishFisherLawShortfallFactor(p: number, skewness: number, excessKurtosis: number): number {
  const z = normalQuantile(p);
  const S = skewness;
  const z2 = z * z;
  return (normalPdf(z) / p) * (1 + (S * z) / 6 + (excessKurtosis * (z2 - 1)) / 24 - (S * S * (2 * z2 - 1)) / 36);
}

/** Cornish–Fisher VaR and modified ES (positive losses); NaN with a reason outside the domain of validity. */
export function cornishFisherTail(m: MomentSummary, confidence: number, side: RiskSide = "long"): MomentTail {
  const bad = usable(m, confidence);
  if (bad) return { valueAtRisk: NaN, expectedShortfall: NaN, problem: bad, shortfallProblem: bad };
  const q = lossSide(m, side);
  const problem = cornishFisherDomainProblem(q.skewness, q.excessKurtosis);
  if (problem) return { valueAtRisk: NaN, expectedShortfall: NaN, problem, shortfallProblem: problem };
  const p = 1 - confidence;
  const g = cornishFisherZ(normalQuantile(p), q.skewness, q.excessKurtosis);
  const factor = modifiedShortfallFactor(g, p, q.skewness, q.excessKurtosis);
  // ES of a law can never be below its VaR; the modified ES can (the Edgeworth density is not a law: it may turn
  // negative, and its mass below g is only approximately p). Such an ES is not a shortfall: NaN with the reason.
  const belowVar = factor < -g;
  return {
    valueAtRisk: -(q.mean + q.sd * g),
    expectedShortfall: belowVar ? NaN : -q.mean + q.sd * factor,
    problem: null,
    shortfallProblem: belowVar
      ? `the modified ES (${factor.toPrecision(4)} standard deviations) falls below the VaR (${(-g).toPrecision(4)}): the expansion's tail approximation breaks down at these skewness and kurtosis values`
      : null,
  };
}

/**
 * CDF of the Cornish–Fisher law at x: Φ(z) where g(z) = (x − μ)/σ, solved by bisection on a bracket (g is
 * increasing inside the domain). NaN outside the domain.
 */
export function cornishFisherCdf(x: number, m: MomentSummary): number {
  if (Number.isNaN(x) || usable(m, 0.5) || cornishFisherDomainProblem(m.skewness, m.excessKurtosis)) return NaN;
  const y = (x - m.mean) / m.sd;
  if (y === Infinity) return 1;
  if (y === -Infinity) return 0;
  const g = (z: number) => cornishFisherZ(z, m.skewness, m.excessKurtosis);
  let lo = -1;
  let hi = 1;
  while (g(lo) > y && lo > -1e6) lo *= 2;
  while (g(hi) < y && hi < 1e6) hi *= 2;
  if (g(lo) > y) return 0;
  if (g(hi) < y) return 1;
  for (let i = 0; i < 200 && hi - lo > 1e-15 * Math.max(1, Math.abs(lo)); i++) {
    const mid = 0.5 * (lo + hi);
    if (g(mid) < y) lo = mid;
    else hi = mid;
  }
  return normalCdf(0.5 * (lo + hi));
}
