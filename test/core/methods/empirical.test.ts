/**
 * Historical simulation: the stated order-statistic convention checked by hand on a 10-return sample (both sides,
 * ties, fractional index, binary rounding of 1 − c), against numpy's inverted_cdf percentile and independent
 * loops (test/fixtures/methods/runner.py), and age weights (Boudoukh, Richardson & Whitelaw 1998).
 */
import { ageWeights, EmpiricalLaw, historicalTail } from "../../../src/core/methods";
import hs from "../../fixtures/methods/hs.json";
import { expectClose } from "../risk/check";

// Invented returns (not market data), chosen for ties at 0.03 on the long side and −0.03 on the short side.
const X = [0.02, -0.05, 0.01, -0.03, -0.03, 0.04, -0.01, 0.0, -0.02, 0.03];
const TIGHT = { abs: 1e-15, rel: 1e-13 };

describe("historical simulation by hand (10 returns; long losses sorted: .05 .03 .03 .02 .01 0 −.01 −.02 −.03 −.04)", () => {
  // Hand computation from the definition: VaR = ⌈m⌉-th worst loss, ES = (Σ_{i ≤ ⌊m⌋} L_(i) + (m − ⌊m⌋) L_(⌊m⌋+1))/m, m = n(1 − c).
  const cases: Array<[string, number, "long" | "short", number, number]> = [
    ["m = 1.5 (fractional index), long", 0.85, "long", 0.03, (0.05 + 0.5 * 0.03) / 1.5],
    ["m = 2.5 lands inside the tie at .03, long", 0.75, "long", 0.03, (0.05 + 0.03 + 0.5 * 0.03) / 2.5],
    ["m = 2 exactly although 1 − 0.8 rounds to 0.19999999999999996, long", 0.8, "long", 0.03, (0.05 + 0.03) / 2],
    ["m = 1 although 1 − 0.9 rounds below 0.1, long", 0.9, "long", 0.05, 0.05],
    ["m = 1.5, short (losses .04 .03 .02 …)", 0.85, "short", 0.03, (0.04 + 0.5 * 0.03) / 1.5],
    ["m = 3, short", 0.7, "short", 0.02, (0.04 + 0.03 + 0.02) / 3],
    ["m = 9 ends on the tie at −.03, short: VaR is a gain", 0.1, "short", -0.03, (0.04 + 0.03 + 0.02 + 0.01 + 0 - 0.01 - 0.02 - 0.03 - 0.03) / 9],
  ];
  test.each(cases)("%s", (_name, c, side, varWant, esWant) => {
    const t = historicalTail(X, c, side);
    expectClose(`VaR c=${c} ${side}`, t.valueAtRisk, varWant, TIGHT);
    expectClose(`ES c=${c} ${side}`, t.expectedShortfall, esWant, TIGHT);
    expect(t.tailBeyondSample).toBe(false);
  });

  test("a tail thinner than one observation (m = 0.5) gives the worst loss for both and is flagged", () => {
    const t = historicalTail(X, 0.95, "long");
    expect([t.valueAtRisk, t.expectedShortfall, t.tailBeyondSample]).toEqual([0.05, 0.05, true]);
  });

  test("the order of the returns (and within ties) does not matter", () => {
    const shuffled = [X[3], X[9], X[4], X[0], X[8], X[1], X[6], X[2], X[5], X[7]];
    for (const c of [0.6, 0.75, 0.85, 0.9]) for (const side of ["long", "short"] as const) {
      expect(historicalTail(shuffled, c, side)).toEqual(historicalTail(X, c, side));
    }
  });

  test("CDF is the right-continuous fraction at or below x, consistent with the VaR", () => {
    const law = new EmpiricalLaw(X);
    expect(law.cdf(-0.03)).toBeCloseTo(3 / 10, 15);
    expect(law.cdf(-0.0300001)).toBeCloseTo(1 / 10, 15);
    expect(law.cdf(-1)).toBe(0);
    expect(law.cdf(1)).toBe(1);
    // inf{x : F(x) ≥ p}: F(−VaR) ≥ p and F just below −VaR < p.
    for (const c of [0.7, 0.75, 0.85, 0.9]) {
      const v = law.valueAtRisk(c, "long");
      expect(law.cdf(-v)).toBeGreaterThanOrEqual(1 - c - 1e-12);
      expect(law.cdf(-v - 1e-9)).toBeLessThan(1 - c);
    }
  });

  test("ES ≥ VaR on every level and side", () => {
    const law = new EmpiricalLaw(X);
    for (let c = 0.05; c < 1; c += 0.05) for (const side of ["long", "short"] as const) {
      const t = law.tail(c, side);
      expect(t.expectedShortfall).toBeGreaterThanOrEqual(t.valueAtRisk - 1e-15);
    }
  });

  test("bad input gives NaN, not an exception", () => {
    expect(historicalTail([], 0.99).valueAtRisk).toBeNaN();
    expect(historicalTail(X, 1).valueAtRisk).toBeNaN();
    expect(historicalTail([0.01, NaN], 0.5).valueAtRisk).toBeNaN();
  });
});

describe("weights", () => {
  test("integer weights equal replicated rows (every level, both sides)", () => {
    const w = [2, 1, 3, 1, 2, 1, 1, 4, 1, 2];
    const replicated: number[] = [];
    X.forEach((x, i) => {
      for (let k = 0; k < w[i]; k++) replicated.push(x);
    });
    const weighted = new EmpiricalLaw(X, w);
    const plain = new EmpiricalLaw(replicated);
    for (let c = 0.02; c < 1; c += 0.02) for (const side of ["long", "short"] as const) {
      const a = weighted.tail(c, side);
      const b = plain.tail(c, side);
      expectClose(`VaR c=${c.toFixed(2)} ${side}`, a.valueAtRisk, b.valueAtRisk, TIGHT);
      expectClose(`ES c=${c.toFixed(2)} ${side}`, a.expectedShortfall, b.expectedShortfall, TIGHT);
    }
    for (const x of [-0.06, -0.03, 0, 0.025, 0.05]) expectClose(`cdf(${x})`, weighted.cdf(x), plain.cdf(x), TIGHT);
  });

  test("age weights λ^a(1 − λ)/(1 − λ^n) sum to 1 and fall with age (Boudoukh, Richardson & Whitelaw 1998)", () => {
    for (const [n, lam] of [[250, 0.97], [100, 0.99], [7, 0.5]] as const) {
      const w = ageWeights(n, lam);
      const norm = (1 - lam) / (1 - Math.pow(lam, n));
      const total = Array.from(w).reduce((s, v) => s + v * norm, 0);
      expectClose(`Σw n=${n} λ=${lam}`, total, 1, { rel: 1e-13 });
      expectClose(`newest weight n=${n}`, w[n - 1] * norm, (1 - lam) / (1 - Math.pow(lam, n)), { rel: 1e-15 });
      for (let i = 1; i < n; i++) expect(w[i]).toBeGreaterThan(w[i - 1]);
    }
    expect(Array.from(ageWeights(5, 1))).toEqual([1, 1, 1, 1, 1]);
    expect(ageWeights(3, 1.2)[0]).toBeNaN();
  });
});

interface HsCase {
  n: number;
  tail: number;
  side: "long" | "short";
  var: number;
  es: number;
  returns: number[];
  [k: string]: unknown;
}

describe("against numpy 2.4 percentile(method='inverted_cdf') and independent loops (runner.py)", () => {
  test.each((hs.cases as HsCase[]).map((c) => [`n=${c.n} tail=${c.tail} ${c.side}`, c] as const))("%s", (_n, c) => {
    // The fixture gives the tail as a decimal literal; Askew receives the confidence 1 − tail as a user would type it.
    const confidence = 1 - c.tail;
    const t = historicalTail(c.returns, confidence, c.side);
    expectClose("VaR", t.valueAtRisk, c.var, TIGHT);
    expectClose("ES", t.expectedShortfall, c.es, { abs: 1e-15, rel: 1e-12 });
    for (const lam of [0.97, 0.99]) {
      const a = historicalTail(c.returns, confidence, c.side, lam);
      expectClose(`age VaR λ=${lam}`, a.valueAtRisk, c[`var_age_${lam}`] as number, TIGHT);
      expectClose(`age ES λ=${lam}`, a.expectedShortfall, c[`es_age_${lam}`] as number, { abs: 1e-15, rel: 1e-9 });
    }
  });
});
