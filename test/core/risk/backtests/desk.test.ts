/**
 * Desk-level rules and the P&L attribution test. Thresholds: BCBS d457 (January 2019) MAR32.19 (12 / 30
 * exceptions), MAR32.5(2) (unavailable days count), the MAR99 multiplier table and MAR32.42 (PLA zones), as
 * quoted in a secondary source (the primary text could not be retrieved: treat as from memory + that quotation).
 * Spearman and the two-sample KS statistic and p-value against scipy 1.17 (test/fixtures/backtests/runner.py).
 */
import fixture from "../../../fixtures/backtests/scipy_values.json";
import { expectClose } from "../check";
import { deskTest, multiplierFor, multiplierZone } from "../../../../src/core/risk/backtests/desk";
import { attributionTest, ksTwoSample, spearman, spearmanZone, ksZone } from "../../../../src/core/risk/backtests/attribution";

/** 250 days of P&L with losses of 2 (beyond both VaRs) on the first k99 days, 1.5 (beyond 97.5% only) on the next. */
function desk(k99: number, k975only: number): { pnl: number[]; v99: number[]; v975: number[] } {
  const pnl = Array.from({ length: 250 }, (_, i) => (i < k99 ? -2 : i < k99 + k975only ? -1.5 : 0.3));
  return { pnl, v99: Array(250).fill(1.8), v975: Array(250).fill(1.2) };
}

describe("MAR32 desk rules", () => {
  test("12 exceptions at 99% passes, 13 fails", () => {
    const a = desk(12, 0);
    expect(deskTest(a.pnl, a.v99, a.v975)!.deskPasses).toBe(true);
    const b = desk(13, 0);
    const r = deskTest(b.pnl, b.v99, b.v975)!;
    expect(r.actual.at99.exceptions).toBe(13);
    expect(r.deskPasses).toBe(false);
  });
  test("30 exceptions at 97.5% passes, 31 fails (with only 5 at 99%)", () => {
    const a = desk(5, 25);
    const ra = deskTest(a.pnl, a.v99, a.v975)!;
    expect(ra.actual.at975.exceptions).toBe(30);
    expect(ra.deskPasses).toBe(true);
    const b = desk(5, 26);
    expect(deskTest(b.pnl, b.v99, b.v975)!.deskPasses).toBe(false);
  });
  test("a breach in the hypothetical series alone fails the desk; the bank count is the larger 99% count", () => {
    const a = desk(3, 0);
    const h = desk(13, 0);
    const r = deskTest(a.pnl, a.v99, a.v975, h.pnl)!;
    expect(r.deskPasses).toBe(false);
    expect(r.bankExceptions).toBe(13);
    expect(r.multiplier).toBe(2);
  });
  test("multiplier table: 4 → 1.50 green, 5 → 1.70 amber, 9 → 1.92, 10 → 2.00 red", () => {
    expect([0, 1, 2, 3, 4].map(multiplierFor)).toEqual([1.5, 1.5, 1.5, 1.5, 1.5]);
    expect([5, 6, 7, 8, 9].map(multiplierFor)).toEqual([1.7, 1.76, 1.83, 1.88, 1.92]);
    expect(multiplierFor(10)).toBe(2);
    expect(multiplierFor(40)).toBe(2);
    expect([4, 5, 9, 10].map(multiplierZone)).toEqual(["green", "amber", "amber", "red"]);
    const d4 = desk(4, 0);
    const d5 = desk(5, 0);
    expect(deskTest(d4.pnl, d4.v99, d4.v975)!.multiplier).toBe(1.5);
    expect(deskTest(d5.pnl, d5.v99, d5.v975)!.multiplier).toBe(1.7);
  });
  test("only the latest 250 rows count; a missing P&L or VaR day counts as an exception", () => {
    const a = desk(0, 0);
    const pnl = [...Array(40).fill(-9), ...a.pnl];
    const v99 = [...Array(40).fill(1), ...a.v99];
    const v975 = [...Array(40).fill(1), ...a.v975];
    const r = deskTest(pnl, v99, v975)!;
    expect(r.window).toBe(250);
    expect(r.actual.at99.exceptions).toBe(0);
    pnl[100] = NaN;
    v975[200] = NaN;
    const g = deskTest(pnl, v99, v975)!;
    expect(g.actual.at99).toEqual({ exceptions: 1, unavailable: 1 });
    expect(g.actual.at975).toEqual({ exceptions: 2, unavailable: 2 });
    expect(g.unavailableDays).toBe(2);
    // Rows blank in every column are not days (padding, a whole-column reference): skipped, not exceptions.
    const padded = deskTest([...a.pnl, NaN, NaN], [...a.v99, NaN, NaN], [...a.v975, NaN, NaN])!;
    expect(padded.window).toBe(250);
    expect(padded.actual.at99.exceptions).toBe(0);
    const short = deskTest(a.pnl.slice(0, 100), a.v99.slice(0, 100), a.v975.slice(0, 100))!;
    expect(short.shortWindow).toBe(true);
    expect(short.window).toBe(100);
  });
});

describe("P&L attribution", () => {
  test("Spearman against scipy.stats.spearmanr (ties averaged), 1e-12", () => {
    for (const c of fixture.spearman) expectClose(`spearman n=${c.x.length}`, spearman(c.x, c.y), c.rho, { abs: 1e-12 });
  });
  test("two-sample KS statistic and exact p-value against scipy.stats.ks_2samp(method='exact')", () => {
    for (const c of fixture.ks2) {
      const got = ksTwoSample(c.x, c.y);
      expectClose(`D n=${c.x.length}`, got.statistic, c.statistic, { abs: 1e-12 });
      expectClose(`p n=${c.x.length}`, got.pValue, c.pValue, { rel: 1e-9, abs: 1e-14 });
    }
  });
  test("zones at the thresholds: 0.80 and 0.70 amber; KS 0.09 and 0.12 amber", () => {
    expect([0.8000001, 0.8, 0.7, 0.6999999].map(spearmanZone)).toEqual(["green", "amber", "amber", "red"]);
    expect([0.088, 0.09, 0.12, 0.124].map(ksZone)).toEqual(["green", "amber", "amber", "red"]);
  });
  test("identical series are green; a shifted RTPL turns KS red; only the latest 250 paired days are used", () => {
    const h = Array.from({ length: 300 }, (_, i) => Math.sin(i * 1.7) + 0.01 * i);
    const same = attributionTest(h, h)!;
    expect(same.observations).toBe(250);
    expect(same.spearman).toBeCloseTo(1, 12);
    expect(same.ks).toBe(0);
    expect(same.zone).toBe("green");
    const shifted = attributionTest(h, h.map((x) => x + 0.5))!;
    expect(shifted.spearman).toBeCloseTo(1, 12);
    expect(shifted.ksZone).toBe("red");
    expect(shifted.zone).toBe("red");
    const withGaps = [...h];
    withGaps[299] = NaN;
    expect(attributionTest(withGaps, h)!.observations).toBe(250);
  });
});
