/**
 * Value at risk and expected shortfall of the generalized normal law (GNO; Hosking 1996), reported as
 * positive losses.
 *
 * With p = 1 − c and z = Φ⁻¹(p):
 *   long  (left tail of returns):  VaR = −Q(p),   ES = −E[X | X ≤ Q(p)]
 *   short (right tail of returns): VaR =  Q(c),   ES =  E[X | X ≥ Q(c)]
 * The short side is the long side of −X, which is GNO(−ξ, α, −k), so one formula serves both.
 *
 * Closed form (lognormal partial expectation, written for the GNO: E[e^{−kZ} 1{Z ≤ z}] = e^{k²/2} Φ(z + k)):
 *   E[X | X ≤ Q(p)] = ξ + (α/k)(1 − e^{k²/2} Φ(z + k)/p) = ξ − α·B(z, k)/p,
 *   B(z, k) = (e^{k²/2} Φ(z + k) − Φ(z))/k  →  φ(z) as k → 0 (the normal ES).
 * B is evaluated without cancellation near k = 0 as
 *   B = (expm1(k²/2)/k)·Φ(z + k) + (1/k)∫_z^{z+k} φ(t) dt,
 * the last term by 16-point Gauss–Legendre quadrature (φ is entire, the interval is at most 1 long), and
 * for |k| > 1, where no cancellation threatens, directly as (exp(k²/2 + ln Φ(z + k)) − p)/k.
 *
 * When the law has an edge on the loss side (k < 0 for long, k > 0 for short) losses cannot exceed it: the
 * result carries that cap. VaR may be negative (a gain) at low confidence; it is returned as is.
 * Total: NaN for invalid parameters or c outside (0, 1).
 */
import { edge, isValidParams, quantile, quantileUpper, type GnoParams } from "../../gno";
import { logNormalCdf, normalCdf, normalPdf, normalQuantile } from "../../normal";
import { gaussLegendre } from "./gaussLegendre";
import type { RiskSide } from "./side";

const RULE = gaussLegendre(16);
const DIRECT_ABOVE = 1;

/** Mean of φ over the interval from a to a + h (h may be negative). */
function meanDensity(a: number, h: number): number {
  let s = 0;
  const half = h / 2;
  for (let i = 0; i < RULE.nodes.length; i++) s += RULE.weights[i] * normalPdf(a + half * (1 + RULE.nodes[i]));
  return s / 2;
}

/** B(z, k) = (e^{k²/2} Φ(z + k) − p)/k with p = Φ(z), stable for every k; φ(z) at k = 0. */
export function tailMeanFactor(z: number, k: number, p: number): number {
  if (Math.abs(k) > DIRECT_ABOVE) return (Math.exp((k * k) / 2 + logNormalCdf(z + k)) - p) / k;
  const growth = k === 0 ? 0 : Math.expm1((k * k) / 2) / k;
  return growth * normalCdf(z + k) + meanDensity(z, k);
}

/** Parameters of −X when X ~ GNO(ξ, α, k). */
export function reflect(p: GnoParams): GnoParams {
  return { location: -p.location, scale: p.scale, shape: -p.shape };
}

function lossSideParams(p: GnoParams, side: RiskSide): GnoParams {
  return side === "short" ? reflect(p) : p;
}

/** VaR at confidence c as a positive loss. */
export function valueAtRisk(confidence: number, p: GnoParams, side: RiskSide = "long"): number {
  if (!(confidence > 0 && confidence < 1) || !isValidParams(p)) return NaN;
  const q = lossSideParams(p, side);
  // below ½ the tail probability 1 − c loses c's digits (1 − 1e-300 rounds to 1): take the quantile at 1 − c directly
  return confidence < 0.5 ? -quantileUpper(confidence, q) : -quantile(1 - confidence, q);
}

/** Expected shortfall at confidence c as a positive loss (mean loss beyond the VaR). */
export function expectedShortfall(confidence: number, p: GnoParams, side: RiskSide = "long"): number {
  if (!(confidence > 0 && confidence < 1) || !isValidParams(p)) return NaN;
  const q = lossSideParams(p, side);
  const tail = 1 - confidence;
  const z = normalQuantile(tail);
  return -q.location + (q.scale * tailMeanFactor(z, q.shape, tail)) / tail;
}

export interface TailRisk {
  readonly confidence: number;
  readonly side: RiskSide;
  /** Probability of a loss beyond the VaR, 1 − confidence. */
  readonly tailProbability: number;
  readonly valueAtRisk: number;
  readonly expectedShortfall: number;
  /** Largest possible loss when the law has an edge on the loss side, else null. */
  readonly lossCap: number | null;
  /** True when the law's edge bounds the losses (VaR and ES can never exceed lossCap). */
  readonly cappedByEdge: boolean;
}

/** VaR, ES and the loss cap in one read-only object. */
export function tailRisk(confidence: number, p: GnoParams, side: RiskSide = "long"): TailRisk {
  const q = lossSideParams(p, side);
  const e = isValidParams(q) ? edge(q) : null;
  const lossCap = e !== null && e.side === "lower" ? -e.value : null;
  return Object.freeze({
    confidence,
    side,
    tailProbability: 1 - confidence,
    valueAtRisk: valueAtRisk(confidence, p, side),
    expectedShortfall: expectedShortfall(confidence, p, side),
    lossCap,
    cappedByEdge: lossCap !== null,
  });
}
