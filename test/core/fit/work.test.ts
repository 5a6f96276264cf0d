/**
 * The fit as resumable work: a likelihood pass over a large sample is cut into chunks whose sums add up to the same
 * pass, the fit Work gives the same answer as the synchronous fit in several steps, a cached fit is returned without
 * a step, and a fit that is stopped part-way is not cached.
 * Data: simulated with the core sampler (seeded).
 */
import { sample } from "../../../src/core/gno";
import {
  clearFitCache, fitGno, fitGnoCached, fitGnoCachedWork, fitGnoWork, likelihoodDerivatives, likelihoodDerivativesWork,
  logLikelihood, PASS_CHUNK,
} from "../../../src/core/fit";
import { runToEnd } from "../../../src/core/work";

const law = { location: 0.0003, scale: 0.011, shape: -0.12 };

function steps<T>(work: Generator<number, T, void>): { value: T; steps: number } {
  let n = 0;
  for (;;) {
    const r = work.next();
    if (r.done) return { value: r.value, steps: n };
    n++;
  }
}

describe("chunked likelihood pass", () => {
  const n = 2 * PASS_CHUNK + 1234;
  const x = sample(law, n, 61);
  const p = { location: 0.0002, scale: 0.0105, shape: -0.1 };

  test("a pass over 2 chunks and a bit yields between chunks (2 times) and returns the one-block pass exactly", () => {
    const r = steps(likelihoodDerivativesWork(x, p.location, Math.log(p.scale), p.shape));
    expect(r.steps).toBe(2);
    const whole = likelihoodDerivatives(x, p.location, Math.log(p.scale), p.shape)!;
    expect(r.value!.value).toBe(whole.value);
    expect(Array.from(r.value!.gradient)).toEqual(Array.from(whole.gradient));
    expect(Array.from(r.value!.hessian)).toEqual(Array.from(whole.hessian));
  });

  test("the chunked value agrees with the log-likelihood summed point by point from the density (1e-10 relative)", () => {
    // an independent path: logLikelihood sums gno.logPdf, so a chunk boundary that skipped or repeated points would show
    const r = runToEnd(likelihoodDerivativesWork(x, p.location, Math.log(p.scale), p.shape))!;
    const want = logLikelihood(x, p);
    expect(Math.abs(r.value - want) / Math.abs(want)).toBeLessThan(1e-10);
  });

  test("an observation outside the support in the last chunk gives null", () => {
    const y = Float64Array.from(x);
    y[n - 1] = p.location + (p.scale / p.shape) * 1.5; // below the lower edge ξ + α/k for k < 0
    expect(runToEnd(likelihoodDerivativesWork(y, p.location, Math.log(p.scale), p.shape))).toBeNull();
  });
});

describe("fit Work", () => {
  test("fitGnoWork gives the same fit as fitGno, in several steps", () => {
    const x = sample(law, 1500, 63);
    const r = steps(fitGnoWork(x));
    const want = fitGno(x);
    expect(r.steps).toBeGreaterThanOrEqual(4);
    expect(r.value.params).toEqual(want.params);
    expect(r.value.logLikelihood).toBe(want.logLikelihood);
  });

  test("a cached fit is returned without a step; a fit stopped part-way is not cached", () => {
    clearFitCache();
    const x = sample(law, 800, 65);
    const w = fitGnoCachedWork(x, "mle");
    expect(w.next().done).toBe(false);
    w.return(undefined as never); // stopped, as runWork does on cancel
    const again = fitGnoCachedWork(x, "mle");
    expect(again.next().done).toBe(false); // not cached: the fit starts over
    const fit = fitGnoCached(x, "mle");
    const hit = fitGnoCachedWork(x, "mle").next();
    expect(hit.done).toBe(true);
    expect(hit.value).toBe(fit);
  });
});
