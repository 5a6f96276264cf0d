/**
 * Typed view of jstat 1.9.6, an outside reference for the tests (the package ships no type declarations).
 * Where it is accurate (DEVELOPERS.md and measured by our tests): normal and lognormal bodies, chi-square,
 * gamma/beta functions, Student t (≈4e-8 relative at non-integer ν). Not for the normal CDF below about −8.5,
 * its inverse at tiny p, or the binomial CDF (rounded to 10 decimals).
 */
interface Law2 {
  pdf(x: number, a: number, b: number): number;
  cdf(x: number, a: number, b: number): number;
  inv(p: number, a: number, b: number): number;
  mean(a: number, b: number): number;
  variance(a: number, b: number): number;
}
export interface JStatSubset {
  normal: Law2;
  lognormal: Law2;
  chisquare: { cdf(x: number, dof: number): number };
  studentt: { pdf(x: number, dof: number): number; cdf(x: number, dof: number): number };
  gammaln(x: number): number;
  ibeta(x: number, a: number, b: number): number;
}
// eslint-disable-next-line @typescript-eslint/no-require-imports
export const jStat = (require("jstat") as { jStat: JStatSubset }).jStat;
export const jStatChiSquare = jStat.chisquare;
