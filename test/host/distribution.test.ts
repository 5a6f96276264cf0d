/**
 * The law's cell functions through the BUILT bundle, called as the host calls them (2-D ranges, null for an
 * omitted optional argument, blanks as null or ""). References: Hosking & Wallis 1997 App. A.8; values recomputed with mpmath (40 digits) outside the repo check values (recomputed there
 * with scipy/mpmath), jstat's normal distribution in its accurate range, and common practice (shape 0 is the normal).
 */
import Decimal from "decimal.js";
import { jStat } from "../refs/jstat";
import { loadBundle, col, Bundle } from "./harness";

let b: Bundle;
beforeAll(async () => {
  b = await loadBundle();
});

const P = (loc: number, scale: number, shape: number) => [[loc], [scale], [shape]];
const rel = (got: number, want: number) => Math.abs(got - want) / Math.max(Math.abs(want), 1e-300);
const num = (v: unknown) => {
  if (typeof v !== "number") throw new Error(`expected a number, got ${JSON.stringify(v)}`);
  return v;
};

describe("PARAMS", () => {
  test("returns the validated 3×1 column", () => {
    expect(b.call("PARAMS", 0.001, 0.01, -0.2)).toEqual([[0.001], [0.01], [-0.2]]);
  });
  test("rejects scale ≤ 0 with #VALUE! and a message naming scale", () => {
    const e = b.errorOf(b.call("PARAMS", 0, 0, 0.1));
    expect(e?.code).toBe("#VALUE!");
    expect(e?.message).toMatch(/scale/);
  });
  test("rejects text that looks like a number, telling the user to enter a number", () => {
    const e = b.errorOf(b.call("PARAMS", "0.1", 1, 0));
    expect(e?.code).toBe("#VALUE!");
    expect(e?.message).toMatch(/as a number/);
  });
});

describe("PDF and CDF", () => {
  test("match Hosking & Wallis 1997 App. A.8; values recomputed with mpmath (40 digits) outside the repo check values (scipy/mpmath) within 1e-12", () => {
    const cases: Array<[number, number[][], number, number]> = [
      [0.5, P(0, 1, -0.2), 0.683159022680827, 0.323745005637999],
      [-1, P(0.2, 0.5, 0.3), 0.0353228934617318, 0.0905284238991013],
      [2, P(0, 1, 0.4), 0.999971341749084, 0.000608716386732321],
    ];
    for (const [x, p, F, f] of cases) {
      expect(rel(num((b.call("CDF", [[x]], p) as unknown[][])[0][0]), F)).toBeLessThan(1e-12);
      expect(rel(num((b.call("PDF", [[x]], p) as unknown[][])[0][0]), f)).toBeLessThan(1e-12);
    }
  });

  test("shape 0 is the normal law (common practice; jstat normal as reference in its accurate range)", () => {
    const xs = [-3, -1.5, -0.2, 0, 0.7, 2.5];
    const cdf = b.call("CDF", col(xs), P(0.1, 2, 0)) as number[][];
    const pdf = b.call("PDF", col(xs), P(0.1, 2, 0)) as number[][];
    xs.forEach((x, i) => {
      expect(rel(cdf[i][0], jStat.normal.cdf(x, 0.1, 2))).toBeLessThan(1e-9);
      expect(rel(pdf[i][0], jStat.normal.pdf(x, 0.1, 2))).toBeLessThan(1e-12);
    });
  });

  test("keep the shape of the range; blanks give \"\"; a bad cell errors only itself", () => {
    const out = b.call("CDF", [[0, null, ""], ["abc", true, 1]], P(0, 1, 0)) as unknown[][];
    expect(out).toHaveLength(2);
    expect(out[0]).toHaveLength(3);
    expect(out[0][0]).toBeCloseTo(0.5, 15);
    expect(out[0][1]).toBe("");
    expect(out[0][2]).toBe("");
    expect(b.errorOf(out[1][0])?.code).toBe("#VALUE!");
    expect(b.errorOf(out[1][1])?.code).toBe("#VALUE!");
    // Φ(1) = (1 + erf(1/√2))/2, summed here from the Maclaurin series of erf in decimal.js at 50 digits.
    expect(out[1][2]).toBeCloseTo(phiOneFromSeries(), 14);
  });

  test("outside the support: density 0, CDF exactly 0 or 1, never NaN", () => {
    // shape 0.4 → upper edge at 0 + 1/0.4 = 2.5; shape -0.4 → lower edge at -2.5.
    const up = P(0, 1, 0.4), lo = P(0, 1, -0.4);
    expect(b.call("PDF", [[3]], up)).toEqual([[0]]);
    expect(b.call("CDF", [[3]], up)).toEqual([[1]]);
    expect(b.call("PDF", [[-3]], lo)).toEqual([[0]]);
    expect(b.call("CDF", [[-3]], lo)).toEqual([[0]]);
  });

  test("a bad params argument errors the whole call with a message", () => {
    const e = b.errorOf(b.call("CDF", [[0]], [[0, 1]]));
    expect(e?.code).toBe("#VALUE!");
    expect(e?.message).toMatch(/3 cells/);
  });
});

describe("QUANTILE", () => {
  test("inverts CDF and matches Φ⁻¹ check values at shape 0 (mpmath at 40 digits; methods Wichura 1988 AS 241 and Cody 1969)", () => {
    const q = b.call("QUANTILE", [[0.01], [0.975]], P(0, 1, 0)) as number[][];
    expect(rel(q[0][0], -2.3263478740408408)).toBeLessThan(1e-14);
    expect(rel(q[1][0], 1.959963984540054)).toBeLessThan(1e-14);
    const p = P(0.001, 0.01, -0.2);
    const x = (b.call("QUANTILE", [[0.01]], p) as number[][])[0][0];
    expect(rel(x, -0.0176017100694712)).toBeLessThan(1e-12); // lognormal partial expectation with the Hosking & Wallis 1997 App. A.8 law; values recomputed with mpmath (40 digits) outside the repo check value
  });
  test("p outside (0,1) errors that cell only", () => {
    const out = b.call("QUANTILE", [[0, 0.5, 1, -0.1, 1.5]], P(0, 1, 0)) as unknown[][];
    expect(out[0].map((v) => b.errorOf(v)?.code ?? v)).toEqual(["#VALUE!", 0, "#VALUE!", "#VALUE!", "#VALUE!"]);
  });
});

describe("MOMENTS and LMOMENTS", () => {
  test("match Hosking & Wallis 1997 App. A.8; values recomputed with mpmath (40 digits) outside the repo check values for (0, 1, -0.2)", () => {
    const m = (b.call("MOMENTS", P(0, 1, -0.2)) as number[][]).map((r) => r[0]);
    expect(rel(m[0], 0.101006700134)).toBeLessThan(1e-11);
    expect(rel(m[1], Math.sqrt(1.06190733706))).toBeLessThan(1e-11);
    expect(rel(m[2], 0.614294761987)).toBeLessThan(1e-11);
    expect(rel(m[3], 0.678365777175)).toBeLessThan(1e-11);
    const l = (b.call("LMOMENTS", P(0, 1, -0.2)) as number[][]).map((r) => r[0]);
    expect(rel(l[0], 0.101006700134)).toBeLessThan(1e-11);
    expect(rel(l[1], 0.573674088126)).toBeLessThan(1e-11);
    expect(Math.abs(l[2] - 0.09750367131)).toBeLessThan(1e-9);
    expect(Math.abs(l[3] - 0.130075656)).toBeLessThan(1e-8);
  });
  test("shape 0.04: skewness ≈ −0.12, excess kurtosis ≈ 0.026 (common practice)", () => {
    const m = (b.call("MOMENTS", P(0, 1, 0.04)) as number[][]).map((r) => r[0]);
    expect(m[2]).toBeCloseTo(-0.12, 2);
    expect(m[3]).toBeCloseTo(0.026, 3);
  });
});

describe("BOUND", () => {
  test("upper edge for shape > 0, lower for shape < 0; #N/A with a message at shape 0", () => {
    expect(b.call("BOUND", P(0, 1, 0.4))).toBeCloseTo(2.5, 14);
    expect(b.call("BOUND", P(1, 2, -0.5))).toBeCloseTo(-3, 14);
    const e = b.errorOf(b.call("BOUND", P(0, 1, 0)));
    expect(e?.code).toBe("#N/A");
    expect(e?.message).toMatch(/normal/);
  });
});

describe("RANDOM", () => {
  test("same seed → same draws; another seed → other draws; omitted seed is allowed", () => {
    const p = P(0, 0.01, -0.1);
    const a = b.call("RANDOM", p, 1000, 7) as number[][];
    const a2 = b.call("RANDOM", p, 1000, 7) as number[][];
    const c = b.call("RANDOM", p, 1000, 8) as number[][];
    expect(a).toHaveLength(1000);
    expect(a).toEqual(a2);
    expect(a).not.toEqual(c);
    expect(b.call("RANDOM", p, 5, null) as number[][]).toHaveLength(5);
  });
  test("draws follow the law: KS distance below the 1% asymptotic critical value 1.63/√n (Kolmogorov; common practice)", () => {
    const p = P(0.0005, 0.012, 0.3);
    const n = 20000;
    const xs = (b.call("RANDOM", p, n, 11) as number[][]).map((r) => r[0]).sort((u, v) => u - v);
    const F = (b.call("CDF", col(xs), p) as number[][]).map((r) => r[0]);
    let d = 0;
    F.forEach((f, i) => (d = Math.max(d, (i + 1) / n - f, f - i / n)));
    expect(d).toBeLessThan(1.63 / Math.sqrt(n));
  });
  test("n must be a whole number from 1 to 1,000,000", () => {
    for (const n of [0, 1.5, 1_000_001, "ten"]) expect(b.errorOf(b.call("RANDOM", P(0, 1, 0), n, 1))?.code).toBe("#VALUE!");
  });
});

/** Φ(1) from erf's Maclaurin series, erf(z) = 2/√π Σ (−1)ⁿ z^(2n+1) / (n! (2n+1)), in decimal.js at 50 digits. */
function phiOneFromSeries(): number {
  const D = Decimal.clone({ precision: 50 });
  const z = new D(1).div(new D(2).sqrt());
  let term = z; // z^(2n+1)/n!, signed
  let sum = new D(0);
  for (let n = 0; n < 80; n++) {
    sum = sum.plus(term.div(2 * n + 1));
    term = term.times(z).times(z).div(n + 1).neg();
  }
  const erf = sum.times(2).div(D.acos(-1).sqrt());
  return new D(1).plus(erf).div(2).toNumber();
}
