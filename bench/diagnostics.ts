/**
 * Speed of the diagnostics, measured side by side in one run and printed as ratios (never asserted):
 * - GOF with 199 bootstrap resamples on 1,000 points, against one full fit and one quick fit of the same data;
 * - the exact-parameter GOF on the same data;
 * - COMPARE on 1,859 points (each family's fit timed).
 * Data: an invented, simulated return series (generalized normal, shape −0.3), labelled as such.
 * Run alone: npx ts-node --transpile-only bench/diagnostics.ts
 */
import { compareFamilies, fitAsymmetricLaplace, fitJohnsonSu, fitNormal, fitStudentT } from "../src/core/compare";
import { clearFitCache, fitGno, fitGnoQuick } from "../src/core/fit";
import { sample } from "../src/core/gno";
import { testGnoFitted, testGnoSpecified } from "../src/core/gof";

function time(f: () => unknown, repeat = 1): number {
  const t0 = process.hrtime.bigint();
  for (let i = 0; i < repeat; i++) f();
  return Number(process.hrtime.bigint() - t0) / 1e6 / repeat;
}

export function run(print: (line: string) => void): void {
  const truth = { location: 0.0004, scale: 0.011, shape: -0.3 };
  const x1000 = sample(truth, 1000, 2024); // simulated demo series, not market data
  const x1859 = sample(truth, 1859, 2025);
  const fitMs = time(() => fitGno(x1000), 5);
  const fit = fitGno(x1000);
  const quickMs = time(() => fitGnoQuick(x1000, { start: fit.params }), 5);
  const exactMs = time(() => testGnoSpecified(x1000, truth), 5);
  const gofMs = time(() => testGnoFitted(x1000, { resamples: 199, fit }));
  print(`diagnostics: one full fit (n=1000)        ${fitMs.toFixed(2)} ms`);
  print(`diagnostics: one quick fit (n=1000)       ${quickMs.toFixed(2)} ms`);
  print(`diagnostics: GOF exact, given params      ${exactMs.toFixed(2)} ms  (${(exactMs / fitMs).toFixed(2)}× one fit)`);
  print(`diagnostics: GOF bootstrap 199 (n=1000)   ${gofMs.toFixed(0)} ms  (${(gofMs / fitMs).toFixed(0)}× one full fit, ${(gofMs / quickMs).toFixed(0)}× one quick fit)`);
  print(`diagnostics: bootstrap work per point-resample ${((gofMs / (199 * 1000)) * 1e3).toFixed(2)} µs`);
  clearFitCache();
  const cmpMs = time(() => compareFamilies(x1859));
  const parts: Array<[string, () => unknown]> = [
    ["normal", () => fitNormal(x1859)],
    ["student t", () => fitStudentT(x1859)],
    ["asym. Laplace", () => fitAsymmetricLaplace(x1859)],
    ["Johnson SU", () => fitJohnsonSu(x1859)],
    ["gen. normal", () => fitGno(x1859)],
  ];
  print(`diagnostics: COMPARE (n=1859)             ${cmpMs.toFixed(1)} ms`);
  for (const [name, f] of parts) {
    const ms = time(f, 3);
    print(`diagnostics:   ${name.padEnd(14)} ${ms.toFixed(2)} ms  (${((100 * ms) / cmpMs).toFixed(0)}% of COMPARE)`);
  }
}

if (require.main === module) run(console.log);
