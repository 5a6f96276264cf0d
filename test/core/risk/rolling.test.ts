/**
 * Rolling out-of-sample VaR: each forecast equals the VaR of a fit to exactly the window before the row
 * (checked against an independent full fit, fitGno, of that window), never uses its own row, and skips gaps.
 * Data: an invented, simulated scenario (GNO draws, seeded).
 */
import { fitGno, fitGnoQuick } from "../../../src/core/fit";
import { sample } from "../../../src/core/gno";
import { rollingVar } from "../../../src/core/risk/rolling/rolling";
import { valueAtRisk } from "../../../src/core/risk/measures/tail";
import { expectClose } from "./check";

const returns = sample({ location: 0.0003, scale: 0.012, shape: 0.15 }, 160, 77);

describe("ROLLVAR core: row t is the VaR of the fit to rows t−window … t−1", () => {
  const window = 60;
  const out = rollingVar(returns, window, 0.99);
  test("the first `window` rows have no forecast; every later row has one", () => {
    for (let t = 0; t < returns.length; t++) expect({ t, has: Number.isFinite(out.values[t]) }).toEqual({ t, has: t >= window });
    expect(out.forecasts).toBe(returns.length - window);
    expect(out.failedRows).toEqual([]);
  });
  test.each([60, 61, 100, 137, 159])("row %d matches a full cold fit of its window (VaR within 1e-5 relative: optimizer stopping tolerance)", (t) => {
    // Warm and cold maximisations stop at the same optimum up to the optimizer tolerance.
    const fit = fitGno(returns.subarray(t - window, t));
    expectClose(`row ${t}`, out.values[t], valueAtRisk(0.99, fit.params), { rel: 1e-5 });
  });
  test("changing row t does not change row t's forecast (only later rows)", () => {
    const changed = Float64Array.from(returns);
    changed[100] = -0.2;
    const again = rollingVar(changed, window, 0.99);
    for (let t = 0; t <= 100; t++) expect(Object.is(again.values[t], out.values[t])).toBe(true);
    expect(again.values[101]).not.toBe(out.values[101]);
  });
  test("short side and the L-moment method use the same windows", () => {
    const s = rollingVar(returns, window, 0.95, { side: "short", method: "lmom" });
    for (const t of [60, 120, 159]) {
      const p = fitGnoQuick(returns.subarray(t - window, t), { method: "lmom" }).params;
      expect(s.values[t]).toBe(valueAtRisk(0.95, p, "short"));
    }
  });
});

describe("gaps and failures", () => {
  test("missing returns are left out of every window and get no forecast", () => {
    const withGaps = Float64Array.from(returns);
    withGaps[5] = NaN;
    withGaps[70] = NaN;
    const out = rollingVar(withGaps, 50, 0.99);
    expect(out.values[70]).toBeNaN();
    // Usable rows before row 51 are 50 (row 5 is missing), so row 51 is the first forecast.
    expect(out.values[50]).toBeNaN();
    expect(Number.isFinite(out.values[51])).toBe(true);
    // Row 75's window is the 50 usable rows before it: rows 24…74 without row 70.
    const usable = Array.from(withGaps.subarray(24, 75)).filter((x) => !Number.isNaN(x));
    expect(usable.length).toBe(50);
    const fit = fitGno(Float64Array.from(usable));
    expectClose("row 75", out.values[75], valueAtRisk(0.99, fit.params), { rel: 1e-5 });
  });
  test("a window of constant returns is reported as a failed row, not an exception", () => {
    const flat = new Float64Array(30).fill(0.001);
    flat[25] = 0.02;
    const out = rollingVar(flat, 12, 0.99);
    expect(out.failedRows).toContain(12);
    expect(out.values[12]).toBeNaN();
    expect(Number.isFinite(out.values[29])).toBe(true);
  });
  test("a bad window or confidence gives no forecasts", () => {
    expect(rollingVar(returns, 0, 0.99).forecasts).toBe(0);
    expect(rollingVar(returns, 50, 1).forecasts).toBe(0);
  });
});

describe('method "lmom" over a sliding sorted window equals the batch estimator row by row', () => {
  // Reference: fitGnoQuick(window, { method: "lmom" }) — the batch probability-weighted-moment estimator (Hosking 1990)
  // with a fresh sort of each window. Equality is exact (same sums over the same sorted values).
  function batch(r: Float64Array, window: number): { v: number[]; failed: number[] } {
    const usable: number[] = [];
    const rowOf: number[] = [];
    r.forEach((x, i) => {
      if (Number.isFinite(x)) {
        usable.push(x);
        rowOf.push(i);
      }
    });
    const v = new Array<number>(r.length).fill(NaN);
    const failed: number[] = [];
    for (let j = window; j < usable.length; j++) {
      try {
        v[rowOf[j]] = valueAtRisk(0.99, fitGnoQuick(Float64Array.from(usable.slice(j - window, j)), { method: "lmom" }).params);
      } catch {
        failed.push(rowOf[j]);
      }
    }
    return { v, failed };
  }
  const cases: [string, Float64Array, number][] = [];
  // seeded simulated returns, rounded to 4 decimals so the windows hold many ties
  const tied = sample({ location: 0, scale: 0.01, shape: -0.2 }, 400, 91).map((x) => Math.round(x * 1e4) / 1e4);
  cases.push(["ties", tied, 30]);
  // a constant stretch longer than the window (declined rows), then motion again, plus gaps
  const flat = Float64Array.from(sample({ location: 0, scale: 0.01, shape: 0.3 }, 300, 92));
  flat.fill(0.002, 100, 160);
  flat[40] = NaN;
  flat[170] = NaN;
  cases.push(["constant stretch and gaps", flat, 20]);
  // extreme scales: handled by the batch path inside the model, same numbers and messages
  cases.push(["tiny scale", sample({ location: 0, scale: 1e-120, shape: 0.1 }, 80, 93), 12]);
  cases.push(["huge scale", sample({ location: 0, scale: 1e120, shape: 0.1 }, 80, 94), 12]);
  cases.push(["plain", returns, 60]);
  test.each(cases)("%s", (_label, r, window) => {
    const got = rollingVar(r, window, 0.99, { method: "lmom" });
    const want = batch(r, window);
    for (let t = 0; t < r.length; t++) {
      if (!Object.is(got.values[t], want.v[t])) throw new Error(`row ${t}: got ${got.values[t]}, want ${want.v[t]} (window ${window})`);
    }
    expect(got.failedRows).toEqual(want.failed);
  });
  test("the constant stretch is declined with the batch path's reason", () => {
    expect(batch(flat, 20).failed.length).toBeGreaterThan(0);
  });
});
