/**
 * Prints the worked example of docs/notes/esbt.md: an invented desk, simulated (500 days, Laplace tails with a
 * volatility cycle; the ES column's mean excess beyond VaR is 20% short). Not a benchmark: no run() export.
 * Run: npx ts-node --transpile-only scripts/es-example.ts
 */
import { shortfallZ, z2PValueMatchedTails } from "../src/core/risk/backtests/shortfallZ";
import { exceedanceResiduals, exceedanceResidualTest } from "../src/core/risk/backtests/exceedanceResiduals";
import { multinomialTest } from "../src/core/risk/backtests/multinomial";
import { tailLikelihoodTest } from "../src/core/risk/backtests/tailLikelihood";
import { shortfallTrafficLight } from "../src/core/risk/backtests/shortfallLight";
import { deskTest } from "../src/core/risk/backtests/desk";
import { attributionTest } from "../src/core/risk/backtests/attribution";
import { esBacktestRows } from "../src/functions/tables/esBacktest";
import { deskRows, attributionRows } from "../src/functions/tables/desk";
import { uniformStream } from "../src/core/random";
import { runToEnd } from "../src/core/work";
// Invented desk, simulated: 500 days, Laplace returns with a volatility cycle; the forecast is told a 20% thinner tail.
const T = 500, next = uniformStream(2026);
const x: number[] = [], v: number[] = [], e: number[] = [], pit: number[] = [], v99: number[] = [], rt: number[] = [];
for (let t = 0; t < T; t++) {
  const s = 0.008 * (1 + 0.5 * Math.sin(t / 30));
  const u = next();
  const r = u < 0.5 ? s * Math.log(2 * u) : -s * Math.log(2 * (1 - u));
  x.push(r * 1e6); // P&L in currency units
  const q = -s * Math.log(0.05);
  v.push(q * 1e6); e.push((q + 0.8 * s) * 1e6); // ES understated: the tail beyond VaR is 20% too short
  pit.push(u < 0.025 ? 0.025 * Math.pow(u / 0.025, 1 / 0.8) : u);
  v99.push(-s * Math.log(0.02) * 1e6);
  rt.push(r * 1e6 * 0.95 + (next() - 0.5) * s * 0.6e6);
}
const z = shortfallZ(x, v, e, 0.975)!;
const parts = { z, z2PValue: runToEnd(z2PValueMatchedTails(z.z2, v, e, 0.975, 999, 20141)),
  residuals: runToEnd(exceedanceResidualTest(exceedanceResiduals(x, v, e).residuals, 999, 2000)),
  pit: { multinomial: multinomialTest(pit, 0.975)!, tail: tailLikelihoodTest(pit, 0.975)!, light: shortfallTrafficLight(pit, 0.975)! } };
for (const r of esBacktestRows(parts)) console.log(r[0], "|", typeof r[1] === "number" ? +r[1].toPrecision(4) : r[1]);
console.log("---");
for (const r of deskRows(deskTest(x, v99, v)!)) console.log(r[0], "|", r[1]);
console.log("---");
for (const r of attributionRows(attributionTest(x, rt)!)) console.log(r[0], "|", typeof r[1] === "number" ? +r[1].toPrecision(4) : r[1]);
