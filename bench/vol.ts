/**
 * Volatility benchmark (plain node; nothing asserted):
 *  1. GARCH(1,1) fit cost in likelihood passes on the DEM/GBP series (fixture from R fGarch, test/fixtures/fgarch),
 *     normal and generalized-normal innovations (target ≤ 40 passes).
 *  2. Time per fit against R fGarch garchFit on the same data, timed inside R (no start-up), when Rscript and
 *     fGarch are installed; "skipped" otherwise (target ≥ 20× faster).
 *  3. Rolling GARCH forecasts over 2,500 rows with a 1,000-return window: warm-started refits vs cold ones, on an
 *     invented, simulated scenario (GARCH(1,1) with skewed generalized-normal innovations, seed 2026).
 */
import { spawnSync } from "node:child_process";
import * as fs from "node:fs";
import * as path from "node:path";
import { createModel, rollingForecasts } from "../src/core/risk";
import { fitGarch } from "../src/core/vol";
import { runToEnd } from "../src/core/work";
import { simulateGarch } from "../test/core/vol/simulate";

function rPerFitSeconds(): number | null {
  const which = spawnSync("sh", ["-c", "command -v Rscript"], { encoding: "utf8" });
  if (which.status !== 0 || !which.stdout.trim()) return null;
  const script = [
    "suppressMessages(library(fGarch)); data(dem2gbp); r <- as.numeric(dem2gbp[,1])",
    "garchFit(~garch(1,1), data=r, include.mean=TRUE, cond.dist='norm', trace=FALSE)",
    "t <- proc.time()[['elapsed']]; for (i in 1:10) garchFit(~garch(1,1), data=r, include.mean=TRUE, cond.dist='norm', trace=FALSE)",
    "cat((proc.time()[['elapsed']] - t)/10)",
  ].join("; ");
  const out = spawnSync("Rscript", ["-e", script], { encoding: "utf8", timeout: 120_000 });
  const v = Number(out.stdout.trim().split(/\s+/).pop());
  return out.status === 0 && Number.isFinite(v) && v > 0 ? v : null;
}

export function run(print: (line: string) => void): void {
  const fixture = JSON.parse(fs.readFileSync(path.join(__dirname, "../test/fixtures/fgarch/dem2gbp.json"), "utf8")) as { returns: number[] };
  const dem = Float64Array.from(fixture.returns);
  for (const innovations of ["normal", "gno"] as const) {
    const f = fitGarch(dem, { innovations });
    print(`vol: GARCH(1,1) ${innovations} innovations on DEM/GBP (n = ${dem.length}): ${f.passes} likelihood passes (target ≤ 40), ${f.iterations} BFGS iterations, converged ${f.converged}`);
  }
  for (let i = 0; i < 5; i++) fitGarch(dem, { innovations: "normal" }); // JIT warm-up
  const reps = 50;
  const t0 = performance.now();
  for (let i = 0; i < reps; i++) fitGarch(dem, { innovations: "normal" });
  const ours = (performance.now() - t0) / reps / 1000;
  const r = rPerFitSeconds();
  if (r === null) print(`vol: vs R fGarch garchFit: skipped (Rscript with fGarch not found); ours ${(ours * 1000).toFixed(2)} ms per fit`);
  else print(`vol: vs R fGarch garchFit on DEM/GBP: ours ${(ours * 1000).toFixed(2)} ms, fGarch ${(r * 1000).toFixed(1)} ms per fit; ${(r / ours).toFixed(0)}× faster (target ≥ 20×)`);

  const window = 1000;
  const rows = 2500;
  const sim = simulateGarch({ mu: 0.0003, omega: 2e-6, alpha: 0.09, beta: 0.89, k: 0.25 }, window + rows, 2026).returns;
  const warmModel = createModel("garch") as ReturnType<typeof createModel> & { counters: { passes: number } };
  const coldModel = createModel("garch", { warmStart: false }) as ReturnType<typeof createModel> & { counters: { passes: number } };
  const t1 = performance.now();
  const warm = runToEnd(rollingForecasts(sim, window, warmModel));
  const t2 = performance.now();
  const cold = runToEnd(rollingForecasts(sim, window, coldModel));
  const t3 = performance.now();
  let maxDiff = 0;
  for (let t = window; t < sim.length; t++) {
    const a = warm.laws[t]?.valueAtRisk(0.99, "long");
    const b = cold.laws[t]?.valueAtRisk(0.99, "long");
    if (a !== undefined && b !== undefined) maxDiff = Math.max(maxDiff, Math.abs(a - b) / Math.abs(b));
  }
  print(`vol: rolling GARCH, ${rows} rows × window ${window}`);
  print(`  warm-started: ${(t2 - t1).toFixed(0)} ms, ${warmModel.counters.passes} likelihood passes (${(warmModel.counters.passes / rows).toFixed(1)} per row), ${warm.failedRows.length} rows without forecast`);
  print(`  cold:         ${(t3 - t2).toFixed(0)} ms, ${coldModel.counters.passes} likelihood passes (${(coldModel.counters.passes / rows).toFixed(1)} per row), ${cold.failedRows.length} rows without forecast`);
  print(`  warm/cold time ratio: ${((t2 - t1) / (t3 - t2)).toFixed(3)}; max relative 99% VaR difference ${maxDiff.toExponential(2)}`);
}

if (require.main === module) run(console.log);
