/**
 * Tick and FZ0 losses: hand computation from their definitions (Koenker & Bassett 1978; Fissler & Ziegel 2016;
 * Patton, Ziegel & Chen 2019 — FZ0 written from memory), and strict consistency on seeded simulations: the true
 * VaR/ES pair of the simulating law scores lower than distorted pairs.
 */
import { normalQuantile, normalPdf } from "../../../src/core/normal";
import { fz0Loss, scoreForecasts, tickLoss } from "../../../src/core/scores";
import { expectClose } from "../risk/check";
import { normalDraws } from "./draws";

describe("tick loss by hand", () => {
  test("an exception costs (1 − α)·|r − q|, a quiet day α·(r − q)", () => {
    // α = 0.01, q = −VaR = −0.02. r = −0.03: (0.01 − 1)(−0.03 + 0.02) = 0.0099. r = 0.01: 0.01·0.03 = 0.0003.
    expectClose("exception", tickLoss(-0.03, 0.02, 0.99), 0.0099, { abs: 1e-17 });
    expectClose("quiet", tickLoss(0.01, 0.02, 0.99), 0.0003, { abs: 1e-17 });
    // Short side: the loss tail is r > VaR. r = 0.03 with VaR 0.02 is the exception: 0.0099.
    expectClose("short exception", tickLoss(0.03, 0.02, 0.99, "short"), 0.0099, { abs: 1e-17 });
    expectClose("short quiet", tickLoss(-0.01, 0.02, 0.99, "short"), 0.0003, { abs: 1e-17 });
    expect(tickLoss(0.01, 0.02, 1)).toBeNaN();
  });
});

describe("FZ0 loss by hand", () => {
  test("two rows worked from the formula with v = −VaR, e = −ES", () => {
    // α = 0.025, VaR 0.02, ES 0.025, r = −0.03 (exception):
    //   −(1/(0.025·−0.025))·(−0.02 + 0.03) + (−0.02/−0.025) + ln(0.025) − 1 = 16 + 0.8 − 3.688879454 − 1.
    const want = 16 + 0.8 + Math.log(0.025) - 1;
    expectClose("exception", fz0Loss(-0.03, 0.02, 0.025, 0.975), want, { rel: 1e-14 });
    expectClose("exception, 4 digits", fz0Loss(-0.03, 0.02, 0.025, 0.975), 12.1111, { abs: 5e-5 });
    // r = 0.01 (no exception): 0.8 + ln(0.025) − 1 = −3.8889.
    expectClose("quiet", fz0Loss(0.01, 0.02, 0.025, 0.975), 0.8 + Math.log(0.025) - 1, { rel: 1e-14 });
    expectClose("quiet, 4 digits", fz0Loss(0.01, 0.02, 0.025, 0.975), -3.8889, { abs: 5e-5 });
    expectClose("short mirror", fz0Loss(0.03, 0.02, 0.025, 0.975, "short"), want, { rel: 1e-14 });
  });

  test("undefined (NaN) for ES ≤ 0; scoreForecasts names the first such row and gives no mean", () => {
    expect(fz0Loss(0.01, 0.02, 0, 0.975)).toBeNaN();
    const s = scoreForecasts([0.01, -0.03, 0.02], [0.02, 0.02, 0.02], [0.025, -0.001, 0.025], 0.975);
    expect(s.firstNonPositiveEs).toBe(1);
    expect(s.meanFz0Loss).toBeNaN();
    expect(s.observations).toBe(3);
  });

  test("scoreForecasts skips rows with a gap in any column and averages the rest", () => {
    const r = [0.01, NaN, -0.03, 0.004, -0.01];
    const v = [0.02, 0.02, 0.02, NaN, 0.015];
    const e = [0.025, 0.025, 0.025, 0.025, 0.02];
    const s = scoreForecasts(r, v, e, 0.975);
    expect(s.observations).toBe(3);
    const rows = [0, 2, 4];
    expectClose("mean tick", s.meanTickLoss, rows.reduce((a, i) => a + tickLoss(r[i], v[i], 0.975), 0) / 3, { rel: 1e-15 });
    expectClose("mean FZ0", s.meanFz0Loss, rows.reduce((a, i) => a + fz0Loss(r[i], v[i], e[i], 0.975), 0) / 3, { rel: 1e-15 });
    expect(Number.isNaN(s.tick[1]) && Number.isNaN(s.fz0[3])).toBe(true);
  });
});

describe("strict consistency on seeded simulations (N(0, σ²) returns, common random numbers)", () => {
  const sigma = 0.012;
  const c = 0.975;
  const alpha = 1 - c;
  const z = normalQuantile(alpha);
  // The true pair of the simulating law (normal VaR and ES, common practice).
  const trueVar = -sigma * z;
  const trueEs = (sigma * normalPdf(z)) / alpha;
  const r = normalDraws(200_000, 20261202, sigma);
  const mean = (f: (x: number) => number) => {
    let s = 0;
    for (let i = 0; i < r.length; i++) s += f(r[i]);
    return s / r.length;
  };

  test("the true (VaR, ES) has the lowest mean FZ0 loss among 8 distortions by ±15%", () => {
    const best = mean((x) => fz0Loss(x, trueVar, trueEs, c));
    const worse: string[] = [];
    for (const [dv, de] of [[0.85, 1], [1.15, 1], [1, 0.85], [1, 1.15], [0.85, 0.85], [1.15, 1.15], [0.85, 1.15], [1.15, 0.85]]) {
      const other = mean((x) => fz0Loss(x, trueVar * dv, trueEs * de, c));
      if (!(other > best)) worse.push(`VaR×${dv} ES×${de}: ${other} ≤ true ${best}`);
    }
    expect(worse).toEqual([]);
  });

  test("the true VaR has the lowest mean tick loss among ±15% distortions", () => {
    const best = mean((x) => tickLoss(x, trueVar, c));
    for (const d of [0.85, 0.95, 1.05, 1.15]) expect(mean((x) => tickLoss(x, trueVar * d, c))).toBeGreaterThan(best);
  });
});
