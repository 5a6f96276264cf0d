/**
 * Finding the interior maximum of the generalized normal likelihood, and refusing the runaway one.
 *
 * As for the three-parameter lognormal (Hill 1963, JASA 58:72-84), the likelihood grows without bound
 * along a ridge where the support edge approaches the most extreme observation while |k| grows. For a
 * fixed shape the likelihood is bounded (k y − y²/2 → −∞), so the shape is capped at |k| ≤ 3 (Hosking's
 * |τ3| < 0.95 limit corresponds to |k| ≲ 3.04) and a maximum is accepted as an estimate only when it is
 * REGULAR:
 *   - Newton converged (decrement test) and −H is positive definite there;
 *   - |k| is below the cap by more than 1e-6;
 *   - the edge does not hug the data: the gap between the edge and the extreme observation on its side
 *     is at least HUG_FRACTION = 1/100 of that observation's distance to its neighbour
 *     (floored at 1e-3 sample sd when the two extremes tie).
 * Strategy: Newton from the L-moment estimate (or a caller's start). If that is not regular, profile
 * the likelihood over a shape grid (step 0.1 on [−3, 3], inner Newton on location and log-scale with
 * warm starts outward from the normal fit), take the best interior local maximum of the profile whose
 * edge does not hug, refine it by golden-section search on the profile, and polish with the full Newton.
 * If no regular interior maximum exists the result is flagged irregular and the caller must not present
 * the optimizer's end point as an estimate.
 */
import { newtonAscentWork, insideSupport, type NewtonResult } from "./newton";
import { reporting, runToEnd, type Work } from "../work";
import type { GnoParams } from "../gno";
import type { SampleMoments } from "./sampleStats";

export const SHAPE_CAP = 3;
/**
 * Bound on the search's work in Newton iterations × observations (each iteration is one pass over the data, plus
 * its line search): 10,000,000 is 1 to 3 s in plain node on a shared machine. The first Newton run gets at most
 * max(15, bound / n) iterations (at most 100); the shape profile stops when the bound is spent, and the fit is then reported
 * irregular with that reason. Rolling windows and bootstrap refits (n ≤ 10,000) never come near it on data
 * with a regular maximum.
 */
export const SEARCH_WORK_BOUND = 10_000_000;
export const HUG_FRACTION = 0.01;
const PROFILE_STEP = 0.1;

export interface MaximumSearch {
  readonly result: NewtonResult;
  readonly regular: boolean;
  /** Total Newton iterations spent (all stages). */
  readonly iterations: number;
  readonly usedProfile: boolean;
  readonly reason: string;
}

/** True when the support edge of p sits closer to the extreme observation than the documented margin. */
export function edgeHugsData(p: GnoParams, s: SampleMoments): boolean {
  if (p.shape === 0) return false;
  const edgeValue = p.location + p.scale / p.shape;
  const floor = 1e-3 * (s.sd > 0 ? s.sd : 1);
  if (p.shape > 0) {
    const gap = Math.max(s.max - s.secondMax, floor);
    return edgeValue - s.max < HUG_FRACTION * gap;
  }
  const gap = Math.max(s.secondMin - s.min, floor);
  return s.min - edgeValue < HUG_FRACTION * gap;
}

function isRegular(r: NewtonResult, s: SampleMoments): boolean {
  return (
    r.converged &&
    r.negativeDefinite &&
    Math.abs(r.shape) < SHAPE_CAP - 1e-6 &&
    !edgeHugsData({ location: r.location, scale: r.scale, shape: r.shape }, s)
  );
}

/**
 * A feasible (location, scale) for a given shape k ≠ 0, through the lognormal link (Hosking & Wallis 1997 App. A.8; values recomputed with mpmath (40 digits) outside the repo): with
 * the edge g placed a quarter of the way from the extreme observation past it (g = min − (mean − min)/4
 * for k < 0, mirrored for k > 0), ln|x − g| is normal with sd |k|, whose mean μ has the closed-form
 * estimate mean(ln|x − g|); then α = |k|e^μ and ξ = g ± e^μ. Every observation is inside the support.
 * A previous solution is reused when it is still feasible (warm start along the profile).
 */
function feasibleStart(data: ArrayLike<number>, k: number, s: SampleMoments, prev: GnoParams | null): GnoParams {
  if (prev && insideSupport(prev.location, prev.scale, k, s.min, s.max)) return { location: prev.location, scale: prev.scale, shape: k };
  if (k === 0) return { location: s.mean, scale: Math.sqrt(s.varianceMle), shape: 0 };
  const g = k < 0 ? s.min - (s.mean - s.min) / 4 : s.max + (s.max - s.mean) / 4;
  let mu = 0;
  for (let i = 0; i < data.length; i++) mu += Math.log(Math.abs(data[i] - g));
  mu /= data.length;
  const em = Math.exp(mu);
  return { location: k < 0 ? g + em : g - em, scale: Math.abs(k) * em, shape: k };
}

/**
 * The profile stage's outcome for one sample. The profile does not depend on the start (its chain begins at the
 * normal fit), so two searches on the same sample (a warm attempt, then the cold one) may share it: pass the same
 * memo object to both and the second reuses the first's profile instead of recomputing it (same result exactly).
 */
export interface ProfileMemo {
  outcome?: { readonly polished: NewtonResult | null; readonly reason: string };
}

/** Runs the strategy described in the header. `start` must be feasible (checked; else a moment start). */
export function findMaximum(data: ArrayLike<number>, s: SampleMoments, start: GnoParams, oneStepBelow?: number, memo?: ProfileMemo): MaximumSearch {
  return runToEnd(findMaximumWork(data, s, start, oneStepBelow, memo));
}

/**
 * findMaximum as resumable work: yields after every pass over the data (each Newton evaluation, each line-search
 * trial, each lognormal-link start of a profile point), so each step of the shape profile and of its golden-section
 * refinement is a few short units. The fraction is the share of the work bound spent so far (a ceiling: a regular
 * fit ends long before 1). Same arithmetic and result as findMaximum.
 */
export function* findMaximumWork(
  data: ArrayLike<number>,
  s: SampleMoments,
  start: GnoParams,
  oneStepBelow?: number,
  memo?: ProfileMemo,
): Work<MaximumSearch> {
  const box = { min: s.min, max: s.max, shapeCap: SHAPE_CAP };
  const n = data.length;
  let passes = 0;
  const progress = (): number => Math.min(0.99, (++passes * n) / SEARCH_WORK_BOUND);
  const newtonAscent = (from: GnoParams, opts: Parameters<typeof newtonAscentWork>[2]): Work<NewtonResult> =>
    reporting(newtonAscentWork(data, from, opts), progress);
  const k0 = Math.max(-SHAPE_CAP + 0.05, Math.min(SHAPE_CAP - 0.05, start.shape));
  const feasibleFirst = insideSupport(start.location, start.scale, k0, s.min, s.max) && start.scale > 0;
  const st = feasibleFirst ? { ...start, shape: k0 } : feasibleStart(data, k0, s, null);
  if (!feasibleFirst) yield progress();
  const firstCap = Math.max(15, Math.min(100, Math.floor(SEARCH_WORK_BOUND / Math.max(1, n))));
  const first = yield* newtonAscent(st, { ...box, maxIterations: firstCap, ...(oneStepBelow === undefined ? {} : { oneStepBelow }) });
  let iterations = first.iterations;
  if (isRegular(first, s)) return { result: first, regular: true, iterations, usedProfile: false, reason: first.reason };
  if (memo?.outcome) {
    const o = memo.outcome;
    return o.polished ? { result: o.polished, regular: true, iterations, usedProfile: true, reason: o.reason } : { result: first, regular: false, iterations, usedProfile: true, reason: o.reason };
  }
  const profiled = yield* profileStageWork(data, s, box, newtonAscent, progress);
  iterations += profiled.iterations;
  if (memo) memo.outcome = { polished: profiled.polished, reason: profiled.reason };
  return profiled.polished
    ? { result: profiled.polished, regular: true, iterations, usedProfile: true, reason: profiled.reason }
    : { result: first, regular: false, iterations, usedProfile: true, reason: profiled.reason };
}

/** The profile stage of findMaximum: the polished regular maximum it finds, or null with the reason. */
function* profileStageWork(
  data: ArrayLike<number>,
  s: SampleMoments,
  box: { min: number; max: number; shapeCap: number },
  newtonAscent: (from: GnoParams, opts: Parameters<typeof newtonAscentWork>[2]) => Work<NewtonResult>,
  progress: () => number,
): Work<{ polished: NewtonResult | null; iterations: number; reason: string }> {
  // The work bound counts the profile's own iterations only, so the outcome does not depend on the start (memo).
  let iterations = 0;
  const n = data.length;

  // profile over the shape
  const nSide = Math.round(SHAPE_CAP / PROFILE_STEP);
  const ks: number[] = [];
  for (let i = -nSide; i <= nSide; i++) ks.push(i * PROFILE_STEP);
  const prof: (NewtonResult | null)[] = new Array(ks.length).fill(null);
  const spent = (): boolean => iterations * n > SEARCH_WORK_BOUND;
  const inner = function* (k: number, prev: GnoParams | null): Work<NewtonResult> {
    // never more iterations than the bound has left (at least 10, so one profile point can still settle)
    const left = Math.max(10, Math.min(200, Math.floor((SEARCH_WORK_BOUND - iterations * n) / Math.max(1, n))));
    const from = feasibleStart(data, k, s, prev);
    yield progress();
    const r = yield* newtonAscent(from, { ...box, fixShape: true, maxIterations: left });
    iterations += r.iterations;
    return r;
  };
  const asParams = (r: NewtonResult): GnoParams => ({ location: r.location, scale: r.scale, shape: r.shape });
  const mid = nSide;
  prof[mid] = yield* inner(0, null);
  // each side is scanned outward from the normal fit and stops at the first shape whose inner maximisation does
  // not converge (its neighbours cannot then form an accepted local maximum) or when the work bound is spent
  for (let i = mid + 1; i < ks.length && prof[i - 1]!.converged && !spent(); i++) prof[i] = yield* inner(ks[i], asParams(prof[i - 1]!));
  for (let i = mid - 1; i >= 0 && prof[i + 1]!.converged && !spent(); i--) prof[i] = yield* inner(ks[i], asParams(prof[i + 1]!));
  if (spent()) {
    return {
      polished: null, iterations,
      reason: `the search for an interior maximum stopped at its work bound (${SEARCH_WORK_BOUND.toExponential(0)} Newton iterations × observations; here ${iterations} iterations × ${n} observations) — typical of a wild outlier or a degenerate likelihood`,
    };
  }
  const val = (r: NewtonResult | null) => (r && r.converged && Number.isFinite(r.value) ? r.value : -Infinity);
  let best = -1;
  for (let i = 1; i < ks.length - 1; i++) {
    const r = prof[i]!;
    if (val(r) >= val(prof[i - 1]) && val(r) >= val(prof[i + 1]) && val(prof[i - 1]) > -Infinity && val(prof[i + 1]) > -Infinity && val(r) > -Infinity && !edgeHugsData(asParams(r), s)) {
      if (best < 0 || val(r) > val(prof[best])) best = i;
    }
  }
  if (best < 0) {
    return { polished: null, iterations, reason: "no interior maximum: the likelihood rises toward the edge of the data (degenerate likelihood)" };
  }
  // golden-section refinement of the profile on [k_{best-1}, k_{best+1}]
  const gr = (Math.sqrt(5) - 1) / 2;
  let lo = ks[best - 1];
  let hi = ks[best + 1];
  let anchor = asParams(prof[best]!);
  let c = hi - gr * (hi - lo);
  let d = lo + gr * (hi - lo);
  let rc = yield* inner(c, anchor);
  let rd = yield* inner(d, anchor);
  for (let it = 0; it < 30 && hi - lo > 1e-7 && !spent(); it++) {
    if (val(rc) >= val(rd)) {
      hi = d;
      d = c;
      rd = rc;
      c = hi - gr * (hi - lo);
      rc = yield* inner(c, asParams(rd));
    } else {
      lo = c;
      c = d;
      rc = rd;
      d = lo + gr * (hi - lo);
      rd = yield* inner(d, asParams(rc));
    }
  }
  anchor = asParams(val(rc) >= val(rd) ? rc : rd);
  const polished = yield* newtonAscent(anchor, { ...box, maxIterations: 50 });
  iterations += polished.iterations;
  if (isRegular(polished, s) && Math.abs(polished.shape - anchor.shape) < 0.2) {
    return { polished, iterations, reason: "converged to the interior maximum found by profiling the shape" };
  }
  return { polished: null, iterations, reason: "the interior stationary point of the profile is not a regular maximum" };
}
