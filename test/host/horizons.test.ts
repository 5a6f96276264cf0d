/**
 * Horizon cell functions through the BUILT bundle, called as the host calls them: the horizon argument of VAR and
 * ES (blank and 1 are today's one-day figures bit for bit; h > 1 is the core h-day law), LIQES (MAR33.4
 * cascade, worked by hand: buckets 100, 80, 50, 30, 20 → √25600 = 160) and HORIZON (label/value table; i.i.d.
 * simulation within 4 Monte Carlo standard errors of the exact figures; reproducible for a seed; cancelable).
 * Data are an invented, simulated scenario (GNO draws via ASKEW.RANDOM).
 */
import { horizonLaw } from "../../src/core/risk/horizons";
import { loadBundle, Bundle } from "./harness";

let b: Bundle;
/** The expected-shortfall function's id (ES, being renamed SHORTFALL on another branch). */
let ES = "ES";
beforeAll(async () => {
  b = await loadBundle();
  ES = b.ids.some((id) => id.toUpperCase() === "SHORTFALL") ? "SHORTFALL" : "ES";
});

const P = (loc: number, scale: number, shape: number) => [[loc], [scale], [shape]];
const num = (v: unknown): number => {
  const x = Array.isArray(v) ? (v as unknown[][])[0][0] : v;
  if (typeof x !== "number") throw new Error(`expected a number, got ${JSON.stringify(v)}`);
  return x;
};
const closeAbs = (label: string, got: number, want: number, abs: number) => {
  if (!(Math.abs(got - want) <= abs)) throw new Error(`${label}: got ${got}, want ${want}, abs tol ${abs}`);
};
const row = (table: unknown[][], label: string): unknown => {
  const r = table.find((x) => x[0] === label);
  if (!r) throw new Error(`no row "${label}" in ${JSON.stringify(table)}`);
  return r[1];
};

describe("VAR and ES with a horizon", () => {
  test("blank, omitted and 1 give today's one-day figures bit for bit", () => {
    const levels = [[0.95], [0.99], [0.999]];
    for (const k of [-0.4, 0, 0.3, 1.2])
      for (const side of [null, "short"]) {
        for (const id of ["VAR", ES]) {
          const today = b.call(id, levels, P(0.0004, 0.011, k), side) as unknown[][];
          for (const h of [null, "", [[null]], 1, [[1]]]) expect(b.call(id, levels, P(0.0004, 0.011, k), side, h)).toEqual(today);
        }
      }
  });
  test("horizon 10 equals the core h-day law, on both sides", () => {
    const p = { location: 0.0004, scale: 0.011, shape: 0.25 };
    const law = horizonLaw(p, 10);
    expect(num(b.call("VAR", 0.99, P(0.0004, 0.011, 0.25), null, 10))).toBe(law.valueAtRisk(0.99, "long"));
    expect(num(b.call(ES, 0.975, P(0.0004, 0.011, 0.25), "short", 10))).toBe(law.expectedShortfall(0.975, "short"));
  });
  test("a horizon that is not a whole number from 1 to 250 is #VALUE!; a shape beyond ±0.75 beyond one day is #N/A with the reason", () => {
    expect(b.errorOf(b.call("VAR", 0.99, P(0, 0.01, 0.1), null, 251))?.code).toBe("#VALUE!");
    expect(b.errorOf(b.call("VAR", 0.99, P(0, 0.01, 0.1), null, 0))?.code).toBe("#VALUE!");
    expect(b.errorOf(b.call("VAR", 0.99, P(0, 0.01, 0.1), null, -1))?.code).toBe("#VALUE!");
    expect(b.errorOf(b.call(ES, 0.99, P(0, 0.01, 0.1), null, 2.5))?.code).toBe("#VALUE!");
    const e = b.errorOf(b.call("VAR", 0.99, P(0, 0.01, 0.9), null, 10));
    expect(e?.code).toBe("#N/A");
    expect(e?.message).toMatch(/HORIZON/);
  });
});

describe("LIQES", () => {
  test("buckets 100, 80, 50, 30, 20 give 160; a single bucket returns itself; custom horizons", () => {
    closeAbs("cascade", num(b.call("LIQES", [[100], [80], [50], [30], [20]], null)), 160, 1e-12);
    expect(num(b.call("LIQES", [[37.5]], null))).toBe(37.5);
    closeAbs("two buckets", num(b.call("LIQES", [[10, 10]], [[10, 20]])), Math.sqrt(200), 1e-13);
  });
  test("bad input names the problem", () => {
    expect(b.errorOf(b.call("LIQES", [[10], [10]], [[10], [10]]))?.message).toMatch(/increase/);
    expect(b.errorOf(b.call("LIQES", [[10], ["x"]], null))?.code).toBe("#VALUE!");
    expect(b.errorOf(b.call("LIQES", [[1], [2], [3], [4], [5], [6]], null))?.message).toMatch(/horizons/);
  });
});

describe("HORIZON", () => {
  const data = () => b.call("RANDOM", P(0.0004, 0.011, 0.2), 750, 2026) as number[][];
  test("iid: a 17×2 table; the simulated VaR and ES lie within 4 standard errors of the exact h-day figures", async () => {
    const t = (await b.run("HORIZON", data(), 0.99, 10, null, null, 20000, null)) as unknown[][];
    expect(t.length).toBe(17);
    expect(t.every((r) => r.length === 2)).toBe(true);
    const exactVar = row(t, "h-day VaR, exact i.i.d. law") as number;
    const simVar = row(t, "h-day VaR, simulated") as number;
    const varSe = row(t, "VaR Monte Carlo standard error") as number;
    closeAbs("VaR", simVar, exactVar, 4 * varSe);
    closeAbs("ES", row(t, "h-day ES, simulated") as number, row(t, "h-day ES, exact i.i.d. law") as number, 4 * (row(t, "ES Monte Carlo standard error") as number));
    expect(row(t, "paths simulated")).toBe(20000);
    expect(row(t, "one-day VaR × √h")).toBeCloseTo((row(t, "one-day VaR") as number) * Math.sqrt(10), 14);
  });
  test("the same seed gives the same table; another seed another simulation", async () => {
    const a = (await b.run("HORIZON", data(), 0.975, 5, "short", "iid", 5000, 7)) as unknown[][];
    const c = (await b.run("HORIZON", data(), 0.975, 5, "short", "iid", 5000, 7)) as unknown[][];
    const d = (await b.run("HORIZON", data(), 0.975, 5, "short", "iid", 5000, 8)) as unknown[][];
    expect(c).toEqual(a);
    expect(row(d, "h-day VaR, simulated")).not.toBe(row(a, "h-day VaR, simulated"));
  });
  test("garch and ewma fit and simulate; exact rows are blank", async () => {
    for (const m of ["garch", "ewma"]) {
      const t = (await b.run("HORIZON", data(), 0.99, 10, null, m, 5000, null)) as unknown[][];
      expect(row(t, "model")).toBe(m);
      expect(row(t, "h-day VaR, exact i.i.d. law")).toBe("");
      expect(typeof row(t, "h-day VaR, simulated")).toBe("number");
      expect(row(t, "VaR Monte Carlo standard error") as number).toBeGreaterThan(0);
    }
  });
  test("garch and ewma one-day rows equal VAR and ES of NEXTDAY's law (the same fit)", async () => {
    for (const m of ["garch", "ewma"]) {
      const t = (await b.run("HORIZON", data(), 0.99, 10, null, m, 2000, null)) as unknown[][];
      const law = b.call("NEXTDAY", data(), m, null) as number[][];
      expect(row(t, "one-day VaR")).toBe(num(b.call("VAR", 0.99, law, null)));
      expect(row(t, "one-day ES")).toBe(num(b.call(ES, 0.99, law, null)));
    }
  });
  test("paths × horizon beyond the bound is #VALUE! naming it; an unknown model is #VALUE!", async () => {
    const e = b.errorOf(await b.run("HORIZON", data(), 0.99, 250, null, null, 1_000_000, null));
    expect(e?.code).toBe("#VALUE!");
    expect(e?.message).toMatch(/50,000,000/);
    expect(b.errorOf(await b.run("HORIZON", data(), 0.99, 10, null, "arima", null, null))?.code).toBe("#VALUE!");
  });
  test("a long run stops when the host cancels it", async () => {
    const r = await b.runAndCancel("HORIZON", 50, data(), 0.99, 100, null, null, 400000, null);
    expect(r.handlerInstalled).toBe(true);
    expect(b.errorOf(r.value)?.code).toBe("#N/A");
  });
});
