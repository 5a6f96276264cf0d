/**
 * Typed views of the outside references used by the goodness-of-fit and comparison tests (the packages ship no
 * type declarations): jstat 1.9.6 (Student t pdf/cdf, gamma/beta functions, normal body) and fmin 0.0.4's
 * Nelder–Mead (an independent derivative-free optimizer).
 */
interface JStatSubset {
  gammaln(x: number): number;
  ibeta(x: number, a: number, b: number): number;
  studentt: { pdf(x: number, dof: number): number; cdf(x: number, dof: number): number };
  normal: { pdf(x: number, m: number, s: number): number; inv(p: number, m: number, s: number): number };
}
// eslint-disable-next-line @typescript-eslint/no-require-imports
export const jStat = (require("jstat") as { jStat: JStatSubset }).jStat;

export interface NelderMeadResult {
  x: number[];
  fx: number;
}
// eslint-disable-next-line @typescript-eslint/no-require-imports
export const nelderMead = (require("fmin") as { nelderMead: (f: (x: number[]) => number, x0: number[]) => NelderMeadResult }).nelderMead;
