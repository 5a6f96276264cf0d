/**
 * Large and slow inputs: time and heap for the biggest inputs a desk sends, measured side by side in one run and
 * printed as ratios (never asserted; the machine is shared and noisy).
 *
 *  - fits on 1,000,000 points (core and through the BUILT bundle with a 1,000,000-row host range), against one
 *    log-likelihood pass over the same points;
 *  - ROLLVAR over 10,000 rows (window 250), against one lean fit of a 250-point window;
 *  - element-wise CDF/PDF/QUANTILE over 100,000 cells through the bundle, against the core loop.
 * Heap growth is process.memoryUsage() heapUsed + arrayBuffers after minus before (a rough upper bound: the
 * collector may not have run). Data: seeded draws of the law, an invented, simulated scenario.
 * Run alone: npx ts-node --transpile-only bench/large.ts [quick]
 */
import { sample, cdf, type GnoParams } from "../src/core/gno";
import { fitGno, fitGnoQuick, logLikelihood, clearFitCache } from "../src/core/fit";
import * as fs from "node:fs";
import * as path from "node:path";
import { distDir } from "../test/host/harness";
import { loadFastBundle, type FastBundle } from "./lib/fastBundle";

const PARAMS: GnoParams = { location: 0.0004, scale: 0.011, shape: -0.12 };

function heap(): number {
  const m = process.memoryUsage();
  return m.heapUsed + m.arrayBuffers;
}
const mb = (bytes: number) => `${(bytes / 2 ** 20).toFixed(1)} MB`;
const ms = (t: number) => `${t.toFixed(t < 10 ? 2 : 0)} ms`;

/** Best of `reps` runs (ms) and the heap growth of the first run. */
function time<T>(reps: number, f: () => T): { ms: number; heap: number; value: T } {
  const gc = (globalThis as { gc?: () => void }).gc;
  gc?.();
  const h0 = heap();
  let t0 = performance.now();
  let value = f();
  let best = performance.now() - t0;
  const grown = heap() - h0;
  for (let i = 1; i < reps; i++) {
    t0 = performance.now();
    value = f();
    best = Math.min(best, performance.now() - t0);
  }
  return { ms: best, heap: grown, value };
}

/** One run of an asynchronous call, timed to its settled result, with its heap growth. */
async function timeAsync<T>(f: () => Promise<T>): Promise<{ ms: number; heap: number; value: T }> {
  const gc = (globalThis as { gc?: () => void }).gc;
  gc?.();
  const h0 = heap();
  const t0 = performance.now();
  const value = await f();
  return { ms: performance.now() - t0, heap: heap() - h0, value };
}

type Call = (id: string, ...args: unknown[]) => unknown;

/**
 * The built dist/functions.js compiled in this process (bench/lib/fastBundle.ts: plain global lookups, unlike the
 * node:vm sandbox of the host tests, which slows hot loops 6–18×); null when not built.
 */
function loadBuilt(): FastBundle | null {
  if (!fs.existsSync(path.join(distDir, "functions.js"))) return null;
  return loadFastBundle();
}

export async function run(print: (line: string) => void, quick = false): Promise<void> {
  const N = quick ? 100_000 : 1_000_000;
  const ROLL_ROWS = quick ? 1_000 : 10_000;
  const CELLS = 100_000;
  const WINDOW = 250;

  const x = sample(PARAMS, N, 2024);
  print(`data: ${N.toLocaleString("en-US")} seeded draws of the law (simulated), params ${JSON.stringify(PARAMS)}`);

  // ── fits on N points ──────────────────────────────────────────────────────────────────────────
  const ll = time(3, () => logLikelihood(x, PARAMS));
  print(`one log-likelihood pass over ${N.toLocaleString("en-US")} points: ${ms(ll.ms)} (${((ll.ms * 1e6) / N).toFixed(1)} ns/point)`);
  for (const method of ["mle", "lmom"] as const) {
    clearFitCache();
    const f = time(1, () => fitGno(x, { method }));
    print(
      `fitGno ${method} on ${N.toLocaleString("en-US")} points: ${ms(f.ms)} = ${(f.ms / ll.ms).toFixed(1)}× one likelihood pass; ` +
        `heap +${mb(f.heap)} (${(f.heap / N).toFixed(1)} B/point); converged ${f.value.converged}, ${f.value.iterations} iterations`,
    );
  }
  const q = time(1, () => fitGnoQuick(x));
  print(`fitGnoQuick on ${N.toLocaleString("en-US")} points: ${ms(q.ms)} = ${(q.ms / ll.ms).toFixed(1)}× one likelihood pass`);

  const b = loadBuilt();
  if (!b) {
    print("built bundle not loaded (run `npx webpack --mode production` first): host-path rows skipped");
    return;
  }
  const hostGrid = time(1, () => Array.from(x, (v) => [v]));
  print(`host range of ${N.toLocaleString("en-US")} rows (number[][] as the host passes it): built in ${ms(hostGrid.ms)}, heap +${mb(hostGrid.heap)} (${(hostGrid.heap / N).toFixed(0)} B/row)`);
  clearFitCache();
  // FIT and FITREPORT are asynchronous (time-sliced, cancelable): timed to the settled result, slices included
  const viaHost = await timeAsync(() => b.run("FIT", hostGrid.value));
  const coreFit = time(1, () => fitGno(x));
  print(
    `ASKEW.FIT through the bundle on ${N.toLocaleString("en-US")} rows: ${ms(viaHost.ms)} = ${(viaHost.ms / coreFit.ms).toFixed(2)}× the core fit, ` +
      `${(viaHost.ms / ll.ms).toFixed(1)}× one likelihood pass; heap +${mb(viaHost.heap)}; result ${JSON.stringify(viaHost.value).slice(0, 80)}`,
  );
  const report = await timeAsync(() => b.run("FITREPORT", hostGrid.value));
  print(`ASKEW.FITREPORT on the same rows (cached fit): ${ms(report.ms)} = ${(report.ms / viaHost.ms).toFixed(2)}× ASKEW.FIT`);
  hostGrid.value.length = 0;

  // ── rolling VaR ───────────────────────────────────────────────────────────────────────────────
  const r = Array.from(x.subarray(0, ROLL_ROWS), (v) => [v]);
  const one = time(3, () => fitGnoQuick(x.subarray(0, WINDOW)));
  for (const method of ["mle", "lmom"] as const) {
    // ROLLVAR is asynchronous (time-sliced, cancelable): timed to the settled result, slices and yields included
    const h0 = heap();
    const t0 = performance.now();
    await b.run("ROLLVAR", r, WINDOW, 0.99, null, method);
    const roll = { ms: performance.now() - t0, heap: heap() - h0 };
    const fits = ROLL_ROWS - WINDOW;
    print(
      `ASKEW.ROLLVAR ${method}, ${ROLL_ROWS.toLocaleString("en-US")} rows, window ${WINDOW}: ${ms(roll.ms)} (${(roll.ms / fits).toFixed(2)} ms per window) = ` +
        `${(roll.ms / fits / one.ms).toFixed(2)}× one cold lean fit of ${WINDOW} points (${ms(one.ms)}); heap +${mb(roll.heap)}`,
    );
  }

  // ── element-wise over 100,000 cells ───────────────────────────────────────────────────────────
  const cells = Array.from(x.subarray(0, CELLS), (v) => [v]);
  const square = Array.from({ length: 316 }, (_, i) => Array.from(x.subarray(i * 316, i * 316 + 316)));
  const params = [[PARAMS.location], [PARAMS.scale], [PARAMS.shape]];
  const coreLoop = time(3, () => {
    let s = 0;
    for (let i = 0; i < CELLS; i++) s += cdf(x[i], PARAMS);
    return s;
  });
  for (const id of ["CDF", "PDF"]) {
    const t = time(3, () => b.call(id, cells, params));
    print(`ASKEW.${id} over ${CELLS.toLocaleString("en-US")} cells (column): ${ms(t.ms)} = ${(t.ms / coreLoop.ms).toFixed(1)}× the core cdf loop (${ms(coreLoop.ms)}); heap +${mb(t.heap)}`);
  }
  const sq = time(3, () => b.call("CDF", square, params));
  print(`ASKEW.CDF over 316×316 = 99,856 cells (2-D): ${ms(sq.ms)} = ${(sq.ms / coreLoop.ms).toFixed(1)}× the core loop`);
  const probs = cells.map(([v]) => [cdf(v as number, PARAMS)]);
  const qt = time(3, () => b.call("QUANTILE", probs, params));
  print(`ASKEW.QUANTILE over ${CELLS.toLocaleString("en-US")} cells: ${ms(qt.ms)} = ${(qt.ms / coreLoop.ms).toFixed(1)}× the core cdf loop`);
  const big = time(1, () => b.call("RANDOM", params, 1_000_000, 1) as unknown[][]);
  print(`ASKEW.RANDOM 1,000,000 draws: ${ms(big.ms)}, heap +${mb(big.heap)} (${(big.heap / 1e6).toFixed(0)} B/cell for the n×1 result)`);
}

if (require.main === module) void run(console.log, process.argv.includes("quick"));
