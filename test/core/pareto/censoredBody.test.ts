/**
 * The spliced law's body by maximum likelihood with the tail observations censored at the thresholds: its
 * objective is maximal against an independent optimizer (fmin 0.0.4 Nelder–Mead) and its tail masses follow the
 * counts beyond the thresholds (at the censored maximum the multinomial part of the likelihood is satisfied:
 * common practice for censored likelihoods), where a full-data body can be far off.
 */
import { nelderMead } from "../../refs/fmin";
import { fitGno } from "../../../src/core/fit";
import * as gno from "../../../src/core/gno";
import { fitCensoredBody } from "../../../src/core/pareto/censoredBody";
import { fitSpliced, splicedSample, type SplicedParams } from "../../../src/core/pareto";
import { expectClose } from "./check";

const body = { location: 0, scale: 1, shape: 0.1 };
const truth: SplicedParams = {
  body,
  lower: { threshold: gno.quantile(0.1, body), shape: 0.35, scale: 0.9 },
  upper: { threshold: gno.quantile(0.9, body), shape: 0.2, scale: 0.7 },
};

function censoredLogLik(x: Float64Array, lo: number, hi: number, p: gno.GnoParams): number {
  let s = 0;
  for (const v of x) {
    if (v < lo) s += gno.logCdf(lo, p);
    else if (v > hi) s += gno.logSf(hi, p);
    else s += gno.logPdf(v, p);
  }
  return s;
}

describe("censored body fit", () => {
  const x = splicedSample(truth, 3000, 31).sort();
  const lo = x[300];
  const hi = x[3000 - 1 - 300];

  test("maximizes the censored likelihood (Nelder–Mead cannot improve it)", () => {
    const start = fitGno(x).params;
    const f = fitCensoredBody(x, lo, hi, start);
    expect(f.converged).toBe(true);
    expectClose("value", f.logLikelihood, censoredLogLik(x, lo, hi, f.params), { rel: 1e-10 });
    const nll = (v: number[]): number => {
      const ll = censoredLogLik(x, lo, hi, { location: v[0], scale: Math.exp(v[1]), shape: v[2] });
      return Number.isFinite(ll) ? -ll : 1e300;
    };
    const nm = nelderMead(nll, [f.params.location + 0.02, Math.log(f.params.scale) + 0.02, f.params.shape - 0.02], { maxIterations: 3000, minErrorDelta: 1e-13 });
    expect(f.logLikelihood).toBeGreaterThanOrEqual(-nm.fx - 1e-7);
    expectClose("shape vs Nelder–Mead", f.params.shape, nm.x[2], { abs: 2e-3 });
  });

  test("tail masses follow the counts beyond the thresholds; the full-data body's do not", () => {
    const s = fitSpliced(x, { sides: "both" });
    expect(s.bodyMethod).toBe("censored mle");
    // Within 2 binomial standard errors of the 10% share (sd √(0.1·0.9/3000) ≈ 0.0055).
    expect(Math.abs(s.lower!.tailMass - 0.1)).toBeLessThan(0.011);
    expect(Math.abs(s.upper!.tailMass - 0.1)).toBeLessThan(0.011);
    const full = fitGno(x).params;
    const fullMass = gno.cdf(lo, full);
    // The full-data body is pulled by the heavy tails: its mass at the loss threshold is visibly off.
    expect(Math.abs(fullMass - 0.1)).toBeGreaterThan(Math.abs(s.lower!.tailMass - 0.1));
  });
});
