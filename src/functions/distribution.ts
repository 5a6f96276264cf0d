/**
 * Cell functions for the law itself: parameters, density, CDF, quantile, moments, L-moments, edge, draws.
 * Thin adapters: parse (cells.ts) → src/core/gno → shape.
 */
import * as gno from "../core/gno";
import * as pareto from "../core/pareto";
import { Grid, column, fail, guard, guardGrid, mapCells, notAvailable, readInteger, readParams, readNumber, isBlank, isSpliced, WITH_TAILS } from "./cells";

/** Largest number of draws ASKEW.RANDOM returns (a column of a million cells). */
const MAX_DRAWS = 1_000_000;

/**
 * Checks location, scale and shape and returns them as a 3×1 column for the other ASKEW functions.
 * @customfunction PARAMS
 * @param location Location ξ: where the law is centred (in the units of the returns).
 * @param scale Scale α: spread of the law; must be greater than 0.
 * @param shape Shape k: 0 is the normal law; above 0 skews left with an upper edge; below 0 skews right with a lower edge.
 * @returns A 3×1 column: location, scale, shape.
 */
export function params(location: any, scale: any, shape: any): any[][] {
  return guardGrid(() => {
    const p = readParams([[readNumber(location, "location")], [readNumber(scale, "scale")], [readNumber(shape, "shape")]]);
    return [[p.location], [p.scale], [p.shape]];
  });
}

/**
 * Density of the law at x, cell by cell; 0 outside the support.
 * @customfunction PDF
 * @param x A value or a range of values (returns); the result has the same shape.
 * @param params Location, scale, shape: 3 cells (e.g. from ASKEW.FIT), or 9 with Pareto tails (ASKEW.TAILFIT).
 * @returns The density at each x.
 */
export function pdf(x: any[][], params: any[][]): any[][] {
  return guardGrid(() => {
    const p = readParams(params, "params", WITH_TAILS);
    return mapCells(x, "x", isSpliced(p) ? (v) => pareto.splicedPdf(v, p) : (v) => gno.pdf(v, p));
  });
}

/**
 * Probability that a draw is at most x, cell by cell: 0 below a lower edge, 1 above an upper edge.
 * @customfunction CDF
 * @param x A value or a range of values (returns); the result has the same shape.
 * @param params Location, scale, shape: 3 cells in a row or a column, or 9 with Pareto tails (ASKEW.TAILFIT).
 * @returns P(X ≤ x) for each x.
 */
export function cdf(x: any[][], params: any[][]): any[][] {
  return guardGrid(() => {
    const p = readParams(params, "params", WITH_TAILS);
    return mapCells(x, "x", isSpliced(p) ? (v) => pareto.splicedCdf(v, p) : (v) => gno.cdf(v, p));
  });
}

/**
 * The value below which a draw falls with probability p (the inverse of ASKEW.CDF), cell by cell.
 * @customfunction QUANTILE
 * @param p A probability strictly between 0 and 1, or a range of them; the result has the same shape.
 * @param params Location, scale, shape: 3 cells in a row or a column, or 9 with Pareto tails (ASKEW.TAILFIT).
 * @returns The p-quantile for each p.
 */
export function quantile(p: any[][], params: any[][]): any[][] {
  return guardGrid(() => {
    const q = readParams(params, "params", WITH_TAILS);
    const inverse = isSpliced(q) ? (v: number) => pareto.splicedQuantile(v, q) : (v: number) => gno.quantile(v, q);
    return mapCells(p, "p", (v) => (v > 0 && v < 1 ? inverse(v) : fail(`p must lie strictly between 0 and 1 (got ${v}).`)));
  });
}

/**
 * Mean, standard deviation, skewness and excess kurtosis of the law. With Pareto tails, a moment the tails do not have (ξ ≥ 1/order) is #N/A.
 * @customfunction MOMENTS
 * @param params Location, scale, shape: 3 cells in a row or a column, or 9 with Pareto tails (ASKEW.TAILFIT).
 * @returns A 4×1 column: mean, standard deviation, skewness, excess kurtosis.
 */
export function moments(params: any[][]): any[][] {
  return guardGrid(() => {
    const p = readParams(params, "params", WITH_TAILS);
    if (isSpliced(p)) return splicedMomentColumn(pareto.splicedMoments(p));
    const m = gno.moments(p);
    return column([m.mean, m.sd, m.skewness, m.excessKurtosis], "The moments overflow for a shape this far from 0.");
  });
}

/**
 * L-moments of the law: mean (λ1), L-scale (λ2), L-skewness (τ3) and L-kurtosis (τ4).
 * @customfunction LMOMENTS
 * @param params Location, scale, shape: 3 cells in a row or a column.
 * @returns A 4×1 column: λ1, λ2, τ3, τ4.
 */
export function lmoments(params: any[][]): any[][] {
  return guardGrid(() => {
    const l = gno.lMoments(readParams(params));
    return column([l.l1, l.l2, l.t3, l.t4], "The L-moments overflow for a shape this far from 0.");
  });
}

/**
 * The finite edge of the support, location + scale/shape: an upper edge when shape > 0, a lower edge when shape < 0. With Pareto tails: the one finite end (a tail with ξ < 0 ends at threshold ∓ β/ξ).
 * @customfunction BOUND
 * @param params Location, scale, shape: 3 cells in a row or a column, or 9 with Pareto tails (ASKEW.TAILFIT).
 * @returns The edge; #N/A when shape is 0 (the normal law has no edge).
 */
export function bound(params: any[][]): any {
  return guard(() => {
    const p = readParams(params, "params", WITH_TAILS);
    if (isSpliced(p)) return splicedBound(p);
    const e = gno.edge(p);
    if (e === null) notAvailable("No edge: with shape 0 the law is normal and unbounded on both sides.");
    if (!Number.isFinite(e.value)) fail("The edge is too far away to represent (shape is too close to 0).");
    return e.value;
  });
}

/**
 * Random draws from the law; the same seed always gives the same draws.
 * @customfunction RANDOM
 * @param params Location, scale, shape: 3 cells in a row or a column, or 9 with Pareto tails (ASKEW.TAILFIT).
 * @param n How many draws, from 1 to 1,000,000.
 * @param [seed] A whole number that fixes the draws (default 1). Change it for another set.
 * @returns An n×1 column of draws.
 */
export function random(params: any[][], n: any, seed?: any): any[][] {
  return guardGrid(() => {
    const p = readParams(params, "params", WITH_TAILS);
    const count = readInteger(n, "n", 1, MAX_DRAWS);
    const s = isBlank(seed) ? 1 : readInteger(seed, "seed", -2147483648, 2147483647);
    const draws = isSpliced(p) ? pareto.splicedSample(p, count, s) : gno.sample(p, count, s);
    return column(draws, "A draw overflowed: the parameters are too extreme.");
  });
}

/** MOMENTS of the spliced law: a moment the tails do not have is #N/A saying why. */
function splicedMomentColumn(m: pareto.SplicedMoments): Grid {
  const names = ["mean", "standard deviation", "skewness", "excess kurtosis"];
  return [m.mean, m.sd, m.skewness, m.excessKurtosis].map((x, i) => [
    i + 1 > m.order
      ? new CustomFunctions.Error(CustomFunctions.ErrorCode.notAvailable, `No ${names[i]}: a tail with ξ ≥ 1/${i + 1} has no moment of order ${i + 1}.`)
      : Number.isFinite(x)
        ? x
        : new CustomFunctions.Error(CustomFunctions.ErrorCode.invalidValue, "The moments overflow for these parameters."),
  ]);
}

/** BOUND of the spliced law: its one finite end; #N/A when it has none or two (both named). */
function splicedBound(p: pareto.SplicedParams): number {
  const e = pareto.splicedEdges(p);
  const lower = Number.isFinite(e.lower);
  const upper = Number.isFinite(e.upper);
  if (lower && upper) notAvailable(`Two edges: lower ${e.lower}, upper ${e.upper}.`);
  if (!lower && !upper) notAvailable("No edge: the law is unbounded on both sides.");
  return lower ? e.lower : e.upper;
}
