/**
 * Small wrong answers at the edges of the input space, through the BUILT bundle as the host calls it.
 * Outside references: scipy 1.17 norm.isf(1e-300) = 37.0470962993612 (the standard normal upper quantile);
 * the normal density for LOGLIK from jstat 1.9.6 (test/refs/jstat.ts). Data are invented for the check.
 */
import { jStat } from "../refs/jstat";
import { col, loadBundle, type Bundle } from "./harness";

let b: Bundle;
beforeAll(async () => {
  b = await loadBundle();
});

const Z_1E300 = 37.0470962993612; // scipy 1.17 norm.isf(1e-300)

describe("VAR at a tiny confidence", () => {
  test("confidence 1e-300, shape 0: −(ξ + α·Φ⁻¹(1 − 1e-300)), not an overflow", () => {
    const v = b.call("VAR", [[1e-300]], [[0.001], [0.02], [0]]) as unknown[][];
    const want = -(0.001 + 0.02 * Z_1E300);
    expect(typeof v[0][0]).toBe("number");
    expect(Math.abs((v[0][0] as number) - want)).toBeLessThanOrEqual(1e-12 * Math.abs(want));
  });

  test("confidence 1e-300, shape 0.2: −α(1 − e^{−kz})/k with z = 37.047…, not minus the edge (−5)", () => {
    const v = b.call("VAR", [[1e-300]], [[0], [1], [0.2]]) as unknown[][];
    const want = -(-Math.expm1(-0.2 * Z_1E300) / 0.2);
    expect(Math.abs((v[0][0] as number) - want)).toBeLessThanOrEqual(1e-12);
    expect(v[0][0]).not.toBe(-5);
  });
});

describe("an empty range is a #VALUE! that says so", () => {
  test.each([
    ["PDF", [[0], [1], [0]]],
    ["CDF", [[0], [1], [0]]],
    ["QUANTILE", [[0], [1], [0]]],
    ["VAR", [[0], [1], [0]]],
    ["ES", [[0], [1], [0]]],
  ])("%s of an empty range", (id, params) => {
    if (!b.ids.includes(id)) return; // ES may be registered under its new name by another change
    const e = b.errorOf(b.call(id, [[]], params));
    expect(e?.code).toBe("#VALUE!");
    expect(e?.message).toMatch(/empty range/);
  });
});

describe("CDF at the largest doubles", () => {
  test("shape 0: CDF(1e308) = 1 and CDF(−1e308) = 0 (Φ of a huge argument)", () => {
    const v = b.call("CDF", [[1e308], [-1e308], [1.7976931348623157e308]], [[0], [1], [0]]) as unknown[][];
    expect(v).toEqual([[1], [0], [1]]);
  });
});

describe("LOGLIK of given parameters needs at least one observation, not ten", () => {
  test("three observations under the normal law (shape 0) equal the sum of ln φ((x − ξ)/α) − ln α", () => {
    const x = [0.012, -0.03, 0.004];
    const want = x.reduce((s, v) => s + Math.log(jStat.normal.pdf(v, 0.001, 0.02)), 0);
    const got = b.call("LOGLIK", col(x), [[0.001], [0.02], [0]]) as number;
    expect(Math.abs(got - want)).toBeLessThanOrEqual(1e-12 * Math.abs(want));
  });

  test("one observation is accepted; none is #VALUE!", () => {
    expect(typeof b.call("LOGLIK", [[0.01]], [[0], [0.02], [0.1]])).toBe("number");
    expect(b.errorOf(b.call("LOGLIK", [[null]], [[0], [0.02], [0.1]]))?.code).toBe("#VALUE!");
  });
});

describe("GOF's bootstrap bound", () => {
  test("data too many for even the minimum 19 resamples: the message says so and never asks for fewer than 19", async () => {
    const n = 110_000; // 19 × 110,000 > 2,000,000
    const data = Array.from({ length: n }, (_, i) => [Math.sin(i * 12.9898) * 0.01]);
    const e = b.errorOf(await b.run("GOF", data, null, null));
    expect(e?.code).toBe("#VALUE!");
    expect(e?.message).toMatch(/too many for the bootstrap/);
    expect(e?.message).not.toMatch(/at most 1[0-8] resamples|at most [0-9] resamples/);
  });
});

describe("COMPARE's size bound", () => {
  test("more than 1,000,000 rows is #VALUE! stating the bound", async () => {
    const data = Array.from({ length: 1_000_001 }, (_, i) => [((i * 7919) % 1000) / 1e5]);
    const e = b.errorOf(await b.run("COMPARE", data));
    expect(e?.code).toBe("#VALUE!");
    expect(e?.message).toMatch(/at most 1,000,000/);
  });
});
