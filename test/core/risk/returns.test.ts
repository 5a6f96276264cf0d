/** Returns from prices: definitions ln(P_t/P_{t−1}) and P_t/P_{t−1} − 1 (common practice); guards. */
import { periodReturn, returnsFromPrices } from "../../../src/core/risk/returns";
import { expectClose } from "./check";

describe("returns from prices", () => {
  test("log and simple returns of 100 → 110 → 99", () => {
    const log = returnsFromPrices([100, 110, 99], "log");
    const simple = returnsFromPrices([100, 110, 99], "simple");
    expect(log.length).toBe(2);
    expectClose("log 1", log[0], Math.log(1.1), { rel: 1e-15 });
    expectClose("log 2", log[1], Math.log(0.9), { rel: 1e-15 });
    expectClose("simple 1", simple[0], 0.1, { rel: 1e-15 });
    expectClose("simple 2", simple[1], -0.1, { rel: 1e-14 });
  });
  test("a tiny move keeps its digits: ln(1 + 1e-12) ≈ 1e-12 − 5e-25", () => {
    expectClose("tiny", periodReturn(1, 1 + 1e-12, "log"), 1.000088900582341e-12 - 5.0008890058e-25, { rel: 1e-15 });
  });
  test("a near-total loss keeps its digits: 100 → 0.2 gives ln(0.002) (value from ln 2 − 3 ln 10, 17 digits)", () => {
    expectClose("crash", periodReturn(100, 0.2, "log"), -6.2146080984221914, { rel: 4e-16 });
  });
  test("missing or non-positive prices give NaN for the returns that touch them", () => {
    const r = returnsFromPrices([100, NaN, 101, 0, 102], "log");
    expect(Array.from(r).map(Number.isNaN)).toEqual([true, true, true, true]);
    expect(returnsFromPrices([5], "log").length).toBe(0);
    expect(periodReturn(-1, 2)).toBeNaN();
  });
});
