import { fitGno, fusedPassCount, likelihoodDerivatives } from "../../src/core/fit";
import * as fs from "node:fs";
function best(f: () => unknown, reps: number) { let b = Infinity; for (let i = 0; i < reps; i++) { const t = performance.now(); f(); b = Math.min(b, performance.now() - t); } return b; }
for (const n of [1859, 100000, 1000000]) {
  const x = new Float64Array(fs.readFileSync(`/tmp/x${n}.f64`).buffer.slice(0));
  const reps = n < 10000 ? 300 : 5;
  const c0 = fusedPassCount();
  const f = fitGno(x);
  console.log(n, "fit", best(() => fitGno(x), reps).toFixed(3), "ll", f.logLikelihood, "it", f.iterations, "passes", fusedPassCount() - c0,
    "pass", best(() => likelihoodDerivatives(x, f.params.location, Math.log(f.params.scale), f.params.shape), reps).toFixed(3));
}
