/**
 * Cell functions for the law itself: parameters, density, CDF, quantile, moments, L-moments, edge, draws.
 * Thin adapters: parse (cells.ts) → src/core/gno → shape.
 */
import * as gno from "../core/gno";
import { Grid, column, fail, guard, guardGrid, mapCells, notAvailable, readInteger, readParams, readNumber, isBlank } from "./cells";

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
 * @param params Location, scale, shape: 3 cells in a row or a column (e.g. from ASKEW.FIT or ASKEW.PARAMS).
 * @returns The density at each x.
 */
export function pdf(x: any[][], params: any[][]): any[][] {
  return guardGrid(() => {
    const p = readParams(params);
    return mapCells(x, "x", (v) => gno.pdf(v, p));
  });
}

/**
 * Probability that a draw is at most x, cell by cell: 0 below a lower edge, 1 above an upper edge.
 * @customfunction CDF
 * @param x A value or a range of values (returns); the result has the same shape.
 * @param params Location, scale, shape: 3 cells in a row or a column.
 * @returns P(X ≤ x) for each x.
 */
export function cdf(x: any[][], params: any[][]): any[][] {
  return guardGrid(() => {
    const p = readParams(params);
    return mapCells(x, "x", (v) => gno.cdf(v, p));
  });
}

/**
 * The value below which a draw falls with probability p (the inverse of ASKEW.CDF), cell by cell.
 * @customfunction QUANTILE
 * @param p A probability strictly between 0 and 1, or a range of them; the result has the same shape.
 * @param params Location, scale, shape: 3 cells in a row or a column.
 * @returns The p-quantile for each p.
 */
export function quantile(p: any[][], params: any[][]): any[][] {
  return guardGrid(() => {
    const q = readParams(params);
    return mapCells(p, "p", (v) => {
      if (!(v > 0 && v < 1)) fail(`p must lie strictly between 0 and 1 (got ${v}).`);
      return gno.quantile(v, q);
    });
  });
}

/**
 * Mean, standard deviation, skewness and excess kurtosis of the law.
 * @customfunction MOMENTS
 * @param params Location, scale, shape: 3 cells in a row or a column.
 * @returns A 4×1 column: mean, standard deviation, skewness, excess kurtosis.
 */
export function moments(params: any[][]): any[][] {
  return guardGrid(() => {
    const m = gno.moments(readParams(params));
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
 * The finite edge of the support, location + scale/shape: an upper edge when shape > 0, a lower edge when shape < 0.
 * @customfunction BOUND
 * @param params Location, scale, shape: 3 cells in a row or a column.
 * @returns The edge; #N/A when shape is 0 (the normal law has no edge).
 */
export function bound(params: any[][]): any {
  return guard(() => {
    const e = gno.edge(readParams(params));
    if (e === null) notAvailable("No edge: with shape 0 the law is normal and unbounded on both sides.");
    if (!Number.isFinite(e.value)) fail("The edge is too far away to represent (shape is too close to 0).");
    return e.value;
  });
}

/**
 * Random draws from the law; the same seed always gives the same draws.
 * @customfunction RANDOM
 * @param params Location, scale, shape: 3 cells in a row or a column.
 * @param n How many draws, from 1 to 1,000,000.
 * @param [seed] A whole number that fixes the draws (default 1). Change it for another set.
 * @returns An n×1 column of draws.
 */
export function random(params: any[][], n: any, seed?: any): any[][] {
  return guardGrid(() => {
    const p = readParams(params);
    const count = readInteger(n, "n", 1, MAX_DRAWS);
    const s = isBlank(seed) ? 1 : readInteger(seed, "seed", -2147483648, 2147483647);
    return column(gno.sample(p, count, s), "A draw overflowed: the parameters are too extreme.");
  });
}
