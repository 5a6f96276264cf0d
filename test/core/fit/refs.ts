/**
 * Typed views of the outside references used by the fit tests (neither package ships type declarations):
 * fmin 0.0.4's Nelder–Mead (an independent derivative-free optimizer) and jstat 1.9.6's chi-square CDF
 * (accurate for chi-square per DEVELOPERS.md).
 */
export interface NelderMeadResult {
  x: number[];
  fx: number;
}
export interface NelderMeadOptions {
  maxIterations?: number;
  minErrorDelta?: number;
  zeroDelta?: number;
  nonZeroDelta?: number;
}
// fmin 0.0.4's shrink step assigns an undeclared loop variable `i` in strict code (ReferenceError when a
// shrink happens); a global `i` makes that assignment legal without touching the library.
(globalThis as unknown as { i: number }).i = 0;
// eslint-disable-next-line @typescript-eslint/no-require-imports
export const nelderMead = (require("fmin") as { nelderMead: (f: (x: number[]) => number, x0: number[], o?: NelderMeadOptions) => NelderMeadResult }).nelderMead;
// eslint-disable-next-line @typescript-eslint/no-require-imports
export const jStatChiSquare = (require("jstat") as { jStat: { chisquare: { cdf(x: number, dof: number): number } } }).jStat.chisquare;
