/**
 * Fitting the spliced law to returns: recovery on data simulated from a known spliced law (seeded), the
 * threshold rule (the (m+1)-th most extreme return, m = ⌊share·n⌋; McNeil & Frey 2000's order-statistic
 * threshold), the tail mass taken from the body, and the refusals.
 */
import { fitSpliced, lowerTailMass, splicedSample, type SplicedParams } from "../../../src/core/pareto";
import * as gno from "../../../src/core/gno";

const body = { location: 0.0004, scale: 0.011, shape: -0.05 };
const truth: SplicedParams = {
  body,
  lower: { threshold: gno.quantile(0.1, body), shape: 0.3, scale: 0.007 },
  upper: { threshold: gno.quantile(0.9, body), shape: 0.1, scale: 0.006 },
};

describe("fitSpliced", () => {
  const x = splicedSample(truth, 20000, 77);

  test("recovers the tail shapes of simulated data within 4 standard errors", () => {
    const f = fitSpliced(x, { sides: "both" });
    for (const [got, want] of [
      [f.lower!, truth.lower!],
      [f.upper!, truth.upper!],
    ] as const) {
      const se = got.fit.standardErrors!;
      expect(Math.abs(got.fit.params.shape - want.shape)).toBeLessThan(4 * se[0]);
      expect(got.exceedances).toBe(2000);
    }
    // The loss threshold is the 2001st smallest return; exactly 2000 lie below it.
    const sorted = Float64Array.from(x).sort();
    expect(f.lower!.threshold).toBe(sorted[2000]);
    expect(f.params.lower!.threshold).toBe(sorted[2000]);
    // The tail carries the body's mass beyond the threshold, reported beside the empirical share.
    expect(f.lower!.tailMass).toBe(lowerTailMass(f.params));
    expect(f.lower!.empiricalShare).toBe(0.1);
  });

  test("PWM and maximum likelihood agree within their standard errors; sides pick the tails", () => {
    const m = fitSpliced(x, { sides: "loss", method: "mle" });
    const p = fitSpliced(x, { sides: "loss", method: "pwm" });
    expect(m.upper).toBeNull();
    expect(p.method).toBe("pwm");
    expect(Math.abs(m.lower!.fit.params.shape - p.lower!.fit.params.shape)).toBeLessThan(3 * p.lower!.fit.standardErrors![0]);
    const g = fitSpliced(x, { sides: "gain", tailShare: 0.05 });
    expect(g.lower).toBeNull();
    expect(g.upper!.exceedances).toBe(1000);
  });

  test("refuses a tail with fewer than 10 exceedances and a share outside (0, 0.45]", () => {
    const small = x.subarray(0, 60);
    expect(() => fitSpliced(small, { tailShare: 0.1 })).toThrow(/at least 10/);
    expect(() => fitSpliced(x, { tailShare: 0.6 })).toThrow(/tail share/);
    expect(() => fitSpliced(x, { tailShare: 0 })).toThrow(/tail share/);
  });
});
