/**
 * Longest stretch of work between two yields of the resumable fits, timed in plain node (never under jest): FIT's
 * Work (fitGnoCachedWork) on 1,000,000 points with and without one 1e10 outlier, COMPARE's Work on 100,000 rows,
 * and the Johnson SU Work alone on 10,000 rows. Prints total time, number of yields and the longest and
 * 99th-percentile stretch in milliseconds; nothing is asserted. Data are simulated (seeded core sampler).
 * Usage: npx ts-node --transpile-only bench/stretch.ts [fit|outlier|compare|su|small|tails]
 */
import { sample } from "../src/core/gno";
import { clearFitCache, fitGnoCachedWork, fitGnoWork } from "../src/core/fit";
import { compareFamiliesWork, fitJohnsonSuWork } from "../src/core/compare";
import { fitSplicedWork } from "../src/core/pareto";
import type { Work } from "../src/core/work";

function stretches<T>(label: string, work: Work<T>): T {
  const gaps: number[] = [];
  const t0 = process.hrtime.bigint();
  let last = t0;
  for (;;) {
    const r = work.next();
    const now = process.hrtime.bigint();
    gaps.push(Number(now - last) / 1e6);
    last = now;
    if (r.done) {
      const total = Number(now - t0) / 1e6;
      const sorted = [...gaps].sort((a, b) => a - b);
      const p99 = sorted[Math.min(sorted.length - 1, Math.floor(0.99 * sorted.length))];
      const at = gaps.indexOf(sorted[sorted.length - 1]);
      console.log(
        `${label.padEnd(46)} total ${total.toFixed(0).padStart(6)} ms  yields ${String(gaps.length - 1).padStart(5)}  longest ${sorted[sorted.length - 1].toFixed(1).padStart(6)} ms  p99 ${p99.toFixed(1).padStart(6)} ms  (longest is step ${at} of ${gaps.length})`,
      );
      return r.value;
    }
  }
}

const only = process.argv[2] ?? "all";
const law = { location: 0, scale: 0.01, shape: -0.1 };
const want = (k: string) => only === "all" || only === k;

if (want("fit")) {
  clearFitCache();
  const x = sample(law, 1_000_000, 7);
  const f = stretches("FIT work, 1,000,000 simulated points", fitGnoCachedWork(x, "mle"));
  console.log("   ", f.regular, f.reason.slice(0, 90));
}
if (want("outlier")) {
  for (const n of [100_000, 1_000_000]) {
    clearFitCache();
    const x = sample(law, n, 7);
    x[n >> 1] = 1e10;
    const f = stretches(`FIT work, ${n} points, one 1e10 outlier`, fitGnoCachedWork(x, "mle"));
    console.log("   ", f.regular, f.reason.slice(0, 90));
  }
}
if (want("small")) {
  for (const n of [2_000, 20_000]) {
    const x = sample(law, n, 7);
    x[n >> 1] = 1e10;
    const f = stretches(`fit work, ${n} points, one 1e10 outlier`, fitGnoWork(x));
    console.log("   ", f.regular, f.iterations, f.reason.slice(0, 60));
  }
}
if (want("compare")) {
  clearFitCache();
  const x = sample(law, 100_000, 13);
  const c = stretches("COMPARE work, 100,000 simulated rows", compareFamiliesWork(x));
  console.log("   ", c.best);
}
if (want("su")) {
  const x = sample(law, 10_000, 17);
  const s = stretches("Johnson SU work, 10,000 simulated rows", fitJohnsonSuWork(x));
  console.log("   ", s.converged, s.params.delta.toPrecision(4));
}
if (want("tails")) {
  // the spliced fit as TAILFIT drives it: the full-data body fit (cached Work), then fitSplicedWork
  for (const [n, outlier] of [[1_000_000, false], [100_000, true], [1_000_000, true]] as const) {
    clearFitCache();
    const x = sample(law, n, 7);
    if (outlier) x[n >> 1] = 1e10;
    const f = stretches(
      `TAILFIT work, ${n} points${outlier ? ", one 1e10 outlier" : ""}`,
      (function* () {
        const body = yield* fitGnoCachedWork(x, "mle");
        return yield* fitSplicedWork(x, { sides: "both", body });
      })(),
    );
    console.log("   ", f.bodyMethod, f.params.body.shape.toPrecision(4), f.lower?.fit.params.shape.toPrecision(4));
  }
}
