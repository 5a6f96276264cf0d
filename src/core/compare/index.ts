/**
 * Model comparison on one sample by maximum likelihood: normal, Student t, asymmetric Laplace, Johnson SU and
 * the generalized normal (fit engine). Each family reports its log-likelihood, parameter count, AIC = 2p − 2 ln L
 * (Akaike 1974), BIC = p ln n − 2 ln L (Schwarz 1978), ΔAIC from the best family, and its own 99% long-side VaR
 * (positive loss, −quantile(0.01) of the fitted family), so the effect of the family choice on the risk number
 * is visible. Rows are sorted best (lowest AIC) first. All likelihoods are of the same data in the same units.
 */
import { fitGnoCachedWork, type GnoFit } from "../fit";
import type { GnoParams } from "../gno";
import { valueAtRisk } from "../risk";
import { fitAsymmetricLaplace, asymmetricLaplaceQuantile } from "./asymmetricLaplace";
import { fitJohnsonSuWork, johnsonSuQuantile } from "./johnsonSu";
import { fitNormal } from "./normalFamily";
import { fitStudentTWork, studentTQuantile, NU_CAP, NU_MIN } from "./studentT";
import { runToEnd, stage, type Work } from "../work";

export * from "./asymmetricLaplace";
export * from "./johnsonSu";
export * from "./normalFamily";
export * from "./studentT";
export { goldenMaximise, nelderMeadMaximise } from "./optimize";

export type FamilyId = "gno" | "normal" | "student-t" | "asymmetric-laplace" | "johnson-su";

/** Most rows COMPARE accepts. */
export const MAX_COMPARE_ROWS = 1_000_000;
/**
 * Most rows the iterative families (Student t, Johnson SU) are started on. Above it each is first fitted on every
 * m-th row, m = ⌈n / COMPARE_FIT_ROWS⌉ (rows 1, 1 + m, 1 + 2m, …); that fit starts Newton's method on every m′-th
 * row with ten times as many rows, and so on up to all rows (each rung a handful of passes from a close start), so
 * the reported fit is the maximum on all the data. Only when the last Newton run does not settle does the row's
 * note say so.
 */
export const COMPARE_FIT_ROWS = 10_000;

/** Every m-th value from the first, m = ⌈n / most⌉; the data itself when n ≤ most. */
export function evenSubsample(data: Float64Array, most: number): { values: Float64Array; every: number } {
  if (data.length <= most) return { values: data, every: 1 };
  const every = Math.ceil(data.length / most);
  const out = new Float64Array(Math.ceil(data.length / every));
  for (let i = 0, j = 0; i < data.length; i += every, j++) out[j] = data[i];
  return { values: out, every };
}

/** Confidence of the VaR shown beside each family. */
export const COMPARE_VAR_CONFIDENCE = 0.99;

export interface FamilyResult {
  readonly family: FamilyId;
  /** Parameter names and values, in the family's documented order. */
  readonly parameters: readonly (readonly [string, number])[];
  readonly parameterCount: number;
  readonly logLikelihood: number;
  readonly aic: number;
  readonly bic: number;
  /** AIC minus the smallest AIC in the table (0 for the best family). */
  readonly deltaAic: number;
  /** 99% long-side VaR as a positive loss: −quantile(0.01). */
  readonly valueAtRisk99: number;
  /** Empty when the fit is a clean interior maximum, else why to read the row with care. */
  readonly note: string;
}

export interface ModelComparison {
  readonly n: number;
  readonly rows: readonly FamilyResult[];
  readonly best: FamilyId;
}

interface Raw {
  readonly family: FamilyId;
  readonly parameters: readonly (readonly [string, number])[];
  readonly logLikelihood: number;
  readonly quantile01: number;
  readonly note: string;
}

function gnoRaw(fit: GnoFit, data: ArrayLike<number>): Raw {
  const p: GnoParams = fit.params;
  const note = fit.regular ? "" : "no regular interior maximum: " + fit.reason;
  return {
    family: "gno",
    parameters: [
      ["location", p.location],
      ["scale", p.scale],
      ["shape", p.shape],
    ],
    logLikelihood: fit.method === "mle" && data.length === fit.n ? fit.logLikelihood : NaN,
    quantile01: -valueAtRisk(COMPARE_VAR_CONFIDENCE, p, "long"),
    note,
  };
}

/**
 * Fits every family to the data (n ≥ 10 advised) and ranks them by AIC. `gnoFit` (a maximum-likelihood GnoFit of
 * the same data) may be passed to reuse a fit already made; otherwise the cached fit is used.
 */
export function compareFamilies(data: ArrayLike<number>, gnoFit?: GnoFit): ModelComparison {
  return runToEnd(compareFamiliesWork(data, gnoFit));
}

/**
 * compareFamilies as resumable Work: yields after each family (the generalized normal fit, normal, Student t,
 * asymmetric Laplace, Johnson SU), and inside the long ones: the generalized normal fit (fitGnoCachedWork: each
 * pass over the data), Student t (fitStudentTWork) and Johnson SU (fitJohnsonSuWork): each chunk of at most
 * 131,072 rows of a Newton pass, each start point and simplex step. The iterative families are started on at most
 * COMPARE_FIT_ROWS rows (see there) and refined by Newton on all rows, so no step grows past the cost of a
 * 10,000-row simplex step or a 131,072-row pass, whatever n.
 */
export function* compareFamiliesWork(data: ArrayLike<number>, gnoFit?: GnoFit): Work<ModelComparison> {
  const x = data instanceof Float64Array ? data : Float64Array.from(data);
  const n = x.length;
  const lowTail = 1 - COMPARE_VAR_CONFIDENCE;
  const raws: Raw[] = [];
  const sub = evenSubsample(x, COMPARE_FIT_ROWS);
  // refinement ladder above COMPARE_FIT_ROWS: every m-th row with 10×, 100×, … as many rows, then all rows
  const ladder: Float64Array[] = [];
  for (let most = 10 * COMPARE_FIT_ROWS; most < n; most *= 10) ladder.push(evenSubsample(x, most).values);
  if (sub.every > 1) ladder.push(x);
  const subNote = (converged: boolean): string =>
    sub.every > 1 && !converged
      ? `started on ${sub.values.length.toLocaleString("en-US")} of ${n.toLocaleString("en-US")} rows (one row in every ${sub.every}); Newton on all rows did not settle`
      : "";
  const withSub = (note: string, converged: boolean): string => [note, subNote(converged)].filter((t) => t !== "").join("; ");

  raws.push(gnoRaw(gnoFit ?? (yield* stage(fitGnoCachedWork(x, "mle"), 0, 0.2)), x));
  yield 0.2;

  const normal = fitNormal(x);
  raws.push({
    family: "normal",
    parameters: [
      ["mean", normal.params.mean],
      ["sd", normal.params.sd],
    ],
    logLikelihood: normal.logLikelihood,
    quantile01: -valueAtRisk(COMPARE_VAR_CONFIDENCE, normal.asGno, "long"),
    note: "",
  });
  yield 0.3;

  let t = yield* stage(fitStudentTWork(sub.values), 0.3, 0.3);
  for (const rows of ladder) t = yield* stage(fitStudentTWork(rows, t.params), 0.3, 0.3);
  raws.push({
    family: "student-t",
    parameters: [
      ["location", t.params.location],
      ["scale", t.params.scale],
      ["dof", t.params.dof],
    ],
    logLikelihood: t.logLikelihood,
    quantile01: studentTQuantile(lowTail, t.params),
    note: withSub(
      t.atBound
        ? `degrees of freedom at the lower bound ${NU_MIN}`
        : t.atNormalLimit
          ? `at the normal limit: ν → ∞, shown as its cap ${NU_CAP.toExponential(0)} (the normal row is the same law)`
          : t.converged || sub.every > 1
            ? ""
            : "Newton did not settle",
      t.converged,
    ),
  });
  yield 0.5;

  const ald = fitAsymmetricLaplace(x);
  raws.push({
    family: "asymmetric-laplace",
    parameters: [
      ["location", ald.params.location],
      ["scale", ald.params.scale],
      ["kappa", ald.params.kappa],
    ],
    logLikelihood: ald.logLikelihood,
    quantile01: asymmetricLaplaceQuantile(lowTail, ald.params),
    note: "",
  });
  yield 0.6;

  let su = yield* stage(fitJohnsonSuWork(sub.values), 0.6, 0.6);
  for (const rows of ladder) su = yield* stage(fitJohnsonSuWork(rows, su.params), 0.6, 0.6);
  raws.push({
    family: "johnson-su",
    parameters: [
      ["location", su.params.location],
      ["scale", su.params.scale],
      ["gamma", su.params.gamma],
      ["delta", su.params.delta],
    ],
    logLikelihood: su.logLikelihood,
    quantile01: johnsonSuQuantile(lowTail, su.params),
    note: withSub(
      su.atNormalLimit
        ? "at the normal limit (scale capped at 1e3 sd)"
        : su.atLognormalLimit
          ? "at the lognormal limit (scale floored at 1e-3 sd)"
          : su.converged || sub.every > 1
            ? ""
            : "simplex did not settle",
      su.converged,
    ),
  });
  yield 1;

  const scored = raws.map((r) => {
    const k = r.parameters.length;
    const aic = 2 * k - 2 * r.logLikelihood;
    return { r, k, aic, bic: k * Math.log(n) - 2 * r.logLikelihood };
  });
  const finiteAics = scored.map((s) => s.aic).filter((a) => Number.isFinite(a));
  let bestAic = NaN;
  for (const a of finiteAics) if (!(a >= bestAic)) bestAic = a;
  const rows: FamilyResult[] = scored
    .map((s) => ({
      family: s.r.family,
      parameters: s.r.parameters,
      parameterCount: s.k,
      logLikelihood: s.r.logLikelihood,
      aic: s.aic,
      bic: s.bic,
      deltaAic: s.aic - bestAic,
      valueAtRisk99: -s.r.quantile01,
      note: s.r.note,
    }))
    .sort((a, b) => (Number.isFinite(a.aic) ? a.aic : Infinity) - (Number.isFinite(b.aic) ? b.aic : Infinity));
  return { n, rows, best: rows[0].family };
}
