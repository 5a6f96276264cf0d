/**
 * Fit speed, printed not asserted. For 1,000-, 1,859- and 100,000-point simulated series (gno.sample,
 * invented parameters): time of a full maximum-likelihood fit (fitGno: sort for L-moments + Newton + report),
 * time of one log-likelihood pass over the same data, their ratio (target ≤ 20 passes), and fmin's
 * Nelder–Mead reaching the same log-likelihood (within 1e-6) from the same L-moment start (target ≥ 30× slower).
 * Each time is the median of several repetitions after a warm-up.
 */
import { fitGno, fitGnoQuick, logLikelihood, sampleLMoments, estimateFromLMoments } from "../src/core/fit";
import { sample } from "../src/core/gno";

import { nelderMead } from "../test/refs/fmin";

function median(f: () => void, reps: number): number {
  const ts: number[] = [];
  for (let i = 0; i < reps; i++) {
    const t0 = process.hrtime.bigint();
    f();
    ts.push(Number(process.hrtime.bigint() - t0) / 1e6);
  }
  ts.sort((a, b) => a - b);
  return ts[Math.floor(ts.length / 2)];
}

export function run(print: (line: string) => void): void {
  print("fit: n | full fit ms | one log-lik pass ms | fit/pass | quick (warm) fit/pass | Nelder-Mead ms | NM/fit");
  for (const [n, reps] of [[1000, 15], [1859, 15], [100000, 3]] as const) {
    const x = sample({ location: 0.0004, scale: 0.011, shape: 0.2 }, n, 42);
    fitGno(x);
    const fit = fitGno(x);
    const tFit = median(() => fitGno(x), reps);
    const tPass = median(() => logLikelihood(x, fit.params), reps * 4);
    const warm = { location: fit.params.location * 1.1, scale: fit.params.scale * 1.05, shape: fit.params.shape * 0.9 };
    const tQuick = median(() => fitGnoQuick(x, { start: warm }), reps);
    const start = estimateFromLMoments(sampleLMoments(x))!.params;
    const f = (v: number[]) => { const ll = logLikelihood(x, { location: v[0], scale: Math.exp(v[1]), shape: v[2] }); return Number.isFinite(ll) ? -ll : 1e300; };
    let nmMs = NaN;
    let reached = false;
    const t0 = process.hrtime.bigint();
    let v = [start.location, Math.log(start.scale), start.shape];
    for (let round = 0; round < 20 && !reached; round++) {
      v = nelderMead(f, v, { maxIterations: 500, minErrorDelta: 1e-13 }).x;
      reached = -f(v) >= fit.logLikelihood - 1e-6;
    }
    nmMs = Number(process.hrtime.bigint() - t0) / 1e6;
    print(
      `fit: ${n} | ${tFit.toFixed(3)} | ${tPass.toFixed(3)} | ${(tFit / tPass).toFixed(1)} | ${(tQuick / tPass).toFixed(1)} | ` +
        `${nmMs.toFixed(1)}${reached ? "" : " (did not reach)"} | ${(nmMs / tFit).toFixed(0)}×`,
    );
  }
}

if (require.main === module) run(console.log);
