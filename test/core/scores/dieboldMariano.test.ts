/**
 * Diebold–Mariano with a Newey–West long-run variance: against a numpy quadratic-form computation and scipy
 * p-values (runner.py), the lag rule, and on seeded simulations: it rejects a clearly worse forecast column and
 * holds its size on two equally good ones.
 */
import { normalQuantile, normalPdf } from "../../../src/core/normal";
import { uniformStream } from "../../../src/core/random";
import { dieboldMariano, fz0Loss, longRunVariance, neweyWestLag } from "../../../src/core/scores";
import dm from "../../fixtures/methods/dm.json";
import { expectClose } from "../risk/check";
import { normalDraws } from "./draws";

describe("against numpy 2.4 / scipy 1.17 (runner.py)", () => {
  test.each(dm.cases.map((c) => [`T=${c.lossA.length}`, c] as const))("%s", (_n, c) => {
    const t = dieboldMariano(c.lossA, c.lossB);
    expect(t.lag).toBe(c.lag);
    expectClose("LRV", t.longRunVariance, c.longRunVariance, { rel: 1e-10 });
    expectClose("DM", t.statistic, c.statistic, { rel: 1e-10 });
    expectClose("p", t.pValue, c.pValue, { rel: 1e-8, abs: 1e-15 });
    expectClose("HLN", t.smallSampleStatistic, c.smallSampleStatistic, { rel: 1e-10 });
    expectClose("HLN p", t.smallSamplePValue, c.smallSamplePValue, { rel: 1e-7, abs: 1e-15 });
  });
});

describe("lag rule and degenerate cases", () => {
  test("m = ⌊4 (T/100)^{2/9}⌋ (Newey & West 1994 rule of thumb): 4 at T = 100 and 250, 6 at T = 1000, 3 at T = 30", () => {
    // 4·2.5^{2/9} = 4.91 → 4; 4·10^{2/9} = 6.67 → 6; 4·0.3^{2/9} = 3.06 → 3.
    expect([neweyWestLag(100), neweyWestLag(250), neweyWestLag(1000), neweyWestLag(30)]).toEqual([
      Math.floor(4),
      Math.floor(4 * Math.pow(2.5, 2 / 9)),
      Math.floor(4 * Math.pow(10, 2 / 9)),
      Math.floor(4 * Math.pow(0.3, 2 / 9)),
    ]);
    expect([neweyWestLag(100), neweyWestLag(250), neweyWestLag(1000), neweyWestLag(30)]).toEqual([4, 4, 6, 3]);
  });

  test("lag 0 gives the plain variance with divisor T", () => {
    const d = [1, 3, 2, 6];
    // mean 3; squared deviations 4, 0, 1, 9 → 14/4.
    expect(longRunVariance(d, 0)).toBeCloseTo(3.5, 15);
  });

  test("identical columns give no statistic (NaN), not a division by zero", () => {
    const a = [0.1, 0.2, 0.3, 0.4];
    const t = dieboldMariano(a, a);
    expect(t.statistic).toBeNaN();
    expect(t.meanDifference).toBe(0);
  });
});

describe("seeded simulations (N(0, σ²) returns, FZ0 loss at 97.5%)", () => {
  const sigma = 0.01;
  const c = 0.975;
  const z = normalQuantile(1 - c);
  const trueVar = -sigma * z;
  const trueEs = (sigma * normalPdf(z)) / (1 - c);

  test("rejects a clearly worse column (VaR and ES understated by 30%) in at least 45 of 50 samples of 750 days", () => {
    let rejected = 0;
    let signRight = 0;
    for (let rep = 0; rep < 50; rep++) {
      const r = normalDraws(750, 1000 + rep, sigma);
      const a = Array.from(r, (x) => fz0Loss(x, trueVar, trueEs, c));
      const b = Array.from(r, (x) => fz0Loss(x, 0.7 * trueVar, 0.7 * trueEs, c));
      const t = dieboldMariano(a, b);
      if (t.pValue < 0.05) rejected++;
      if (t.statistic < 0) signRight++;
    }
    expect({ rejected: rejected >= 45, signRight }).toEqual({ rejected: true, signRight: 50 });
  });

  test("holds its size on two equally good columns: 5% test rejects in 2%–9% of 400 samples of 500 days", () => {
    let rejected = 0;
    for (let rep = 0; rep < 400; rep++) {
      const r = normalDraws(500, 5000 + rep, sigma);
      const u = uniformStream(9000 + rep);
      // Each column is the true pair with its own independent ±10% multiplicative noise: equal expected loss.
      const a: number[] = [];
      const b: number[] = [];
      for (let i = 0; i < r.length; i++) {
        const ka = 1 + 0.2 * (u() - 0.5);
        const kb = 1 + 0.2 * (u() - 0.5);
        a.push(fz0Loss(r[i], trueVar * ka, trueEs * ka, c));
        b.push(fz0Loss(r[i], trueVar * kb, trueEs * kb, c));
      }
      if (dieboldMariano(a, b).pValue < 0.05) rejected++;
    }
    // Binomial(400, 0.05): mean 20, sd 4.4; [8, 36] is beyond ±2.7 sd on each side.
    expect(rejected).toBeGreaterThanOrEqual(8);
    expect(rejected).toBeLessThanOrEqual(36);
  });
});
