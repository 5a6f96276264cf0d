/**
 * Horizon benchmark (plain node; nothing asserted). Data: invented, simulated scenarios only.
 * 1. Exact 10-day VaR/ES of the i.i.d. sum (core of ASKEW.VAR/ES with horizon 10) vs a seeded 10⁶-path simulation
 *    of the same sum: time ratio (target ≥ 100×) and the simulation's standard error beside the exact figure's
 *    error bound (≤ 1e-8 relative, measured against direct integration at h = 2 in the tests). The simulated
 *    exceedance rate at the exact VaR is reported in standard errors (the full 10⁶-path check of the tests).
 * 2. HORIZON with GARCH(1,1): 10 days, 100,000 paths, against one GARCH(1,1) fit to 1,500 simulated returns.
 */
import { sample } from "../src/core/gno";
import { horizonLaw, simulatedTail, simulateSums } from "../src/core/risk/horizons";
import { normalQuantile } from "../src/core/normal";
import { uniformStream } from "../src/core/random";
import { fitVolatility, innovationLaw } from "../src/core/vol";
import { reducedQuantile } from "../src/core/gno";
import { runToEnd } from "../src/core/work";

function exactVsSimulated(print: (line: string) => void): void {
  const h = 10;
  const n = 1_000_000;
  const c = 0.99;
  print(`horizon: exact ${h}-day VaR/ES vs ${n.toLocaleString("en-US")}-path simulation (c = ${c}, long side)`);
  for (const k of [-0.4, -0.1, 0.15, 0.5]) {
    const p = { location: 0.0003, scale: 0.01, shape: k };
    // Exact: median of 7 cold runs (each a fresh lattice: the shape moves by 1e-12 so the cache never hits).
    const times: number[] = [];
    for (let r = 1; r <= 7; r++) {
      const s0 = performance.now();
      const l = horizonLaw({ ...p, shape: k + r * 1e-12 }, h);
      l.valueAtRisk(c);
      l.expectedShortfall(c);
      times.push(performance.now() - s0);
    }
    times.sort((a, b) => a - b);
    const exactMs = times[3];
    const law = horizonLaw(p, h);
    const v = law.valueAtRisk(c);
    const es = law.expectedShortfall(c);
    const t1 = performance.now();
    const draws = sample(p, n * h, 99);
    const sums = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      let s = 0;
      for (let j = 0; j < h; j++) s += draws[i * h + j];
      sums[i] = s;
    }
    const tail = simulatedTail({ sums, horizon: h, antithetic: false }, c, "long");
    const t2 = performance.now();
    let hits = 0;
    for (let i = 0; i < n; i++) if (-sums[i] > v) hits++;
    const zRate = (hits / n - (1 - c)) / Math.sqrt((c * (1 - c)) / n);
    print(
      `  k=${k}: exact ${exactMs.toFixed(2)} ms (median of 7 cold runs) (VaR ${v.toPrecision(10)}, ES ${es.toPrecision(10)}, lattice ${law.accuracy.points} points); ` +
        `simulated ${(t2 - t1).toFixed(0)} ms (VaR ${tail.valueAtRisk.toPrecision(6)} ± ${tail.valueAtRiskError.toExponential(1)}, ` +
        `rel. s.e. ${(tail.valueAtRiskError / v).toExponential(1)}; ES ${tail.expectedShortfall.toPrecision(6)} ± ${tail.expectedShortfallError.toExponential(1)}); ` +
        `ratio ${((t2 - t1) / exactMs).toFixed(0)}×; exceedance rate at the exact VaR ${(hits / n).toFixed(5)} (${zRate.toFixed(2)} s.e.), ` +
        `ES gap ${((tail.expectedShortfall - es) / tail.expectedShortfallError).toFixed(2)} s.e.`,
    );
  }
}

/** An invented GARCH(1,1) return series with generalized-normal innovations (shape 0.2). */
function garchReturns(n: number): Float64Array {
  const [mu, omega, alpha, beta] = [0.0003, 3e-6, 0.08, 0.9];
  const law = innovationLaw(0.2);
  const next = uniformStream(2025);
  const r = new Float64Array(n);
  let v = omega / (1 - alpha - beta);
  for (let t = 0; t < n; t++) {
    const e = law.location + law.scale * reducedQuantile(normalQuantile(next()), law.shape);
    const shock = Math.sqrt(v) * e;
    r[t] = mu + shock;
    v = omega + alpha * shock * shock + beta * v;
  }
  return r;
}

function garchHorizon(print: (line: string) => void): void {
  const r = garchReturns(1500);
  fitVolatility(r.subarray(0, 300), "garch"); // JIT warm-up
  const t0 = performance.now();
  const est = fitVolatility(r, "garch");
  const t1 = performance.now();
  const g = est.garch!.params;
  const model = { kind: "garch" as const, mu: g.mu, omega: g.omega, alpha: g.alpha, beta: g.beta, shape: g.shape, nextVariance: est.nextSigma ** 2 };
  const sim = runToEnd(simulateSums(model, { horizon: 10, paths: 100_000, seed: 1 }));
  const tail = simulatedTail(sim, 0.99, "long");
  const t2 = performance.now();
  print(`horizon: GARCH(1,1), 10 days, 100,000 paths vs one GARCH fit (1,500 simulated returns)`);
  print(`  fit ${(t1 - t0).toFixed(0)} ms; simulation + tail ${(t2 - t1).toFixed(0)} ms; ratio ${((t2 - t1) / (t1 - t0)).toFixed(2)} fits`);
  print(`  10-day VaR 99% ${tail.valueAtRisk.toPrecision(5)} ± ${tail.valueAtRiskError.toExponential(1)}, ES ${tail.expectedShortfall.toPrecision(5)} ± ${tail.expectedShortfallError.toExponential(1)}`);
}

export function run(print: (line: string) => void): void {
  horizonLaw({ location: 0, scale: 1, shape: 0.33 }, 7).valueAtRisk(0.99); // JIT warm-up of the lattice code
  exactVsSimulated(print);
  garchHorizon(print);
}

if (require.main === module) run(console.log);
