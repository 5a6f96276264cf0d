/**
 * Pane responsiveness: the analysis runs as steps with a pause between them, so the page can repaint and take a
 * Cancel click between steps, and the model comparison runs in a Web Worker (off the page). What matters is the
 * longest single step on the page (how long it is unresponsive at worst) against the whole run, and how long the
 * background comparison takes. Measured side by side on the simulated demo law at three sizes; printed, never
 * asserted. Run alone: npx ts-node --transpile-only bench/pane.ts
 */
import { performance } from "node:perf_hooks";
import { analyse } from "../src/taskpane/analysis";
import { compareLikeTheCell } from "../src/taskpane/worker";
import { runToEnd } from "../src/core/work";
import { sample } from "../src/core/gno";
import { DEMO } from "../src/taskpane/demo";

export function run(print: (line: string) => void): void {
  void runAsync(print);
}

async function runAsync(print: (line: string) => void): Promise<void> {
  print("pane: longest blocking step vs the page's whole analysis (fit, risk, bootstrap GOF in chunks); comparison off the page");
  for (const n of [750, 10_000, 100_000]) {
    const data = sample(DEMO.params, n, 99);
    const steps: Array<{ step: string; ms: number }> = [];
    let last = performance.now();
    let current = "start";
    let compareMs = 0;
    const t0 = last;
    await analyse(data, "mle", {
      compare: (x) => {
        const t = performance.now();
        const c = runToEnd(compareLikeTheCell(x));
        compareMs = performance.now() - t;
        last += compareMs; // worker time: not page time
        return Promise.resolve(c);
      },
      onProgress: (p) => {
        const now = performance.now();
        steps.push({ step: current, ms: now - last });
        last = now;
        current = p.step;
      },
      pause: () => Promise.resolve(),
    });
    const total = performance.now() - t0 - compareMs;
    const worst = steps.reduce((a, b) => (b.ms > a.ms ? b : a));
    print(
      `  n=${n}: whole ${total.toFixed(0)} ms in ${steps.length} steps; longest step "${worst.step}" ${worst.ms.toFixed(0)} ms ` +
        `= ${(worst.ms / total).toFixed(3)} of the page's work, ${(worst.ms / 16.7).toFixed(1)}× a 60 Hz frame; ` +
        `comparison in the worker ${compareMs.toFixed(0)} ms (${(compareMs / total).toFixed(2)}× the page's work)`,
    );
  }
}

if (require.main === module) run(console.log);
