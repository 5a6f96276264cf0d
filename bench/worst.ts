/**
 * Worst cases of the heavy paths, timed in plain node (never under jest): a fit with one wild outlier, GOF on
 * data whose refits fail, COMPARE on a large sample. Prints milliseconds; nothing is asserted.
 * Data are simulated (seeded core sampler).
 */
import { sample } from "../src/core/gno";
import { fitGno } from "../src/core/fit";
import { compareFamilies } from "../src/core/compare";
import { testGnoFitted } from "../src/core/gof";

function time<T>(label: string, f: () => T): T {
  const t0 = process.hrtime.bigint();
  const r = f();
  const ms = Number(process.hrtime.bigint() - t0) / 1e6;
  console.log(`${label.padEnd(48)} ${ms.toFixed(0).padStart(8)} ms`);
  return r;
}

const only = process.argv[2] ?? "all";
const law = { location: 0, scale: 0.01, shape: -0.1 };

if (only === "all" || only === "outlier") {
  for (const n of [100_000, 1_000_000]) {
    const x = sample(law, n, 7);
    x[n >> 1] = 1e10;
    const f = time(`fit, one 1e10 outlier among ${n}`, () => fitGno(x));
    console.log("   ", f.regular, f.reason.slice(0, 90));
  }
}
if (only === "all" || only === "gof") {
  // degenerate: the fitted law's refits keep failing (ridge sample: a tight cluster plus one far point)
  const n = 2000;
  const x = sample(law, n, 11);
  x[0] = 1e10;
  const r = time(`gof bootstrap, outlier data n=${n}, 199 resamples`, () => testGnoFitted(x, { resamples: 199 }));
  console.log("   ", r.usedResamples, r.failedRefits, r.stoppedEarly);
}
if (only === "all" || only === "compare") {
  for (const n of [100_000, 1_000_000]) {
    const x = sample(law, n, 13);
    const f = fitGno(x);
    time(`compare ${n}`, () => compareFamilies(x, f));
  }
}
