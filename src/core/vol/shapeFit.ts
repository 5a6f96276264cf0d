/**
 * Maximum-likelihood shape of the standardized innovation law for given standardized residuals zₜ (the second
 * step of a two-step EWMA fit): maximize S(k) = Σ ln f_k(zₜ) over |k| ≤ INNOVATION_SHAPE_CAP.
 * S′(k) is analytic (innovation.ts: ∂ℓ/∂L·ξ′ + ∂ℓ/∂a·(ln α)′ + ∂ℓ/∂k). Where some zₜ lies beyond the law's
 * edge, S = −∞ and the maximum lies on the side where all do not, so the sign of S′ (taken as "go back" when
 * infeasible) brackets the root; the root is found by the Illinois variant of regula falsi with bisection
 * safeguard (Dowell & Jarratt 1971), to |Δk| < 1e-10.
 */
import { INNOVATION_SHAPE_CAP, pointScore, standardizedShape, type PointScore } from "./innovation";

export interface ShapeFit {
  readonly shape: number;
  readonly logLikelihood: number;
  /** The maximum sits at the cap (no interior maximum found). */
  readonly atCap: boolean;
  readonly evaluations: number;
}

const scratch: PointScore = { value: 0, dLocation: 0, dLogScale: 0, dShape: 0 };

/** Σ ln f_k(zₜ) and its derivative in k; value −Infinity when some zₜ is outside the support. */
export function shapeLikelihood(z: ArrayLike<number>, k: number): { value: number; slope: number; infeasibleAbove: boolean } {
  const s = standardizedShape(k);
  const lnA = Math.log(s.scale);
  let v = 0;
  let d = 0;
  for (let i = 0; i < z.length; i++) {
    if (!pointScore(z[i], s.location, s.scale, lnA, k, scratch)) {
      // the edge runs through zᵢ: upper edge (k > 0) ⇒ k must fall, lower edge ⇒ k must rise
      return { value: -Infinity, slope: k > 0 ? -Infinity : Infinity, infeasibleAbove: k > 0 };
    }
    v += scratch.value;
    d += scratch.dLocation * s.dLocation + scratch.dLogScale * s.dLogScale + scratch.dShape;
  }
  return { value: v, slope: d, infeasibleAbove: false };
}

export function fitInnovationShape(z: ArrayLike<number>, start = 0): ShapeFit {
  const cap = INNOVATION_SHAPE_CAP;
  let evaluations = 0;
  const slopeAt = (k: number): number => {
    evaluations++;
    return shapeLikelihood(z, k).slope;
  };
  // bracket around the start, widening outward
  let lo = Math.max(-cap, start - 0.05);
  let hi = Math.min(cap, start + 0.05);
  let flo = slopeAt(lo);
  let fhi = slopeAt(hi);
  while (!(flo > 0) && lo > -cap) {
    hi = lo;
    fhi = flo;
    lo = Math.max(-cap, lo - 2 * (hi - lo + 0.05));
    flo = slopeAt(lo);
  }
  while (!(fhi < 0) && hi < cap) {
    lo = hi;
    flo = fhi;
    hi = Math.min(cap, hi + 2 * (hi - lo + 0.05));
    fhi = slopeAt(hi);
  }
  const finish = (k: number, atCap: boolean): ShapeFit => {
    evaluations++;
    return { shape: k, logLikelihood: shapeLikelihood(z, k).value, atCap, evaluations };
  };
  if (!(flo > 0)) return finish(-cap, true);
  if (!(fhi < 0)) return finish(cap, true);
  let side = 0;
  for (let it = 0; it < 100 && hi - lo > 1e-10; it++) {
    let k: number;
    if (Number.isFinite(flo) && Number.isFinite(fhi)) {
      k = (lo * fhi - hi * flo) / (fhi - flo);
      if (!(k > lo && k < hi)) k = 0.5 * (lo + hi);
    } else k = 0.5 * (lo + hi);
    const f = slopeAt(k);
    if (f === 0) {
      lo = hi = k;
      break;
    }
    if (f > 0) {
      lo = k;
      flo = f;
      if (side === 1) fhi /= 2;
      side = 1;
    } else {
      hi = k;
      fhi = f;
      if (side === -1) flo /= 2;
      side = -1;
    }
  }
  return finish(0.5 * (lo + hi), false);
}
