/**
 * Reference methods: what HISTVAR's sort costs (equal weights vs age weights, and at the 100,000-return bound
 * against a full column), and one rolling window of each reference model against the generalized-normal window fit.
 * Ratios measured side by side in one run; nothing asserted. Returns are simulated (invented data).
 */
import { historicalTail } from "../src/core/methods";
import { normalQuantile } from "../src/core/normal";
import { uniformStream } from "../src/core/random";
import { createModel, rollingForecasts } from "../src/core/risk";
import { runToEnd } from "../src/core/work";

function simulated(n: number, seed: number): Float64Array {
  const u = uniformStream(seed);
  return Float64Array.from({ length: n }, () => 0.01 * normalQuantile(u()));
}

function ms(f: () => void, repeat = 3): number {
  let best = Infinity;
  for (let i = 0; i < repeat; i++) {
    const t0 = process.hrtime.bigint();
    f();
    best = Math.min(best, Number(process.hrtime.bigint() - t0) / 1e6);
  }
  return best;
}

export function run(print: (line: string) => void): void {
  const bound = simulated(100_000, 1);
  const column = simulated(1_048_576, 2);
  const equal = ms(() => historicalTail(bound, 0.99, "long"));
  const aged = ms(() => historicalTail(bound, 0.99, "long", 0.98));
  const full = ms(() => historicalTail(column, 0.99, "long"), 1);
  print(`HISTVAR at the 100,000 bound: equal weights ${equal.toFixed(0)} ms, age weights ${aged.toFixed(0)} ms (×${(aged / equal).toFixed(1)})`);
  print(`a full column (1,048,576) with equal weights: ${full.toFixed(0)} ms (×${(full / equal).toFixed(1)} the bound) — why the bound exists`);
  const r = simulated(1_250, 3);
  const base = ms(() => runToEnd(rollingForecasts(r, 250, createModel("iid"))), 1);
  for (const m of ["hs", "normal", "cf", "fhs"]) {
    const t = ms(() => runToEnd(rollingForecasts(r, 250, createModel(m))), 1);
    print(`rolling 1,000 rows × window 250, "${m}": ${t.toFixed(0)} ms (×${(t / base).toFixed(3)} of "iid", ${base.toFixed(0)} ms)`);
  }
}
