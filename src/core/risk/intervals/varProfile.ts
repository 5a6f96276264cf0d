/**
 * Profile-likelihood confidence interval for the VaR of a fitted generalized normal law (Venzon & Moolgavkar
 * 1988, "A method for computing profile-likelihood-based confidence intervals", Appl. Statist. 37:87-94).
 *
 * The interval is the set of VaR values v with 2(ℓ̂ − ℓ_p(v)) ≤ χ²₁(level), where ℓ̂ is the maximum
 * log-likelihood and ℓ_p(v) the largest log-likelihood among parameters whose VaR equals v. Unlike the
 * delta-method interval (varInterval.ts) it follows the skew of the estimator's sampling law.
 *
 * Frame: the short side is the long side of −X ~ GNO(−ξ, α, −k) (tail.ts, reflect), so the data are negated
 * and everything below is written for the long side at confidence c, z = Φ⁻¹(1 − c):
 *   VaR(θ) = −(ξ + α g(z, k)),  g = −expm1(−kz)/k  (gno/reducedQuantile).
 * Fixing v eliminates the location, ξ(a, k) = −v − e^a g(z, k) with a = ln α, so ℓ_p(v) is the maximum of
 * L(a, k) = ℓ(ξ(a, k), a, k) over (a, k) with |k| ≤ 3 (the fit's shape cap). With ξ_a = ξ_aa = −αg,
 * ξ_k = ξ_ak = −α g_k, ξ_kk = −α g_kk (g_k, g_kk from varInterval.ts) and the analytic score/Hessian of ℓ in
 * (ξ, a, k) (fit/likelihood.ts), the chain rule gives
 *   L_i  = ℓ_ξ ξ_i + ℓ_i,
 *   L_ij = ℓ_ξξ ξ_i ξ_j + ℓ_ξi ξ_j + ℓ_ξj ξ_i + ℓ_ij + ℓ_ξ ξ_ij     (i, j ∈ {a, k}).
 * The 2-D maximisation is a safeguarded Newton ascent: Cholesky step on −∇²L (Levenberg–Marquardt shift when
 * it is not positive definite), caps |Δa| ≤ 1 and |Δk| ≤ 0.5, a shape that would cross the cap |k| = 3 stops
 * on it (projection; once there with the score pointing outward only the scale moves), then halving until
 * every observation stays inside the support (fit/newton insideSupport) and Armijo's sufficient increase
 * holds; it stops
 * when the Newton decrement is below 1e-12 + 1e-16·|ℓ| (at most 100 iterations). Starts are warm, from the
 * solution at the nearest v already computed: the better of keeping its (a, k) and keeping its (ξ, k) with
 * the scale solved from the constraint; a start whose support would exclude data is repaired by raising the
 * scale, which moves the edge ξ + α/k = −v + α e^{−kz}/k away from the data for either sign of k.
 *
 * Each end: the signed root r(v) = √(2(ℓ̂ − ℓ_p(v))) is nearly linear in v, so the search works on
 * s(t) = r(v̂ ± t) − √χ² in the distance t from the estimate: first step at the delta-method half-width,
 * outward steps by linear extrapolation of r (growth between ×1.2 and ×4) until s > 0, then the
 * Illinois variant of regula falsi inside the bracket with bisection whenever it stalls or leaves the
 * bracket. It stops when |2(ℓ̂ − ℓ_p) − χ²| ≤ 1e-9 or the bracket is below 1e-13 relative. An end is NaN,
 * with a reason, when the profile reaches the shape cap before the likelihood has dropped by χ²/2, when the
 * inner maximisation fails, or when the work caps (40 profile points per end) run out. Nothing throws.
 */
import { reducedQuantile, type GnoParams } from "../../gno";
import { likelihoodDerivatives } from "../../fit/likelihood";
import { SHAPE_CAP } from "../../fit/maximise";
import { choleskySolve, insideSupport } from "../../fit/newton";
import { normalQuantile } from "../../normal";
import { RISK_SIDES, type RiskSide } from "../measures/side";
import { reflect } from "../measures/tail";
import { reducedQuantileShapeDerivatives, valueAtRiskGradient } from "./varInterval";
import { runToEnd, type Work } from "../../work";

/** What the profile interval needs from a fit (a GnoFit or the same fields from elsewhere). */
export interface FitSummary {
  readonly params: GnoParams;
  /** 3×3 covariance of (location, scale, shape); only used to size the first step (null: a default step). */
  readonly covariance: readonly (readonly number[])[] | null;
}

/** One point of the profile: the best log-likelihood among parameters whose VaR is `valueAtRisk`. */
export interface ProfilePoint {
  readonly valueAtRisk: number;
  readonly logLikelihood: number;
  /** The maximising parameters, in the data's own frame (not reflected). */
  readonly params: GnoParams;
  readonly converged: boolean;
  /** The maximiser sits on the shape cap |k| = 3. */
  readonly atShapeCap: boolean;
  readonly iterations: number;
}

export interface VarProfile {
  readonly confidence: number;
  readonly side: RiskSide;
  /** VaR of the fitted law, v̂. */
  readonly valueAtRisk: number;
  /** ℓ̂: the profile at v̂ (the maximum of the likelihood reached from the fit). */
  readonly maximum: ProfilePoint;
  /** ℓ_p(v), warm-started from the nearest point already computed. */
  at(valueAtRisk: number): ProfilePoint;
}

export interface VarProfileInterval {
  readonly confidence: number;
  readonly side: RiskSide;
  readonly level: number;
  readonly method: "profile";
  readonly lower: number;
  readonly valueAtRisk: number;
  readonly upper: number;
  /** χ²₁(level) = z²_{(1+level)/2}, the drop 2(ℓ̂ − ℓ_p) that marks each end. */
  readonly criticalValue: number;
  /** ℓ̂, the log-likelihood at the estimate. */
  readonly maximumLogLikelihood: number;
  /** Profile points computed (each is one 2-D maximisation). */
  readonly evaluations: number;
  /** Why an end (or both) is NaN; absent when both ends were found. */
  readonly reason?: string;
}

const MAX_NEWTON = 100;
const MAX_POINTS_PER_END = 40;
const END_TOLERANCE = 1e-9;

interface Frame {
  readonly data: ArrayLike<number>;
  readonly min: number;
  readonly max: number;
  readonly z: number;
}

interface Inner {
  readonly a: number;
  readonly k: number;
  readonly value: number;
  readonly converged: boolean;
  readonly atCap: boolean;
  readonly iterations: number;
}

interface Evaluation {
  readonly value: number;
  readonly grad: [number, number];
  /** −∇²L, row-major 2×2. */
  readonly negHess: Float64Array;
}

/** L(a, k) and its derivatives at VaR v (long frame); null when an observation falls outside the support. */
function evaluate(f: Frame, v: number, a: number, k: number): Evaluation | null {
  const alpha = Math.exp(a);
  const g = reducedQuantile(f.z, k);
  const [gk, gkk] = reducedQuantileShapeDerivatives(f.z, k);
  const xi = -v - alpha * g;
  if (!(Math.abs(k) <= SHAPE_CAP) || !insideSupport(xi, alpha, k, f.min, f.max)) return null;
  const d = likelihoodDerivatives(f.data, xi, a, k);
  if (!d || !Number.isFinite(d.value)) return null;
  const [lx, la, lk] = d.gradient;
  const H = d.hessian;
  const xa = -alpha * g;
  const xk = -alpha * gk;
  const xkk = -alpha * gkk;
  const Laa = H[0] * xa * xa + 2 * H[1] * xa + H[4] + lx * xa;
  const Lak = H[0] * xa * xk + H[1] * xk + H[2] * xa + H[5] + lx * xk;
  const Lkk = H[0] * xk * xk + 2 * H[2] * xk + H[8] + lx * xkk;
  return { value: d.value, grad: [lx * xa + la, lx * xk + lk], negHess: new Float64Array([-Laa, -Lak, -Lak, -Lkk]) };
}

/** The start's scale raised until every observation is inside the support (null when impossible). */
function repairSupport(f: Frame, v: number, a: number, k: number): { a: number; k: number } | null {
  const alpha = Math.exp(a);
  const xi = -v - alpha * reducedQuantile(f.z, k);
  if (insideSupport(xi, alpha, k, f.min, f.max)) return { a, k };
  // edge = −v + α e^{−kz}/k must exceed max (k > 0) or stay below min (k < 0)
  const need = k > 0 ? (f.max + v) * k * Math.exp(k * f.z) : -(f.min + v) * -k * Math.exp(k * f.z);
  if (!(need > 0) || !Number.isFinite(need)) return null;
  const raised = Math.log(need) + 0.25;
  const nxi = -v - Math.exp(raised) * reducedQuantile(f.z, k);
  return insideSupport(nxi, Math.exp(raised), k, f.min, f.max) ? { a: raised, k } : null;
}

/**
 * A start for VaR v from a neighbouring solution (ξ0, a0, k0) at another VaR: the better of keeping (a0, k0)
 * (the location absorbs the change of VaR) and keeping (ξ0, k0) (the scale absorbs it, when it can), each
 * repaired for the support.
 */
function warmStart(f: Frame, v: number, xi0: number, a0: number, k0: number): { a: number; k: number; e: Evaluation } | null {
  let best: { a: number; k: number; e: Evaluation } | null = null;
  const g0 = reducedQuantile(f.z, k0);
  const scaleFit = -(v + xi0) / g0;
  const tries: [number, number][] = [[a0, k0]];
  if (scaleFit > 0 && Number.isFinite(Math.log(scaleFit))) tries.push([Math.log(scaleFit), k0]);
  for (const [a, k] of tries) {
    const st = repairSupport(f, v, a, k);
    const e = st ? evaluate(f, v, st.a, st.k) : null;
    if (st && e && (!best || e.value > best.e.value)) best = { a: st.a, k: st.k, e };
  }
  return best;
}

/** max over (a, k) of L at VaR v from a start (long frame). */
function maximiseAt(f: Frame, v: number, xi0: number, a0: number, k0: number): Inner {
  const st = warmStart(f, v, xi0, a0, k0);
  if (!st) return { a: a0, k: k0, value: NaN, converged: false, atCap: false, iterations: 0 };
  let a = st.a;
  let k = st.k;
  let cur = st.e;
  const finish = (it: number, converged: boolean): Inner => ({
    a, k, value: cur!.value, converged, atCap: Math.abs(k) >= SHAPE_CAP, iterations: it,
  });
  for (let it = 0; it < MAX_NEWTON; it++) {
    const g = cur.grad;
    const A = cur.negHess;
    // on the shape cap with the score pointing outward: the shape is held there and only the scale moves
    const held = Math.abs(k) >= SHAPE_CAP && g[1] * k > 0;
    let step: Float64Array | null;
    let definite: boolean;
    if (held) {
      definite = A[0] > 0;
      step = new Float64Array([definite ? g[0] / A[0] : g[0] / Math.max(Math.abs(A[0]), 1), 0]);
      if (definite && (g[0] * step[0]) / 2 < 1e-12 + 1e-16 * Math.abs(cur.value)) return finish(it, true);
    } else {
      step = choleskySolve(A, g, 2);
      definite = step !== null;
      if (step) {
        const dec = g[0] * step[0] + g[1] * step[1];
        if (dec / 2 < 1e-12 + 1e-16 * Math.abs(cur.value)) return finish(it, true);
      } else {
        let mu = Math.max(1e-8 * Math.max(Math.abs(A[0]), Math.abs(A[3])), 1e-8);
        const B = new Float64Array(4);
        while (!step && Number.isFinite(mu)) {
          B.set(A);
          B[0] += mu;
          B[3] += mu;
          step = choleskySolve(B, g, 2);
          mu *= 10;
        }
        if (!step) return finish(it, false);
      }
    }
    const big = Math.max(Math.abs(step[0]), 2 * Math.abs(step[1]));
    let t = big > 1 ? 1 / big : 1;
    let accepted = false;
    for (let tries = 0; tries < 60; tries++) {
      const na = a + t * step[0];
      // projected onto the cap: a step that would cross it stops on it
      const nk = Math.max(-SHAPE_CAP, Math.min(SHAPE_CAP, k + t * step[1]));
      const next = evaluate(f, v, na, nk);
      if (next && next.value >= cur.value + 1e-4 * (g[0] * (na - a) + g[1] * (nk - k))) {
        accepted = na !== a || nk !== k;
        if (accepted) {
          a = na;
          k = nk;
          cur = next;
        }
        break;
      }
      t *= 0.5;
    }
    if (!accepted) {
      // no representable increase: at the maximum to rounding (score tiny), or stuck against the support
      const free = held ? Math.abs(g[0]) : Math.max(Math.abs(g[0]), Math.abs(g[1]));
      return finish(it, definite && free <= 1e-7 * Math.max(1, Math.sqrt(f.data.length)));
    }
  }
  return finish(MAX_NEWTON, false);
}

function frameFor(data: ArrayLike<number>, confidence: number, side: RiskSide): Frame {
  const n = data.length;
  const x = side === "short" ? Float64Array.from(data, (d) => -d) : data;
  let min = Infinity;
  let max = -Infinity;
  for (let i = 0; i < n; i++) {
    if (x[i] < min) min = x[i];
    if (x[i] > max) max = x[i];
  }
  return { data: x, min, max, z: normalQuantile(1 - confidence) };
}

function validInputs(data: ArrayLike<number>, fit: FitSummary, confidence: number, side: RiskSide): boolean {
  const p = fit.params;
  if (!(confidence > 0 && confidence < 1) || !RISK_SIDES.includes(side) || data.length < 2) return false;
  if (!(p.scale > 0) || !Number.isFinite(p.scale) || !Number.isFinite(p.location) || !(Math.abs(p.shape) <= SHAPE_CAP)) return false;
  for (let i = 0; i < data.length; i++) if (!Number.isFinite(data[i])) return false;
  return true;
}

/**
 * The VaR profile of the data around a maximum-likelihood fit. Returns null for invalid inputs (confidence
 * outside (0, 1), non-finite data, invalid params, or data outside the fit's support).
 */
export function varProfile(data: ArrayLike<number>, fit: FitSummary, confidence: number, side: RiskSide = "long"): VarProfile | null {
  if (!validInputs(data, fit, confidence, side)) return null;
  const f = frameFor(data, confidence, side);
  const p = side === "short" ? reflect(fit.params) : fit.params;
  const vHat = -(p.location + p.scale * reducedQuantile(f.z, p.shape));
  if (!insideSupport(p.location, p.scale, p.shape, f.min, f.max)) return null;
  const known: { v: number; r: Inner }[] = [];
  const toPoint = (v: number, r: Inner): ProfilePoint => {
    const alpha = Math.exp(r.a);
    const loc = -v - alpha * reducedQuantile(f.z, r.k);
    const q = { location: loc, scale: alpha, shape: r.k };
    return Object.freeze({
      valueAtRisk: v,
      logLikelihood: r.value,
      params: Object.freeze(side === "short" ? reflect(q) : q),
      converged: r.converged,
      atShapeCap: r.atCap,
      iterations: r.iterations,
    });
  };
  const solve = (v: number): Inner => {
    let near = known[0];
    for (const e of known) if (Math.abs(e.v - v) < Math.abs(near.v - v)) near = e;
    const r = maximiseAt(f, v, -near.v - Math.exp(near.r.a) * reducedQuantile(f.z, near.r.k), near.r.a, near.r.k);
    if (r.converged) known.push({ v, r });
    return r;
  };
  const first = maximiseAt(f, vHat, p.location, Math.log(p.scale), p.shape);
  known.push({ v: vHat, r: first });
  const maximum = toPoint(vHat, first);
  return Object.freeze({
    confidence,
    side,
    valueAtRisk: vHat,
    maximum,
    at: (v: number) => (Number.isFinite(v) ? toPoint(v, solve(v)) : toPoint(v, { ...first, value: NaN, converged: false })),
  });
}

interface EndSearch {
  readonly value: number;
  readonly evaluations: number;
  readonly reason?: string;
}

/** One end of the interval: direction +1 (upper) or −1 (lower). */
function* findEnd(prof: VarProfile, top: number, critical: number, firstStep: number, dir: 1 | -1): Work<EndSearch> {
  const target = Math.sqrt(critical);
  const vHat = prof.valueAtRisk;
  let evaluations = 0;
  const word = dir > 0 ? "upper" : "lower";
  // s(t) = √(2(ℓ̂ − ℓ_p(v̂ + dir·t))) − √χ²
  const measure = (t: number): { s: number; pt: ProfilePoint } => {
    evaluations++;
    const pt = prof.at(vHat + dir * t);
    return { s: Math.sqrt(Math.max(0, 2 * (top - pt.logLikelihood))) - target, pt };
  };
  const failed = (pt: ProfilePoint): string | null => {
    if (!pt.converged || !Number.isFinite(pt.logLikelihood)) return `the likelihood could not be maximised at VaR ${pt.valueAtRisk.toPrecision(6)}`;
    return null;
  };
  let tIn = 0;
  let sIn = -target;
  let t = firstStep;
  let tOut = NaN;
  let sOut = NaN;
  while (evaluations < MAX_POINTS_PER_END) {
    const m = measure(t);
    yield NaN;
    const bad = failed(m.pt);
    if (bad) return { value: NaN, evaluations, reason: `${word} end not found: ${bad}` };
    if (m.s >= 0) {
      tOut = t;
      sOut = m.s;
      break;
    }
    if (m.pt.atShapeCap) {
      return { value: NaN, evaluations, reason: `${word} end unbounded: the shape reaches the cap |k| = ${SHAPE_CAP} before the likelihood drops by χ²/2` };
    }
    // r grows about linearly in t: aim at the target, growing the step by ×1.2 … ×4
    const r = m.s + target;
    const guess = r > 0 ? (t * target) / r : 4 * t;
    tIn = t;
    sIn = m.s;
    t = Math.min(4 * t, Math.max(1.2 * t, guess * 1.05));
    if (!Number.isFinite(vHat + dir * t)) break;
  }
  if (!Number.isFinite(tOut)) return { value: NaN, evaluations, reason: `${word} end not found: the likelihood does not drop by χ²/2 within the search` };
  // Illinois regula falsi on [tIn, tOut], s(tIn) < 0 < s(tOut)
  let side = 0;
  let best = { t: tOut, s: sOut };
  while (evaluations < 2 * MAX_POINTS_PER_END) {
    if (Math.abs(best.s) * 2 * target <= END_TOLERANCE) break;
    const width = tOut - tIn;
    if (width <= 1e-13 * (Math.abs(vHat) + tOut)) break;
    let tn = tOut - (sOut * width) / (sOut - sIn);
    if (!(tn > tIn && tn < tOut) || !Number.isFinite(tn)) tn = tIn + width / 2;
    const m = measure(tn);
    yield NaN;
    const bad = failed(m.pt);
    if (bad) return { value: NaN, evaluations, reason: `${word} end not found: ${bad}` };
    if (Math.abs(m.s) < Math.abs(best.s)) best = { t: tn, s: m.s };
    if (m.s >= 0) {
      tOut = tn;
      sOut = m.s;
      if (side === 1) sIn /= 2;
      side = 1;
    } else {
      tIn = tn;
      sIn = m.s;
      if (side === -1) sOut /= 2;
      side = -1;
    }
  }
  // s = 0 within tolerance: |D − χ²| = |s|·(s + 2√χ²) ≈ 2√χ²·|s|
  if (Math.abs(best.s) * (Math.abs(best.s) + 2 * target) > 1e-6) {
    return { value: NaN, evaluations, reason: `${word} end not found: the root search did not converge` };
  }
  return { value: vHat + dir * best.t, evaluations };
}

/**
 * Profile-likelihood interval (lower, VaR, upper) for the VaR of the law fitted to `data` by maximum
 * likelihood. `fit` must be the maximum-likelihood fit of the same data (params; the covariance only sizes the
 * first step). Ends that cannot be found are NaN with a `reason`; invalid inputs give NaN everywhere.
 */
export function varProfileInterval(
  data: ArrayLike<number>,
  fit: FitSummary,
  confidence: number,
  side: RiskSide = "long",
  level = 0.95,
): VarProfileInterval {
  return runToEnd(varProfileIntervalWork(data, fit, confidence, side, level));
}

/**
 * varProfileInterval as resumable Work: yields after every profile point of the two end searches (one
 * constrained maximisation of the likelihood each), at most 2·MAX_POINTS_PER_END points per end.
 */
export function* varProfileIntervalWork(
  data: ArrayLike<number>,
  fit: FitSummary,
  confidence: number,
  side: RiskSide = "long",
  level = 0.95,
): Work<VarProfileInterval> {
  const z = normalQuantile((1 + level) / 2);
  const critical = z * z;
  const out = (lower: number, v: number, upper: number, top: number, evaluations: number, reason?: string): VarProfileInterval =>
    Object.freeze({
      confidence, side, level, method: "profile" as const, lower, valueAtRisk: v, upper,
      criticalValue: critical, maximumLogLikelihood: top, evaluations, ...(reason === undefined ? {} : { reason }),
    });
  if (!(level > 0 && level < 1)) return out(NaN, NaN, NaN, NaN, 0, "the level must lie strictly between 0 and 1");
  const prof = varProfile(data, fit, confidence, side);
  if (!prof) return out(NaN, NaN, NaN, NaN, 0, "invalid inputs: the confidence, the data or the fit (data outside its support)");
  const top = prof.maximum.logLikelihood;
  if (!prof.maximum.converged || !Number.isFinite(top)) {
    return out(NaN, prof.valueAtRisk, NaN, top, 1, "the likelihood could not be maximised at the fitted VaR");
  }
  const grad = valueAtRiskGradient(confidence, fit.params, side);
  let variance = 0;
  const cov = fit.covariance;
  if (cov) for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) variance += grad[i] * (cov[i]?.[j] ?? NaN) * grad[j];
  // without a covariance: about the standard error of a tail quantile of a normal sample, α√((2 + z_c²)/(2n))
  const zc = normalQuantile(confidence);
  const fallback = z * fit.params.scale * Math.sqrt((2 + zc * zc) / (2 * data.length));
  const firstStep = variance > 0 && Number.isFinite(variance) ? z * Math.sqrt(variance) : fallback;
  yield NaN;
  const lo = yield* findEnd(prof, top, critical, firstStep, -1);
  const hi = yield* findEnd(prof, top, critical, firstStep, 1);
  const reasons = [lo.reason, hi.reason].filter((r): r is string => r !== undefined);
  return out(lo.value, prof.valueAtRisk, hi.value, top, 1 + lo.evaluations + hi.evaluations, reasons.length ? reasons.join("; ") : undefined);
}
