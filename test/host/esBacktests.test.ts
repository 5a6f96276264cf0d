/**
 * ESBACKTEST, DESKTEST, PLATEST and BACKTEST's duration rows through the BUILT bundle, called as the host calls
 * them. References: the core results (src/core/risk/backtests, themselves checked against formulas, jstat, fmin
 * and scipy in test/core/risk/backtests) and the desk-rule boundaries of BCBS MAR32.19 / the MAR99 table.
 * Data are an invented, simulated scenario (seeded Student-t-like returns with a volatility cycle).
 */
import { loadBundle, Bundle } from "./harness";
import { shortfallZ } from "../../src/core/risk/backtests/shortfallZ";
import { multinomialTest } from "../../src/core/risk/backtests/multinomial";
import { attributionTest } from "../../src/core/risk/backtests/attribution";
import { durationTest } from "../../src/core/risk/backtests/duration";
import { exceptionSequence } from "../../src/core/risk/backtests/backtest";
import { uniformStream } from "../../src/core/random";

let b: Bundle;
beforeAll(async () => {
  b = await loadBundle();
});

/** Simulated desk: T days, Laplace-tailed returns; VaR/ES of that law (exact), PIT of each return. */
function scenario(T: number, seed: number) {
  const next = uniformStream(seed);
  const returns: number[][] = [];
  const vars: number[][] = [];
  const ess: number[][] = [];
  const pit: number[][] = [];
  for (let t = 0; t < T; t++) {
    const s = 0.008 * (1 + 0.5 * Math.sin(t / 30));
    const u = next();
    const x = u < 0.5 ? s * Math.log(2 * u) : -s * Math.log(2 * (1 - u));
    returns.push([x]);
    vars.push([-s * Math.log(0.05)]);
    ess.push([-s * Math.log(0.05) + s]);
    pit.push([u]);
  }
  return { returns, vars, ess, pit };
}

const col = (g: number[][]) => g.map((r) => r[0]);
const value = (t: unknown[][], label: string) => {
  const row = t.find((r) => r[0] === label);
  if (!row) throw new Error(`no row "${label}" in ${JSON.stringify(t.map((r) => r[0]))}`);
  return row[1];
};

describe("ESBACKTEST", () => {
  const d = scenario(500, 3);
  test("21 rows, the PIT rows blank without a PIT column; values equal the core results; no NaN or null", async () => {
    const t13 = (await b.run("ESBACKTEST", d.returns, d.vars, d.ess, 0.975, null, null)) as unknown[][];
    expect(t13.length).toBe(21);
    expect(t13.slice(13).every((r) => r[1] === "")).toBe(true);
    const t = (await b.run("ESBACKTEST", d.returns, d.vars, d.ess, 0.975, "long", d.pit)) as unknown[][];
    expect(t.length).toBe(21);
    for (const row of t) for (const c of row) expect(c === null || (typeof c === "number" && !Number.isFinite(c))).toBe(false);
    const z = shortfallZ(col(d.returns), col(d.vars), col(d.ess), 0.975)!;
    expect(value(t, "Observations used")).toBe(500);
    expect(value(t, "Exceptions (loss beyond VaR)")).toBe(z.exceptions);
    expect(value(t, "Z2")).toBe(z.z2);
    expect(value(t, "Z2 critical value 5%")).toBe(-0.7);
    const p = value(t, "Z2 p-value (simulated)") as number;
    expect(p > 0 && p <= 1).toBe(true);
    expect(value(t, "Multinomial p-value (Nass)")).toBe(multinomialTest(col(d.pit), 0.975)!.nassPValue);
    expect(["green", "yellow", "red"]).toContain(value(t, "ES traffic-light zone"));
    // Same inputs, same seeds: the simulated rows are reproducible.
    const again = (await b.run("ESBACKTEST", d.returns, d.vars, d.ess, 0.975, "long", d.pit)) as unknown[][];
    expect(again).toEqual(t);
  });
  test("at a confidence other than 97.5% the fixed critical values are blank and the verdict says so", async () => {
    const t = (await b.run("ESBACKTEST", d.returns, d.vars, d.ess, 0.95, null, null)) as unknown[][];
    expect(value(t, "Z2 critical value 5%")).toBe("");
    expect(String(value(t, "Z2 verdict"))).toMatch(/no fixed critical value/);
  });
  test("messaged errors: ES below VaR, lengths differ, PIT outside [0, 1], text in a column", async () => {
    const badEs = d.ess.map((r, i) => (i === 7 ? [0.001] : r));
    expect(b.errorOf(await b.run("ESBACKTEST", d.returns, d.vars, badEs, 0.975, null, null))?.message).toMatch(/row 8.*below the VaR/);
    expect(b.errorOf(await b.run("ESBACKTEST", d.returns.slice(1), d.vars, d.ess, 0.975, null, null))?.message).toMatch(/same length/);
    const badPit = d.pit.map((r, i) => (i === 2 ? [1.5] : r));
    expect(b.errorOf(await b.run("ESBACKTEST", d.returns, d.vars, d.ess, 0.975, null, badPit))?.message).toMatch(/pit at row 3/);
    expect(b.errorOf(await b.run("ESBACKTEST", d.returns.slice(0, 9), d.vars.slice(0, 9), d.ess.slice(0, 9), 0.975, null, null))?.message).toMatch(/at least 10/);
    const text = d.returns.map((r, i) => (i === 4 ? ["x"] : r)) as unknown[][];
    expect(b.errorOf(await b.run("ESBACKTEST", text, d.vars, d.ess, 0.975, null, null))?.code).toBe("#VALUE!");
  });
  test("cancelable: the host's cancel stops a long run", async () => {
    const big = scenario(20_000, 9);
    const { value: v, handlerInstalled } = await b.runAndCancel("ESBACKTEST", 30, big.returns, big.vars, big.ess, 0.975, null, null);
    expect(handlerInstalled).toBe(true);
    expect(b.errorOf(v)?.message).toMatch(/Canceled/);
  });
  test("more than 20000 rows is refused with the bound in the message", async () => {
    const many = Array.from({ length: 20_001 }, () => [0.001]);
    expect(b.errorOf(await b.run("ESBACKTEST", many, many, many, 0.975, null, null))?.message).toMatch(/at most 20000/);
  });
});

describe("DESKTEST", () => {
  const rows = (k: number) => Array.from({ length: 250 }, (_, i) => [i < k ? -2 : 0.5]);
  const v99 = Array.from({ length: 250 }, () => [1.8]);
  const v975 = Array.from({ length: 250 }, () => [1.2]);
  test("12 exceptions at 99% within limits, 13 breached; multiplier 1.50 at 4, 1.70 at 5 (MAR32.19, MAR99)", async () => {
    const t12 = b.call("DESKTEST", rows(12), v99, v975, null) as unknown[][];
    const t13 = b.call("DESKTEST", rows(13), v99, v975, null) as unknown[][];
    expect(t12.length).toBe(13);
    expect(value(t12, "Desk verdict")).toBe("within limits");
    expect(value(t13, "Desk verdict")).toBe("limit breached");
    expect(value(b.call("DESKTEST", rows(4), v99, v975, null) as unknown[][], "Multiplier")).toBe(1.5);
    expect(value(b.call("DESKTEST", rows(5), v99, v975, null) as unknown[][], "Multiplier")).toBe(1.7);
    expect(value(t12, "Hypothetical: exceptions at 99%")).toBe("");
  });
  test("hypothetical P&L counts too; a blank day is an exception", async () => {
    const hyp = rows(13);
    const t = b.call("DESKTEST", rows(2), v99, v975, hyp) as unknown[][];
    expect(value(t, "Desk verdict")).toBe("limit breached");
    expect(value(t, "Bank-level exceptions at 99%")).toBe(13);
    const gap = rows(0).map((r, i) => (i === 100 ? [""] : r));
    const g = b.call("DESKTEST", gap, v99, v975, null) as unknown[][];
    expect(value(g, "Actual: exceptions at 99%")).toBe(1);
    expect(value(g, "Days without P&L or VaR")).toBe(1);
  });
});

describe("PLATEST", () => {
  test("equals the core attribution test; 7 rows", () => {
    const next = uniformStream(12);
    const h = Array.from({ length: 300 }, () => [next() - 0.5]);
    const r = h.map((x) => [x[0] + 0.2 * (next() - 0.5)]);
    const t = b.call("PLATEST", h, r) as unknown[][];
    expect(t.length).toBe(7);
    const core = attributionTest(col(h), col(r))!;
    expect(value(t, "Paired days used")).toBe(250);
    expect(value(t, "Spearman correlation")).toBe(core.spearman);
    expect(value(t, "KS statistic")).toBe(core.ks);
    expect(value(t, "Attribution zone")).toBe(core.zone);
  });
});

describe("BACKTEST duration rows", () => {
  test("rows 17–20 carry the Christoffersen–Pelletier test of the same exception sequence", () => {
    const d = scenario(1000, 5);
    const t = b.call("BACKTEST", d.returns, d.vars, 0.975, null) as unknown[][];
    expect(t.length).toBe(20);
    const core = durationTest(exceptionSequence(col(d.returns), col(d.vars), "long"));
    expect(value(t, "Duration test informative")).toBe(core.informative);
    expect(value(t, "Duration LR (Weibull vs exponential)")).toBe(core.statistic);
    expect(value(t, "Duration Weibull shape")).toBe(core.shape);
  });
});
