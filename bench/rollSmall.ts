/**
 * Rolling "iid" with very small windows, in plain node (no jest sandbox): time per row and where it goes.
 * Data: seeded simulated returns (an invented scenario). Run: npx ts-node --transpile-only bench/rollSmall.ts [rows] [window] [method]
 */
import { sample } from "../src/core/gno";
import { rollingModelForecasts } from "../src/core/risk/rolling/rolling";
import { runToEnd } from "../src/core/work";

const rows = Number(process.argv[2] ?? 20000);
const window = Number(process.argv[3] ?? 10);
const method = process.argv[4] ?? "mle";
const x = sample({ location: 0.0004, scale: 0.011, shape: -0.12 }, rows, 2031);
const t0 = performance.now();
const run = runToEnd(rollingModelForecasts(x, window, "iid", { method }));
const t = performance.now() - t0;
console.log(`iid ${method}, ${rows} rows, window ${window}: ${t.toFixed(0)} ms (${((t / Math.max(1, run.attempted)) * 1000).toFixed(1)} µs/row); forecasts ${run.forecasts}, flagged ${run.flaggedRows.length}, failed ${run.failedRows.length}`);
