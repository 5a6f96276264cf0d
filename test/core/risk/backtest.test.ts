/**
 * Backtests, binomial CDF and chi-square tails against published check values and jstat.
 * Sources: Kupiec 1995; Christoffersen 1998; Basel Committee 1996 backtesting framework; values recomputed with scipy 1.17 outside the repo [chk] values (recomputed with scipy/mpmath by the reference author), the Basel
 * Committee (1996) traffic-light table, Kupiec (1995) and Christoffersen (1998) formulas, jstat 1.9.6
 * (chi-square CDF) and an 80-digit decimal.js binomial sum (test/fixtures/risk).
 */
import { jStat } from "../../refs/jstat";
import {
  backtestVar,
  independenceStatistic,
  kupiecStatistic,
  trafficLight,
  transitionCounts,
} from "../../../src/core/risk/backtests/backtest";
import { binomialCdf, binomialQuantile } from "../../../src/core/risk/backtests/binomial";
import { chiSquare1Sf, chiSquare2Sf } from "../../../src/core/risk/backtests/chiSquare";
import binomialFixture from "../../fixtures/risk/binomial_cdf.json";
import { expectClose } from "./check";

/** A hit series of length n with exceptions on the given 1-based days. */
function hitsOn(n: number, days: number[]): boolean[] {
  const h = new Array<boolean>(n).fill(false);
  for (const d of days) h[d - 1] = true;
  return h;
}

/** Returns and VaR columns that reproduce a hit series for a long position (VaR 0.02, loss 0.03 on hit days). */
function seriesFor(hits: boolean[]): { returns: number[]; vars: number[] } {
  return { returns: hits.map((h) => (h ? -0.03 : 0.001)), vars: hits.map(() => 0.02) };
}

describe("binomial CDF reproduces the Basel 1996 table (250 days, 99% VaR)", () => {
  // Kupiec 1995; Christoffersen 1998; Basel Committee 1996 backtesting framework; values recomputed with scipy 1.17 outside the repo [chk, Binom(250, 0.01)], 8 digits given.
  const table: Array<[number, number]> = [
    [0, 0.08105852],
    [4, 0.89218763],
    [5, 0.95881682],
    [9, 0.99974981],
    [10, 0.9999461],
  ];
  test.each(table)("P(X ≤ %d) for Binomial(250, 0.01)", (x, want) => {
    expectClose(`binomialCdf(${x}, 250, 0.01)`, binomialCdf(x, 250, 0.01), want, { abs: 6e-9 });
  });
  test("zones: green 0–4, yellow 5–9, red 10+ (BCBS 1996 Table 2)", () => {
    for (let x = 0; x <= 20; x++) {
      const want = x <= 4 ? "green" : x <= 9 ? "yellow" : "red";
      expect({ x, zone: trafficLight(x, 250, 0.01) }).toEqual({ x, zone: want });
    }
  });
  test("cut-offs: smallest yellow count 5, smallest red count 10", () => {
    expect(binomialQuantile(0.95, 250, 0.01)).toBe(5);
    expect(binomialQuantile(0.9999, 250, 0.01)).toBe(10);
  });
});

describe("binomial CDF agrees with the 80-digit exact sum (test/fixtures/risk/binomial_cdf.json)", () => {
  // jstat's binomial CDF is rounded to 10 decimals, so the reference is the exact decimal.js sum instead.
  const fixture = binomialFixture as { cases: Array<{ n: number; p: number; cdf: string[] }> };
  test.each(fixture.cases.map((c) => [c.n, c.p, c.cdf] as const))("n = %d, p = %d, every x up to 3× the mean + 10", (n, p, cdf) => {
    cdf.forEach((want, x) => {
      // Log-space recursion: ≈ x·ε relative drift; 1e-12 relative is ample for n ≤ 2500.
      expectClose(`binomialCdf(${x}, ${n}, ${p})`, binomialCdf(x, n, p), Number(want), { rel: 1e-12 });
    });
  });
  test("edges: x < 0 gives 0, x ≥ n gives 1, p = 0 gives 1, invalid n gives NaN", () => {
    expect(binomialCdf(-1, 10, 0.1)).toBe(0);
    expect(binomialCdf(10, 10, 0.1)).toBe(1);
    expect(binomialCdf(0, 10, 0)).toBe(1);
    expect(binomialCdf(3, 10, 1)).toBe(0);
    expect(binomialCdf(2, 2.5, 0.1)).toBeNaN();
    expect(binomialCdf(2, 10, 1.5)).toBeNaN();
  });
  test("large n stays finite and monotone (n = 20000, p = 0.01)", () => {
    let prev = 0;
    for (let x = 150; x <= 260; x += 5) {
      const c = binomialCdf(x, 20000, 0.01);
      expect(Number.isFinite(c) && c >= prev && c <= 1).toBe(true);
      prev = c;
    }
    // Normal approximation with continuity correction (common practice): z = (200 + 0.5 − np)/√(np(1 − p)) with
    // np = 200, and Φ(z) ≈ 1/2 + z·φ(0) for this small z (the z³ term is below 1e-5): a sanity bound, not a precise check.
    const z = 0.5 / Math.sqrt(20000 * 0.01 * 0.99);
    expectClose("binomialCdf(200, 20000, 0.01)", binomialCdf(200, 20000, 0.01), 0.5 + z / Math.sqrt(2 * Math.PI), { abs: 0.01 });
  });
});

describe("chi-square tails agree with jstat's chi-square CDF", () => {
  test("1 and 2 degrees of freedom on (0, 25]", () => {
    for (let x = 0.01; x <= 25; x *= 1.3) {
      // jStat.chisquare.cdf (regularised lower gamma) is accurate to ~1e-14 absolute here.
      expectClose(`chiSquare1Sf(${x})`, chiSquare1Sf(x), 1 - jStat.chisquare.cdf(x, 1), { abs: 1e-13, rel: 1e-9 });
      expectClose(`chiSquare2Sf(${x})`, chiSquare2Sf(x), 1 - jStat.chisquare.cdf(x, 2), { abs: 1e-13, rel: 1e-9 });
    }
  });
  test("edges: 1 at 0, 0 at Infinity, NaN for NaN", () => {
    expect(chiSquare1Sf(0)).toBe(1);
    expect(chiSquare2Sf(0)).toBe(1);
    expect(chiSquare1Sf(Infinity)).toBe(0);
    expect(chiSquare2Sf(Infinity)).toBe(0);
    expect(chiSquare1Sf(NaN)).toBeNaN();
  });
});

describe("Kupiec POF statistic (Kupiec 1995; Christoffersen 1998; Basel Committee 1996 backtesting framework; values recomputed with scipy 1.17 outside the repo [chk] values, T = 250, p = 0.01)", () => {
  const cases: Array<[number, number, number | null]> = [
    [0, 5.025167927, 0.02498],
    [2, 0.1084352162, null],
    [5, 1.956809788, 0.16186],
    [10, 12.95549106, 3.19e-4],
  ];
  test.each(cases)("x = %d exceptions", (x, lr, pv) => {
    const got = kupiecStatistic(x, 250, 0.01);
    expectClose(`kupiecStatistic(${x}, 250, 0.01)`, got, lr, { rel: 1e-9 });
    // p-values given to 3–4 significant digits.
    if (pv !== null) expectClose(`p-value(x=${x})`, chiSquare1Sf(got), pv, { rel: 5e-3 });
  });
  test("all exceptions is finite: LR = −2T ln p", () => {
    expectClose("kupiecStatistic(250, 250, 0.01)", kupiecStatistic(250, 250, 0.01), -2 * 250 * Math.log(0.01), { rel: 1e-14 });
  });
});

describe("Christoffersen independence and conditional coverage (Kupiec 1995; Christoffersen 1998; Basel Committee 1996 backtesting framework; values recomputed with scipy 1.17 outside the repo worked example)", () => {
  // T = 250, p = 0.01, exceptions on days 10, 11, 50, 120, 121.
  const hits = hitsOn(250, [10, 11, 50, 120, 121]);
  test("transition counts n00 = 241, n01 = 3, n10 = 3, n11 = 2", () => {
    expect(transitionCounts(hits)).toEqual({ n00: 241, n01: 3, n10: 3, n11: 2 });
  });
  test("LR_ind = 9.894654433 (p 0.0016576), LR_cc = 11.85146422 (p 0.00266985)", () => {
    const { returns, vars } = seriesFor(hits);
    const bt = backtestVar(returns, vars, 0.99)!;
    expect(bt.observations).toBe(250);
    expect(bt.exceptions).toBe(5);
    expectClose("LR_pof", bt.kupiec.statistic, 1.956809788, { rel: 1e-9 });
    expectClose("LR_ind", bt.independence.statistic, 9.894654433, { rel: 1e-9 });
    expectClose("p_ind", bt.independence.pValue, 0.0016576, { rel: 1e-4 });
    expectClose("LR_cc", bt.conditionalCoverage.statistic, 11.85146422, { rel: 1e-9 });
    expectClose("p_cc", bt.conditionalCoverage.pValue, 0.00266985, { rel: 1e-5 });
    expect(bt.independence.informative).toBe(true);
    expect(bt.zone).toBe("yellow");
    expect(bt.greenMax).toBe(4);
    expect(bt.redFrom).toBe(10);
    expectClose("expected exceptions", bt.expectedExceptions, 2.5, { rel: 1e-12 });
    expectClose("cumulative probability", bt.cumulativeProbability, 0.95881682, { abs: 6e-9 });
  });
  test("p-values agree with jstat's chi-square CDF", () => {
    const { returns, vars } = seriesFor(hits);
    const bt = backtestVar(returns, vars, 0.99)!;
    expectClose("p_pof", bt.kupiec.pValue, 1 - jStat.chisquare.cdf(bt.kupiec.statistic, 1), { rel: 1e-10 });
    expectClose("p_ind", bt.independence.pValue, 1 - jStat.chisquare.cdf(bt.independence.statistic, 1), { rel: 1e-10 });
    expectClose("p_cc", bt.conditionalCoverage.pValue, 1 - jStat.chisquare.cdf(bt.conditionalCoverage.statistic, 2), { rel: 1e-10 });
  });
  test("independence LR is 0 when exceptions are isolated at the overall rate", () => {
    // Exceptions every 10th day: pi0 = 1/9·…, pi1 = 0 — not 0; instead check a case with pi0 = pi1.
    expect(independenceStatistic({ n00: 40, n01: 10, n10: 8, n11: 2 })).toBeCloseTo(0, 12);
  });
});

describe("backtest edge cases give defined answers, never NaN", () => {
  function allFinite(bt: NonNullable<ReturnType<typeof backtestVar>>): void {
    const nums = [
      bt.exceptionRate,
      bt.kupiec.statistic,
      bt.kupiec.pValue,
      bt.independence.statistic,
      bt.independence.pValue,
      bt.conditionalCoverage.statistic,
      bt.conditionalCoverage.pValue,
      bt.cumulativeProbability,
    ];
    for (const v of nums) expect(Number.isFinite(v)).toBe(true);
  }
  test("zero exceptions: green, Kupiec −2T ln(1−p), independence 0 and not informative", () => {
    const { returns, vars } = seriesFor(hitsOn(250, []));
    const bt = backtestVar(returns, vars, 0.99)!;
    allFinite(bt);
    expect(bt.exceptions).toBe(0);
    expect(bt.zone).toBe("green");
    expectClose("LR_pof", bt.kupiec.statistic, 5.025167927, { rel: 1e-9 });
    expect(bt.independence.statistic).toBe(0);
    expect(bt.independence.pValue).toBe(1);
    expect(bt.independence.informative).toBe(false);
  });
  test("all exceptions: red, finite statistics", () => {
    const { returns, vars } = seriesFor(hitsOn(30, Array.from({ length: 30 }, (_, i) => i + 1)));
    const bt = backtestVar(returns, vars, 0.99)!;
    allFinite(bt);
    expect(bt.exceptions).toBe(30);
    expect(bt.zone).toBe("red");
    expect(bt.independence.informative).toBe(false);
  });
  test("one observation: independence not informative, still finite", () => {
    const bt = backtestVar([-0.05], [0.02], 0.95)!;
    allFinite(bt);
    expect(bt.observations).toBe(1);
    expect(bt.exceptions).toBe(1);
    expect(bt.independence.informative).toBe(false);
  });
  test("no usable rows or a bad confidence give null", () => {
    expect(backtestVar([NaN], [0.02], 0.99)).toBeNull();
    expect(backtestVar([0.01], [0.02], 1)).toBeNull();
  });
});

describe("exceptions follow the side and skip missing rows", () => {
  test("long: return < −VaR (a loss equal to VaR is not an exception)", () => {
    const bt = backtestVar([-0.02, -0.0200001, 0.05, -0.01], [0.02, 0.02, 0.02, 0.02], 0.95, "long")!;
    expect(bt.exceptions).toBe(1);
  });
  test("short: return > VaR", () => {
    const bt = backtestVar([0.02, 0.0200001, 0.05, -0.05], [0.02, 0.02, 0.02, 0.02], 0.95, "short")!;
    expect(bt.exceptions).toBe(2);
  });
  test("rows with a missing return or VaR are skipped and do not break transitions", () => {
    const bt = backtestVar([-0.05, NaN, -0.05, 0.01, 0.0], [0.02, 0.02, 0.02, NaN, 0.02], 0.95)!;
    expect(bt.observations).toBe(3);
    expect(bt.independence.transitions).toEqual({ n00: 0, n01: 0, n10: 1, n11: 1 });
  });
});
