/**
 * Typed view of the parts of jstat 1.9.6 used as an outside reference (the package ships no type declarations).
 * jstat is accurate for the lognormal and normal bodies only; see DEVELOPERS.md for where it is not.
 */
interface Law2 {
  pdf(x: number, a: number, b: number): number;
  cdf(x: number, a: number, b: number): number;
  inv(p: number, a: number, b: number): number;
  mean(a: number, b: number): number;
  variance(a: number, b: number): number;
}
interface JStatSubset {
  normal: Law2;
  lognormal: Law2;
}
// eslint-disable-next-line @typescript-eslint/no-require-imports
export const jStat = (require("jstat") as { jStat: JStatSubset }).jStat;
