/**
 * Typed view of fmin 0.0.4's Nelder–Mead, an independent derivative-free optimizer used as an outside check of
 * our maximum-likelihood fits (the package ships no type declarations).
 * fmin 0.0.4's shrink step assigns an undeclared loop variable `i` (a ReferenceError in strict code when a shrink
 * happens); a global `i` makes that assignment legal without touching the library. It also declares
 * "type": "module" but ships a UMD build: under plain node (the bench) the build attaches itself to
 * globalThis.fmin instead of the module's exports (under jest it fills the exports), so read whichever is set.
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
(globalThis as unknown as { i: number }).i = 0;
type NelderMead = (f: (x: number[]) => number, x0: number[], o?: NelderMeadOptions) => NelderMeadResult;
// eslint-disable-next-line @typescript-eslint/no-require-imports
const fminModule = require("fmin") as { nelderMead?: NelderMead };
export const nelderMead: NelderMead = fminModule.nelderMead ?? (globalThis as unknown as { fmin: { nelderMead: NelderMead } }).fmin.nelderMead;
