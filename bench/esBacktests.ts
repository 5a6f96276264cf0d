/**
 * Speed of the ES backtests at the cell function's bound (20,000 rows), measured side by side and printed as
 * ratios (never asserted): Z1/Z2 alone (one pass), the simulated Z2 p-value with 999 replicates, the residual
 * bootstrap with 999 resamples, and the three PIT tests. The largest single Work step is printed too (the time
 * between two yields, which bounds how long the host waits in one slice).
 * Data: an invented, simulated return series (Laplace tails with a volatility cycle), labelled as such.
 * Run alone: npx ts-node --transpile-only bench/esBacktests.ts
 */
import { shortfallZ, z2PValueMatchedTails } from "../src/core/risk/backtests/shortfallZ";
import { exceedanceResiduals, exceedanceResidualTest } from "../src/core/risk/backtests/exceedanceResiduals";
import { multinomialTest } from "../src/core/risk/backtests/multinomial";
import { tailLikelihoodTest } from "../src/core/risk/backtests/tailLikelihood";
import { shortfallTrafficLight } from "../src/core/risk/backtests/shortfallLight";
import { uniformStream } from "../src/core/random";
import type { Work } from "../src/core/work";

function time(f: () => unknown, repeat = 1): number {
  const t0 = process.hrtime.bigint();
  for (let i = 0; i < repeat; i++) f();
  return Number(process.hrtime.bigint() - t0) / 1e6 / repeat;
}

/** Runs a Work to the end; returns [total ms, longest step ms]. */
function drive<T>(w: Work<T>): [number, number] {
  let longest = 0;
  const t0 = process.hrtime.bigint();
  let last = t0;
  for (;;) {
    const r = w.next();
    const now = process.hrtime.bigint();
    longest = Math.max(longest, Number(now - last) / 1e6);
    last = now;
    if (r.done) break;
  }
  return [Number(last - t0) / 1e6, longest];
}

export function run(print: (line: string) => void): void {
  const T = 20_000;
  const next = uniformStream(77); // simulated demo series, not market data
  const x = new Float64Array(T);
  const v = new Float64Array(T);
  const e = new Float64Array(T);
  const pit = new Float64Array(T);
  for (let t = 0; t < T; t++) {
    const s = 0.008 * (1 + 0.5 * Math.sin(t / 30));
    const u = next();
    x[t] = u < 0.5 ? s * Math.log(2 * u) : -s * Math.log(2 * (1 - u));
    v[t] = -s * Math.log(0.05);
    e[t] = v[t] + s;
    pit[t] = u;
  }
  const zMs = time(() => shortfallZ(x, v, e, 0.975), 5);
  const z = shortfallZ(x, v, e, 0.975)!;
  const [simMs, simStep] = drive(z2PValueMatchedTails(z.z2, v, e, 0.975, 999, 1));
  const res = exceedanceResiduals(x, v, e).residuals;
  const [bootMs, bootStep] = drive(exceedanceResidualTest(res, 999, 2));
  const pitMs = time(() => {
    multinomialTest(pit, 0.975);
    tailLikelihoodTest(pit, 0.975);
    shortfallTrafficLight(pit, 0.975);
  }, 3);
  print(`es backtests (T=${T}): Z1/Z2 pass                 ${zMs.toFixed(2)} ms`);
  print(`es backtests: simulated Z2 p-value (999)        ${simMs.toFixed(0)} ms  (${(simMs / zMs).toFixed(0)}× one pass; longest step ${simStep.toFixed(2)} ms)`);
  print(`es backtests: residual bootstrap (999, n=${res.length})  ${bootMs.toFixed(0)} ms  (longest step ${bootStep.toFixed(2)} ms)`);
  print(`es backtests: multinomial + tail LR + ES light  ${pitMs.toFixed(2)} ms  (${(pitMs / zMs).toFixed(1)}× the Z pass)`);
}

if (require.main === module) run((l) => console.log(l));
