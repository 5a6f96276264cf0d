/**
 * Delta-method confidence interval for the VaR of a fitted generalized normal law.
 *
 * The quantile x(F) = ξ + α(1 − e^{−kz})/k, z = Φ⁻¹(F) (Hosking 1996), has the gradient (with u = −kz)
 *   ∂x/∂ξ = 1,
 *   ∂x/∂α = (1 − e^{−kz})/k = z·expm1(u)/u                       (→ z at k = 0),
 *   ∂x/∂k = α[kz e^{−kz} − (1 − e^{−kz})]/k² = α z² (expm1(u) − u e^u)/u²   (→ −α z²/2 at k = 0),
 * where S(u) = (expm1(u) − u e^u)/u² = Σ_{n≥2} (1 − n) u^{n−2}/n! is summed as a series for |u| < 0.1.
 * The profile interval (varProfile.ts) also needs the second shape derivative of the reduced quantile
 * g(z, k) = (x − ξ)/α: ∂g/∂k = z² S(u) and ∂²g/∂k² = −z³ S′(u), with
 *   S′(u) = (e^u (2u − u²) − 2 expm1(u))/u³ = Σ_{n≥3} (1 − n)(n − 2) u^{n−3}/n!   (→ −1/3 at u = 0),
 * summed as a series for |u| < 0.5 (the closed form loses about 6ε/u² relative to cancellation).
 * Var(VaR) ≈ gᵀ Σ g with Σ the fit's covariance of (location, scale, shape) (delta method, e.g. Casella &
 * Berger 2002, §5.5.4); the interval is VaR ± z_{(1+level)/2}·√(gᵀ Σ g).
 */
import { isValidParams, type GnoParams } from "../../gno";
import { normalQuantile } from "../../normal";
import type { RiskSide } from "../measures/side";
import { valueAtRisk } from "../measures/tail";

const SERIES_BELOW = 0.1;

/** (expm1(u) − u·e^u)/u², −1/2 at u = 0. */
function shapeSlopeFactor(u: number): number {
  if (Math.abs(u) >= SERIES_BELOW) return (Math.expm1(u) - u * Math.exp(u)) / (u * u);
  let term = 1; // u^{n−2}/n! without the 1/n! yet
  let factorial = 2;
  let sum = 0;
  for (let n = 2; n <= 14; n++) {
    if (n > 2) {
      term *= u;
      factorial *= n;
    }
    sum += ((1 - n) * term) / factorial;
  }
  return sum;
}

/** S′(u) = d/du (expm1(u) − u·e^u)/u², −1/3 at u = 0. */
function shapeSlopeFactorSlope(u: number): number {
  if (Math.abs(u) >= 0.5) return (Math.exp(u) * (2 * u - u * u) - 2 * Math.expm1(u)) / (u * u * u);
  let power = 1; // u^{n−3}
  let factorial = 6;
  let sum = 0;
  for (let n = 3; n <= 24; n++) {
    if (n > 3) {
      power *= u;
      factorial *= n;
    }
    sum += ((1 - n) * (n - 2) * power) / factorial;
  }
  return sum;
}

/**
 * First and second derivatives in k of the reduced quantile g(z, k) = −expm1(−kz)/k (gno/reducedQuantile):
 * [z² S(u), −z³ S′(u)] with u = −kz; [−z²/2, z³/3] at k = 0.
 */
export function reducedQuantileShapeDerivatives(z: number, k: number): [number, number] {
  const u = -k * z;
  return [z * z * shapeSlopeFactor(u), -z * z * z * shapeSlopeFactorSlope(u)];
}

/** Gradient of the quantile x(F) with respect to (location, scale, shape). */
export function quantileGradient(prob: number, p: GnoParams): [number, number, number] {
  if (!(prob > 0 && prob < 1) || !isValidParams(p)) return [NaN, NaN, NaN];
  const z = normalQuantile(prob);
  const u = -p.shape * z;
  const dScale = u === 0 ? z : (z * Math.expm1(u)) / u;
  const dShape = p.scale * reducedQuantileShapeDerivatives(z, p.shape)[0];
  return [1, dScale, dShape];
}

/** Gradient of the VaR (positive loss) with respect to (location, scale, shape). */
export function valueAtRiskGradient(confidence: number, p: GnoParams, side: RiskSide = "long"): [number, number, number] {
  if (!(confidence > 0 && confidence < 1)) return [NaN, NaN, NaN];
  if (side === "short") return quantileGradient(confidence, p);
  const g = quantileGradient(1 - confidence, p);
  return [-g[0], -g[1], -g[2]];
}

export interface VarInterval {
  readonly confidence: number;
  readonly side: RiskSide;
  readonly level: number;
  readonly valueAtRisk: number;
  readonly standardError: number;
  readonly lower: number;
  readonly upper: number;
  readonly gradient: readonly [number, number, number];
}

/**
 * Delta-method interval for the VaR of GNO(params) given the 3×3 covariance of the estimates. Fields are NaN
 * when the inputs are invalid or the covariance gives a negative variance.
 */
export function varInterval(
  params: GnoParams,
  covariance: readonly (readonly number[])[],
  confidence: number,
  side: RiskSide = "long",
  level = 0.95,
): VarInterval {
  const g = valueAtRiskGradient(confidence, params, side);
  let variance = 0;
  for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) variance += g[i] * (covariance[i]?.[j] ?? NaN) * g[j];
  const ok = level > 0 && level < 1 && variance >= 0;
  const se = ok ? Math.sqrt(variance) : NaN;
  const half = ok ? normalQuantile((1 + level) / 2) * se : NaN;
  const v = valueAtRisk(confidence, params, side);
  return Object.freeze({
    confidence,
    side,
    level,
    valueAtRisk: v,
    standardError: se,
    lower: v - half,
    upper: v + half,
    gradient: Object.freeze(g) as readonly [number, number, number],
  });
}
