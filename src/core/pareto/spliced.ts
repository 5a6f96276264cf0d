/**
 * The generalized normal law with generalized Pareto tails spliced on beyond thresholds (peaks over threshold on
 * top of a parametric body; McNeil & Frey 2000 use the same construction on filtered residuals).
 *
 * Body: GNO(ξ₀, α, k) with CDF F_b. Lower tail beyond a return threshold u_L with GPD(ξ_L, β_L), upper tail
 * beyond u_U > u_L with GPD(ξ_U, β_U); either may be absent. Each tail takes over the body's own mass beyond its
 * threshold, p_L = F_b(u_L) and p_U = 1 − F_b(u_U), so the CDF is continuous:
 *   F(x) = p_L·S_L(u_L − x)           for x < u_L,
 *   F(x) = F_b(x)                      for u_L ≤ x ≤ u_U,
 *   F(x) = 1 − p_U·S_U(x − u_U)        for x > u_U.
 * The density jumps at a threshold (body density there against p_L·g_L(0) = p_L/β_L); the CDF does not.
 *
 * Risk in Askew's convention (returns; a long position loses when returns fall; positive losses). For a
 * confidence c with tail probability a = 1 − c ≤ p_L, the VaR lies in the lower tail:
 *   VaR = −u_L + y_a,  y_a = β_L·expm1(−ξ_L ln(a/p_L))/ξ_L,
 *   ES  = VaR + E[Y − y_a | Y > y_a] = VaR + (β_L + ξ_L·y_a)/(1 − ξ_L) = (VaR + β_L + ξ_L·u_L)/(1 − ξ_L),
 * i.e. the familiar (VaR + β − ξu)/(1 − ξ) with the loss threshold u = −u_L (derived here from the GPD's linear
 * mean excess; tested against numerical integration). ES is infinite for ξ_L ≥ 1. When a > p_L the VaR lies
 * in the body (or beyond u_U) and ES = −E[X; X ≤ q_a]/a with the partial expectation assembled in closed form:
 * the lower tail's p_L·(u_L − β_L/(1 − ξ_L)), the body's lognormal-type partial expectation (tailMeanFactor of
 * risk/measures/tail.ts) and the upper tail's limited mean. The short side is the long side of −X, which is the
 * spliced law with the body reflected and the tails swapped.
 */
import { cdf as gnoCdf, edge as gnoEdge, isValidParams, pdf as gnoPdf, quantile as gnoQuantile, quantileUpper as gnoQuantileUpper, reducedVariate, sf as gnoSf, type GnoParams } from "../gno";
import { reducedQuantile } from "../gno/reduced";
import { normalCdf } from "../normal";
import { uniformStream } from "../random";
import { gaussLegendre } from "../risk/measures/gaussLegendre";
import type { RiskSide } from "../risk/measures/side";
import { reflect, tailMeanFactor } from "../risk/measures/tail";
import { gpdLimitedMean, gpdMeanExcess, gpdPdf, gpdQuantileUpper, gpdRawMoment, gpdSf, gpdUpperEnd, isValidGpd, type GpdParams } from "./gpd";

/** A generalized Pareto tail beyond a return threshold. */
export interface TailPiece {
  /** The return beyond which the tail takes over (u_L for the lower tail, u_U for the upper). */
  readonly threshold: number;
  /** ξ. */
  readonly shape: number;
  /** β > 0. */
  readonly scale: number;
}

/** The body with a tail on neither, one or both sides. */
export interface SplicedParams {
  readonly body: GnoParams;
  readonly lower: TailPiece | null;
  readonly upper: TailPiece | null;
}

const gpdOf = (t: TailPiece): GpdParams => ({ shape: t.shape, scale: t.scale });

/** p_L = F_b(u_L), the mass the lower tail carries (0 without a lower tail). */
export function lowerTailMass(p: SplicedParams): number {
  return p.lower ? gnoCdf(p.lower.threshold, p.body) : 0;
}

/** p_U = 1 − F_b(u_U), the mass the upper tail carries (0 without an upper tail). */
export function upperTailMass(p: SplicedParams): number {
  return p.upper ? gnoSf(p.upper.threshold, p.body) : 0;
}

function validPiece(t: TailPiece | null): boolean {
  return t === null || (Number.isFinite(t.threshold) && isValidGpd(gpdOf(t)));
}

/**
 * Valid when the body is, each tail has a finite threshold, finite ξ and β > 0, each tail's mass lies strictly
 * inside (0, 1) (its threshold lies inside the body's support) and u_L < u_U.
 */
export function isValidSpliced(p: SplicedParams): boolean {
  if (!isValidParams(p.body) || !validPiece(p.lower) || !validPiece(p.upper)) return false;
  if (p.lower) {
    const m = lowerTailMass(p);
    if (!(m > 0 && m < 1)) return false;
  }
  if (p.upper) {
    const m = upperTailMass(p);
    if (!(m > 0 && m < 1)) return false;
  }
  return !(p.lower && p.upper && !(p.lower.threshold < p.upper.threshold));
}

/** Why params are not valid (for messages), or null. */
export function splicedProblem(p: SplicedParams): string | null {
  if (!isValidParams(p.body)) return "the body's scale must be greater than 0";
  for (const [name, t] of [["lower", p.lower], ["upper", p.upper]] as const) {
    if (!t) continue;
    if (!validPiece(t)) return `the ${name} tail needs a finite threshold and ξ and a β greater than 0`;
    const m = name === "lower" ? lowerTailMass(p) : upperTailMass(p);
    if (!(m > 0 && m < 1)) return `the ${name} tail's threshold ${t.threshold} lies outside the body's support (tail mass ${m})`;
  }
  if (p.lower && p.upper && !(p.lower.threshold < p.upper.threshold)) return "the lower threshold must lie below the upper threshold";
  return null;
}

/** The law of −X: body reflected, tails swapped and their thresholds negated. */
export function reflectSpliced(p: SplicedParams): SplicedParams {
  const flip = (t: TailPiece | null): TailPiece | null => (t ? { threshold: -t.threshold, shape: t.shape, scale: t.scale } : null);
  return { body: reflect(p.body), lower: flip(p.upper), upper: flip(p.lower) };
}

/** F(x). */
export function splicedCdf(x: number, p: SplicedParams): number {
  if (!isValidSpliced(p) || Number.isNaN(x)) return NaN;
  if (p.lower && x < p.lower.threshold) return lowerTailMass(p) * gpdSf(p.lower.threshold - x, gpdOf(p.lower));
  if (p.upper && x > p.upper.threshold) return 1 - upperTailMass(p) * gpdSf(x - p.upper.threshold, gpdOf(p.upper));
  return gnoCdf(x, p.body);
}

/** 1 − F(x), never formed as a difference in the upper tail. */
export function splicedSf(x: number, p: SplicedParams): number {
  if (!isValidSpliced(p) || Number.isNaN(x)) return NaN;
  if (p.lower && x < p.lower.threshold) return 1 - lowerTailMass(p) * gpdSf(p.lower.threshold - x, gpdOf(p.lower));
  if (p.upper && x > p.upper.threshold) return upperTailMass(p) * gpdSf(x - p.upper.threshold, gpdOf(p.upper));
  return gnoSf(x, p.body);
}

/** Density f(x) (the body's at a threshold itself). */
export function splicedPdf(x: number, p: SplicedParams): number {
  if (!isValidSpliced(p) || Number.isNaN(x)) return NaN;
  if (p.lower && x < p.lower.threshold) return lowerTailMass(p) * gpdPdf(p.lower.threshold - x, gpdOf(p.lower));
  if (p.upper && x > p.upper.threshold) return upperTailMass(p) * gpdPdf(x - p.upper.threshold, gpdOf(p.upper));
  return gnoPdf(x, p.body);
}

/** Quantile at probability prob ∈ [0, 1]. */
export function splicedQuantile(prob: number, p: SplicedParams): number {
  if (!isValidSpliced(p) || !(prob >= 0 && prob <= 1)) return NaN;
  const pl = lowerTailMass(p);
  const pu = upperTailMass(p);
  if (p.lower && prob <= pl) return p.lower.threshold - gpdQuantileUpper(prob / pl, gpdOf(p.lower));
  if (p.upper && prob >= 1 - pu) return p.upper.threshold + gpdQuantileUpper((1 - prob) / pu, gpdOf(p.upper));
  return gnoQuantile(prob, p.body);
}

/** Quantile at 1 − q without forming 1 − q (full accuracy for tiny upper-tail probabilities q). */
export function splicedQuantileUpper(q: number, p: SplicedParams): number {
  if (!isValidSpliced(p) || !(q >= 0 && q <= 1)) return NaN;
  const pu = upperTailMass(p);
  const pl = lowerTailMass(p);
  if (p.upper && q <= pu) return p.upper.threshold + gpdQuantileUpper(q / pu, gpdOf(p.upper));
  if (p.lower && q >= 1 - pl) return p.lower.threshold - gpdQuantileUpper((1 - q) / pl, gpdOf(p.lower));
  return gnoQuantileUpper(q, p.body);
}

/** E[X; X ≤ v] under the body alone: Φ(y)·ξ₀ − α·B(y, k) (lognormal-type partial expectation). */
function bodyPartial(v: number, b: GnoParams): number {
  const y = reducedVariate(v, b);
  const prob = normalCdf(y);
  if (prob === 0) return 0;
  return prob * b.location - b.scale * tailMeanFactor(y, b.shape, prob);
}

/** E[X; X ≤ x] of the spliced law (−Infinity when the lower tail has ξ_L ≥ 1). */
export function splicedPartialExpectation(x: number, p: SplicedParams): number {
  if (!isValidSpliced(p) || Number.isNaN(x)) return NaN;
  let total = 0;
  let from = -Infinity;
  if (p.lower) {
    const g = gpdOf(p.lower);
    const u = p.lower.threshold;
    const pl = lowerTailMass(p);
    if (x <= u) {
      const y0 = u - x;
      const mass = pl * gpdSf(y0, g);
      if (mass === 0) return 0;
      return mass * (x - gpdMeanExcess(y0, g));
    }
    total += pl * (u - gpdMeanExcess(0, g));
    from = u;
  }
  const to = p.upper ? Math.min(x, p.upper.threshold) : x;
  total += bodyPartial(to, p.body) - (from === -Infinity ? 0 : bodyPartial(from, p.body));
  if (p.upper && x > p.upper.threshold) {
    const g = gpdOf(p.upper);
    const u = p.upper.threshold;
    const pu = upperTailMass(p);
    const y1 = x - u;
    const s = gpdSf(y1, g);
    total += u * pu * (1 - s) + pu * (gpdLimitedMean(y1, g) - y1 * s);
  }
  return total;
}

function lossSide(p: SplicedParams, side: RiskSide): SplicedParams {
  return side === "short" ? reflectSpliced(p) : p;
}

/** VaR at confidence c for a side, a positive loss. */
export function splicedValueAtRisk(confidence: number, p: SplicedParams, side: RiskSide = "long"): number {
  if (!(confidence > 0 && confidence < 1) || !isValidSpliced(p)) return NaN;
  return -splicedQuantile(1 - confidence, lossSide(p, side));
}

/**
 * Expected shortfall at confidence c for a side, a positive loss; Infinity when the loss tail has ξ ≥ 1 (it
 * does not exist), NaN for invalid input.
 */
export function splicedExpectedShortfall(confidence: number, p: SplicedParams, side: RiskSide = "long"): number {
  if (!(confidence > 0 && confidence < 1) || !isValidSpliced(p)) return NaN;
  const law = lossSide(p, side);
  const a = 1 - confidence;
  if (law.lower && a <= lowerTailMass(law)) {
    const { threshold: u, shape: xi, scale: beta } = law.lower;
    if (xi >= 1) return Infinity;
    const valueAtRisk = -splicedQuantile(a, law);
    return (valueAtRisk + beta + xi * u) / (1 - xi);
  }
  return -splicedPartialExpectation(splicedQuantile(a, law), law) / a;
}

/** The ends of the support: the lower and upper edge (±Infinity when unbounded). */
export function splicedEdges(p: SplicedParams): { lower: number; upper: number } {
  if (!isValidSpliced(p)) return { lower: NaN, upper: NaN };
  const e = gnoEdge(p.body);
  const lower = p.lower ? p.lower.threshold - gpdUpperEnd(gpdOf(p.lower)) : e && e.side === "lower" ? e.value : -Infinity;
  const upper = p.upper ? p.upper.threshold + gpdUpperEnd(gpdOf(p.upper)) : e && e.side === "upper" ? e.value : Infinity;
  return { lower, upper };
}

/** n seeded draws by inversion of the spliced CDF (shared uniform stream of src/core/random.ts). */
export function splicedSample(p: SplicedParams, n: number, seed: number): Float64Array {
  const count = Number.isFinite(n) && n > 0 ? Math.floor(n) : 0;
  const out = new Float64Array(count);
  if (!isValidSpliced(p)) return out.fill(NaN);
  const next = uniformStream(seed);
  for (let i = 0; i < count; i++) out[i] = splicedQuantile(next(), p);
  return out;
}

/** Mean, sd, skewness, excess kurtosis; a field is NaN when that moment does not exist (see `order`). */
export interface SplicedMoments {
  readonly mean: number;
  readonly sd: number;
  readonly skewness: number;
  readonly excessKurtosis: number;
  /** Highest moment order (0–4) that exists: r exists when every tail has ξ < 1/r. */
  readonly order: number;
}

const RULE = gaussLegendre(16);
const PANEL = 0.25;

/** E[(X − c)^r; body region] for r = 1…4 by Gauss–Legendre panels in the reduced variate z. */
function bodyRawMoments(p: SplicedParams, c: number): number[] {
  const b = p.body;
  const reach = 38 + 4 * Math.abs(b.shape);
  const zLo = p.lower ? Math.max(reducedVariate(p.lower.threshold, b), -reach) : -reach;
  const zHi = p.upper ? Math.min(reducedVariate(p.upper.threshold, b), reach) : reach;
  const m = [0, 0, 0, 0];
  if (!(zHi > zLo)) return m;
  const panels = Math.max(1, Math.ceil((zHi - zLo) / PANEL));
  const h = (zHi - zLo) / panels;
  const shift = (b.location - c) / b.scale;
  for (let j = 0; j < panels; j++) {
    const a = zLo + j * h;
    for (let i = 0; i < RULE.nodes.length; i++) {
      const z = a + (h / 2) * (1 + RULE.nodes[i]);
      const w = (RULE.weights[i] * h * Math.exp(-0.5 * z * z)) / (2 * Math.sqrt(2 * Math.PI));
      const d = b.scale * (shift + reducedQuantile(z, b.shape));
      m[0] += w * d;
      m[1] += w * d * d;
      m[2] += w * d * d * d;
      m[3] += w * d * d * d * d;
    }
  }
  return m;
}

const BINOMIAL = [[1], [1, 1], [1, 2, 1], [1, 3, 3, 1], [1, 4, 6, 4, 1]];

/** E[(s·(u − c) + ... )]: contribution of a tail X = u + σ·Y (σ = −1 lower, +1 upper) with mass w. */
function tailRawMoments(t: TailPiece, sign: number, mass: number, c: number): number[] {
  const g = gpdOf(t);
  const d = t.threshold - c;
  const out = [0, 0, 0, 0];
  for (let r = 1; r <= 4; r++) {
    let s = 0;
    for (let j = 0; j <= r; j++) s += BINOMIAL[r][j] * Math.pow(d, r - j) * Math.pow(sign, j) * (j === 0 ? 1 : gpdRawMoment(j, g));
    out[r - 1] = mass * s;
  }
  return out;
}

/** Moments of the spliced law (about the body's location first, for accuracy). */
export function splicedMoments(p: SplicedParams): SplicedMoments {
  const none = { mean: NaN, sd: NaN, skewness: NaN, excessKurtosis: NaN, order: 0 };
  if (!isValidSpliced(p)) return Object.freeze(none);
  let order = 4;
  for (const t of [p.lower, p.upper]) {
    if (!t) continue;
    while (order > 0 && t.shape * order >= 1) order--;
  }
  const c = p.body.location;
  const m = bodyRawMoments(p, c);
  if (p.lower) tailRawMoments(p.lower, -1, lowerTailMass(p), c).forEach((v, i) => (m[i] += v));
  if (p.upper) tailRawMoments(p.upper, 1, upperTailMass(p), c).forEach((v, i) => (m[i] += v));
  const [m1, m2, m3, m4] = m;
  const v = m2 - m1 * m1;
  const mu3 = m3 - 3 * m1 * m2 + 2 * m1 * m1 * m1;
  const mu4 = m4 - 4 * m1 * m3 + 6 * m1 * m1 * m2 - 3 * m1 * m1 * m1 * m1;
  return Object.freeze({
    mean: order >= 1 ? c + m1 : NaN,
    sd: order >= 2 ? Math.sqrt(v) : NaN,
    skewness: order >= 3 ? mu3 / Math.pow(v, 1.5) : NaN,
    excessKurtosis: order >= 4 ? mu4 / (v * v) - 3 : NaN,
    order,
  });
}

/**
 * The law of μ + σ·Z when Z has the spliced law p (σ > 0): body GNO(μ + σξ₀, σα, k), thresholds μ + σu,
 * tail scales σβ, tail shapes unchanged (a filtered model's next-day law from its standardized residuals).
 */
export function scaleSpliced(p: SplicedParams, mu: number, sigma: number): SplicedParams {
  const t = (x: TailPiece | null): TailPiece | null => (x ? { threshold: mu + sigma * x.threshold, shape: x.shape, scale: sigma * x.scale } : null);
  return { body: { location: mu + sigma * p.body.location, scale: sigma * p.body.scale, shape: p.body.shape }, lower: t(p.lower), upper: t(p.upper) };
}

/** The 9 cells: location, scale, shape, u_L, ξ_L, β_L, u_U, ξ_U, β_U (NaN for an absent side). */
export function splicedCells(p: SplicedParams): number[] {
  const side = (t: TailPiece | null): number[] => (t ? [t.threshold, t.shape, t.scale] : [NaN, NaN, NaN]);
  return [p.body.location, p.body.scale, p.body.shape, ...side(p.lower), ...side(p.upper)];
}

/** Spliced params from 9 numbers; a side whose three numbers are all NaN is absent. */
export function splicedFromCells(cells: ArrayLike<number>): SplicedParams {
  const side = (i: number): TailPiece | null =>
    Number.isNaN(cells[i]) && Number.isNaN(cells[i + 1]) && Number.isNaN(cells[i + 2]) ? null : { threshold: cells[i], shape: cells[i + 1], scale: cells[i + 2] };
  return { body: { location: cells[0], scale: cells[1], shape: cells[2] }, lower: side(3), upper: side(6) };
}
