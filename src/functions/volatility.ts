/**
 * Conditional-volatility cell functions: VOLFIT (the model report), VOLATILITY (σₜ per row) and NEXTDAY (the next
 * return's generalized normal law). Thin adapters: parse → src/core/vol → shape. Parameters are estimated from the
 * whole column. Bound: at most MAX_VOL_ROWS numbers (one fit is a few dozen passes over the data; VOLFIT adds the
 * normal-innovation fit for its likelihood-ratio test and the standard errors).
 */
import { volReport, VOL_MODELS, INNOVATION_KINDS, fitVolatility, type VolReportModel } from "../core/vol";
import { fitGnoCached } from "../core/fit";
import { moments } from "../core/gno";
import { fail, guardGrid, labelTable, notAvailable, numberCell, readChoice, readData, readDecay, type CellValue, type Grid } from "./cells";
import { readSeries } from "./risk";
import { fitSpliced, residualTailLaw, splicedCells, type SplicedParams } from "../core/pareto";
import { innovationLaw } from "../core/vol/innovation";
import { volReportRows } from "./tables/volReport";

/** Most numbers VOLFIT, VOLATILITY and NEXTDAY accept. */
export const MAX_VOL_ROWS = 50_000;
/** Fewest returns a GARCH fit accepts. */
export const MIN_GARCH_ROWS = 100;

function readModel(
  model: unknown,
  innovations: unknown,
  n: number,
  decay: unknown,
): { model: VolReportModel; innovations: "gno" | "normal"; paretoTails: boolean; lambda: number | undefined } {
  const m = readChoice(model, "model", VOL_MODELS, "iid");
  const choice = readChoice(innovations, "innovations", [...INNOVATION_KINDS, "gno-gpd"], "gno");
  // "gno-gpd": the filter and body as "gno"; NEXTDAY then splices Pareto tails fitted to the residuals.
  const i = choice === "gno-gpd" ? "gno" : choice;
  const lambda = readDecay(decay);
  if (lambda !== undefined && m !== "ewma") fail(`decay is the EWMA λ and applies to model "ewma" only (model is "${m}"); leave it blank.`);
  if (n > MAX_VOL_ROWS) fail(`returns has ${n} numbers; the volatility functions accept at most ${MAX_VOL_ROWS.toLocaleString("en-US")}.`);
  if (m === "garch" && n < MIN_GARCH_ROWS) fail(`A GARCH fit needs at least ${MIN_GARCH_ROWS} returns (got ${n}).`);
  return { model: m, innovations: i, paretoTails: choice === "gno-gpd", lambda };
}

/** NEXTDAY with "gno-gpd": the 9 cells of the spliced next-day law (src/core/pareto), a side without a tail blank. */
function nextDayWithTails(x: Float64Array, model: VolReportModel, lambda: number | undefined): Grid {
  let law: SplicedParams;
  if (model === "iid") {
    try {
      law = fitSpliced(x, { sides: "both", body: fitGnoCached(x, "mle") }).params;
    } catch (e) {
      return fail(`Cannot fit Pareto tails: ${e instanceof Error ? e.message : String(e)}`);
    }
  } else {
    const est = fitVolatility(x, model, { innovations: "gno", lambda });
    if (!est.converged) notAvailable(`The ${model.toUpperCase()} fit did not converge (${est.reason}).`);
    const t = residualTailLaw(est.residuals, innovationLaw(est.shape), est.mean, est.nextSigma);
    if (!t.law) return notAvailable(`No Pareto tails for the residuals: ${t.reason}.`);
    law = t.law;
  }
  return splicedCells(law).map((v) => [Number.isNaN(v) ? "" : numberCell(v, "The next-day law is not finite.")]);
}

/**
 * Fits a volatility model to returns: estimates with standard errors (observed and robust for GARCH), persistence, half-life, volatility, likelihood tests, Ljung-Box, warnings.
 * @customfunction VOLFIT
 * @param returns Daily returns, oldest first: a column of numbers (at least 10; 100 for GARCH; at most 50,000); blanks are skipped.
 * @param [model] "iid" (default: the law fitted once), "ewma" (λ = decay, 0.94 by default; seeded with the mean square) or "garch" (GARCH(1,1)).
 * @param [innovations] "gno" (default: skewed generalized normal), "normal", or "gno-gpd" (same filter and body as "gno"; tails in NEXTDAY).
 * @param [decay] EWMA λ strictly between 0 and 1 (default 0.94); read by model "ewma" only.
 * @returns A 41×2 table of labels and values; rows that do not apply to the model are blank.
 */
export function volFit(returns: any[][], model?: any, innovations?: any, decay?: any): any[][] {
  return guardGrid((): Grid => {
    const x = readData(returns, "returns");
    const o = readModel(model, innovations, x.length, decay);
    return labelTable(volReportRows(volReport(x, o.model, o.innovations, o.lambda)));
  });
}

/**
 * Conditional volatility σ for each row from the returns before it, with parameters estimated from the whole column.
 * @customfunction VOLATILITY
 * @param returns Daily returns in one column, oldest first (at least 10; 100 for GARCH; at most 50,000); blank rows get "".
 * @param [model] "iid" (default: one constant σ), "ewma" or "garch".
 * @param [innovations] "gno" (default), "normal" or "gno-gpd" (σ as with "gno").
 * @param [decay] EWMA λ strictly between 0 and 1 (default 0.94); read by model "ewma" only.
 * @returns A column shaped like returns.
 */
export function volatility(returns: any[][], model?: any, innovations?: any, decay?: any): any[][] {
  return guardGrid((): Grid => {
    const s = readSeries(returns, "returns");
    const rows: number[] = [];
    const data: number[] = [];
    s.values.forEach((v, i) => {
      if (Number.isFinite(v)) {
        rows.push(i);
        data.push(v);
      }
    });
    if (data.length < 10) fail(`returns holds ${data.length} numbers; at least 10 are needed.`);
    const x = Float64Array.from(data);
    const o = readModel(model, innovations, x.length, decay);
    const sig = new Float64Array(s.values.length).fill(NaN);
    if (o.model === "iid") {
      const sd = o.innovations === "normal" ? Math.sqrt(x.reduce((a, v) => a + v * v, 0) / x.length - (x.reduce((a, v) => a + v, 0) / x.length) ** 2) : moments(fitGnoCached(x, "mle").params).sd;
      rows.forEach((r) => (sig[r] = sd));
    } else {
      const est = fitVolatility(x, o.model, { innovations: o.innovations, lambda: o.lambda });
      if (!est.converged) notAvailable(`The ${o.model.toUpperCase()} fit did not converge (${est.reason}).`);
      rows.forEach((r, j) => (sig[r] = est.sigmas[j]));
    }
    const cells: CellValue[] = Array.from(sig, (v) => (Number.isNaN(v) ? "" : numberCell(v, "The volatility is not finite.")));
    return s.isRow ? [cells] : cells.map((c) => [c]);
  });
}

/**
 * The law of the next return under the model: location, scale, shape of a generalized normal, ready for the law functions (VAR, QUANTILE, CDF…).
 * @customfunction NEXTDAY
 * @param returns Daily returns, oldest first: a column of numbers (at least 10; 100 for GARCH; at most 50,000); blanks are skipped.
 * @param [model] "iid" (default: the law fitted to all returns), "ewma" or "garch".
 * @param [innovations] "gno" (default), "normal" or "gno-gpd" (with Pareto tails fitted to the worst and best 10% of residuals: 9 cells).
 * @param [decay] EWMA λ strictly between 0 and 1 (default 0.94); read by model "ewma" only.
 * @returns A 3×1 column: location, scale, shape (9×1 with "gno-gpd", for the same law functions).
 */
export function nextDay(returns: any[][], model?: any, innovations?: any, decay?: any): any[][] {
  return guardGrid((): Grid => {
    const x = readData(returns, "returns");
    const o = readModel(model, innovations, x.length, decay);
    if (o.paretoTails) return nextDayWithTails(x, o.model, o.lambda);
    if (o.model === "iid") {
      if (o.innovations === "normal") {
        const m = x.reduce((a, v) => a + v, 0) / x.length;
        const sd = Math.sqrt(x.reduce((a, v) => a + (v - m) ** 2, 0) / x.length);
        return [[m], [sd], [0]];
      }
      const f = fitGnoCached(x, "mle");
      if (!f.regular) notAvailable(`No regular maximum-likelihood fit (${f.reason}); ASKEW.FIT with method "lmom" gives the L-moment estimate.`);
      return [[f.params.location], [f.params.scale], [f.params.shape]];
    }
    const est = fitVolatility(x, o.model, { innovations: o.innovations, lambda: o.lambda });
    if (!est.converged) notAvailable(`The ${o.model.toUpperCase()} fit did not converge (${est.reason}).`);
    const p = est.nextDay;
    return [[numberCell(p.location, "The next-day location is not finite.")], [numberCell(p.scale, "The next-day scale is not finite.")], [p.shape]];
  });
}
