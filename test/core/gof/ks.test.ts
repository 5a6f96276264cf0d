/**
 * KS statistic and exact null distribution (Marsaglia–Tsang–Wang 2003) against outside references:
 * - test/fixtures/gof/ks_exact.json: 60-digit order-statistics recursion (decimal.js), an independent algorithm;
 * - Marsaglia, Tsang & Wang 2003 (KS) and Marsaglia & Marsaglia 2004 (AD), J. Stat. Software; values recomputed with scipy 1.17 / mpmath outside the repo exact values P(D_10<0.274), P(D_100<0.1), P(D_250<0.05) (exact arithmetic, as tabulated there).
 */
import { ksProbability, ksStatistic } from "../../../src/core/gof/ks";
import fixture from "../../fixtures/gof/ks_exact.json";

function expectClose(label: string, got: number, want: number, tol: number): void {
  const diff = Math.abs(got - want);
  if (!(diff <= tol)) throw new Error(`${label}: got ${got}, want ${want}, |diff| ${diff} > tol ${tol}`);
}

describe("ksProbability (exact KS law)", () => {
  test("matches the 60-digit recursion: abs 1e-12 on P, and the p-value to 1e-10 relative in the far tail", () => {
    let tails = 0;
    for (const c of fixture.cases) {
      const d = Number(c.d);
      const got = ksProbability(c.n, d);
      // Exact route: double-precision matrix power, absolute error on P.
      expectClose(`P(D_${c.n} < ${c.d}) via ${got.method}`, got.cdf, Number(c.cdf), 1e-12);
      if (got.method === "one-sided-tail") {
        tails++;
        // Far tail: 2·P(D+ ≥ d) is exact for d ≥ 1/2 and overstates p by P(D+ ≥ d, D− ≥ d) below; relative 1e-10
        // for d ≥ 1/2, 1e-3 otherwise (the overlap term is of the order of p itself times a small factor).
        const rel = d >= 0.5 ? 1e-10 : 1e-3;
        expectClose(`relative p-value n=${c.n} d=${c.d}`, got.pValue / Number(c.pValue), 1, rel);
      }
    }
    expect(tails).toBeGreaterThanOrEqual(2);
  });

  test("Marsaglia, Tsang & Wang 2003 (KS) and Marsaglia & Marsaglia 2004 (AD), J. Stat. Software; values recomputed with scipy 1.17 / mpmath outside the repo exact values", () => {
    // Marsaglia, Tsang & Wang 2003 (KS) and Marsaglia & Marsaglia 2004 (AD), J. Stat. Software; values recomputed with scipy 1.17 / mpmath outside the repo [chk exact arithmetic].
    expectClose("P(D_10<0.274)", ksProbability(10, 0.274).cdf, 0.6284796154565043, 1e-13);
    expectClose("P(D_100<0.1)", ksProbability(100, 0.1).cdf, 0.7473072429936099, 1e-12);
    expectClose("P(D_250<0.05)", ksProbability(250, 0.05).cdf, 0.4572588313678306, 1e-11);
  });

  test("edges: d ≤ 1/(2n) has probability 0, d ≥ 1 has probability 1, invalid input is NaN", () => {
    expect(ksProbability(10, 0.05).cdf).toBe(0);
    expect(ksProbability(10, 0).pValue).toBe(1);
    expect(ksProbability(10, 1).cdf).toBe(1);
    expect(ksProbability(0, 0.3).cdf).toBeNaN();
    expect(ksProbability(2.5, 0.3).cdf).toBeNaN();
    expect(ksProbability(10, NaN).pValue).toBeNaN();
  });

  test("very large n takes the asymptotic route and stays near Kolmogorov's limit", () => {
    const got = ksProbability(200000, 1.0 / Math.sqrt(200000));
    expect(got.method).toBe("asymptotic");
    // Kolmogorov limit at t = 1: P(K ≤ 1) = 0.7300003283 (from memory; classic table value 0.730).
    expectClose("P(√n D ≤ 1)", got.cdf, 0.73, 2e-3);
  });
});

describe("ksStatistic", () => {
  test("D+, D− and D from a hand-computed example", () => {
    // u = (0.1, 0.4, 0.7), n = 3: D+ = max(1/3−0.1, 2/3−0.4, 1−0.7) = 0.3; D− = max(0.1, 0.4−1/3, 0.7−2/3) = 0.1.
    const s = ksStatistic([0.1, 0.4, 0.7]);
    expectClose("D+", s.dPlus, 0.3, 1e-15);
    expectClose("D−", s.dMinus, 0.1, 1e-15);
    expectClose("D", s.d, 0.3, 1e-15);
  });
  test("empty or NaN input gives NaN", () => {
    expect(ksStatistic([]).d).toBeNaN();
    expect(ksStatistic([0.2, NaN]).d).toBeNaN();
  });
});
