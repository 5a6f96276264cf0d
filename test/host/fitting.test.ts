/**
 * FIT, FITREPORT and LOGLIK through the built bundle (dist/functions.js), called as the host calls them:
 * 2-D arrays, null for omitted optional arguments, blanks as null and "", error cells as host errors.
 * Expected values come from the core run on the same numbers (the bundle must agree with the source) and from
 * properties that hold whatever the numbers (row order, blanks skipped, messages naming the offending cell).
 * Data: an invented, simulated return series (gno.sample, location 0.0004, scale 0.011, shape 0.2).
 */
import { loadBundle, col, HostError, type Bundle } from "./harness";
import { fitGno, logLikelihood } from "../../src/core/fit";
import { sample } from "../../src/core/gno";
import { ROW_LABELS } from "../../src/functions/tables/fitReport";

let host: Bundle;
beforeAll(async () => {
  host = await loadBundle();
});

const returns = Array.from(sample({ location: 0.0004, scale: 0.011, shape: 0.2 }, 250, 77));
const rel = (a: number, b: number) => Math.abs(a - b) / Math.max(1e-300, Math.abs(b));

describe("ASKEW.FIT in the built bundle", () => {
  test("FIT(data) returns location, scale, shape as 3×1 matching the core fit (1e-10 relative)", async () => {
    const out = await host.run("FIT", col(returns)) as number[][];
    const want = fitGno(returns).params;
    expect(out.length).toBe(3);
    expect(rel(out[0][0], want.location)).toBeLessThan(1e-10);
    expect(rel(out[1][0], want.scale)).toBeLessThan(1e-10);
    expect(rel(out[2][0], want.shape)).toBeLessThan(1e-10);
  });
  test("FIT(data) skips blank cells (null and \"\")", async () => {
    const withBlanks = col([null, ...returns.slice(0, 100), "", ...returns.slice(100)]);
    expect(await host.run("FIT", withBlanks)).toEqual(await host.run("FIT", col(returns)));
  });
  test("FIT(data, \"lmom\") gives the L-moment estimate", async () => {
    const out = await host.run("FIT", col(returns), "lmom") as number[][];
    const want = fitGno(returns, { method: "lmom" }).params;
    expect(rel(out[2][0], want.shape)).toBeLessThan(1e-10);
  });
  test("FIT rejects text, booleans and error cells naming the row, and short or constant data", async () => {
    const bad = col([...returns.slice(0, 20)]);
    bad[4] = ["abc"];
    expect(host.errorOf(await host.run("FIT", bad))).toMatchObject({ code: "#VALUE!", message: expect.stringMatching(/row 5, column 1/) });
    bad[4] = [new HostError("#DIV/0!")];
    expect(host.errorOf(await host.run("FIT", bad))).toMatchObject({ code: "#VALUE!", message: expect.stringMatching(/row 5/) });
    bad[4] = [true];
    expect(host.errorOf(await host.run("FIT", bad))?.code).toBe("#VALUE!");
    expect(host.errorOf(await host.run("FIT", col(returns.slice(0, 9))))?.message).toMatch(/at least 10/);
    expect(host.errorOf(await host.run("FIT", col(new Array(30).fill(0.01))))?.message).toMatch(/equal/);
    expect(host.errorOf(await host.run("FIT", col(returns), "simplex"))?.code).toBe("#VALUE!");
  });
  test("FIT gives #N/A with the reason when the likelihood has no regular interior maximum; FITREPORT still explains", async () => {
    // 15 draws from a strongly right-skewed law whose likelihood runs up the edge ridge (independently confirmed
    // by a Nelder–Mead profile over k in test/core/fit/mle.test.ts); seeded, invented parameters.
    const ridge = Array.from(sample({ location: 0, scale: 1, shape: -1.5 }, 15, 4));
    const e = host.errorOf(await host.run("FIT", col(ridge)));
    expect(e).toMatchObject({ code: "#N/A", message: expect.stringMatching(/No regular maximum-likelihood fit.*lmom/) });
    const report = await host.run("FITREPORT", col(ridge)) as unknown[][];
    expect(report.length).toBeGreaterThan(20);
    expect(JSON.stringify(report)).toMatch(/Irregular/);
    expect(host.errorOf(await host.run("FIT", col(ridge), "lmom"))).toBeNull();
  });
});

describe("ASKEW.FITREPORT in the built bundle", () => {
  test("FITREPORT(data) is a label/value table in the documented order with no NaN or Infinity", async () => {
    const out = await host.run("FITREPORT", col(returns)) as unknown[][];
    expect(out.map((r) => r[0])).toEqual([...ROW_LABELS]);
    for (const r of out) {
      expect(r.length).toBe(2);
      if (typeof r[1] === "number") expect(Number.isFinite(r[1])).toBe(true);
      expect(r[1]).not.toBeNull();
    }
    const f = fitGno(returns);
    const byLabel = new Map(out.map((r) => [r[0] as string, r[1]]));
    expect(byLabel.get("observations")).toBe(250);
    expect(rel(byLabel.get("log-likelihood") as number, f.logLikelihood)).toBeLessThan(1e-12);
    expect(rel(byLabel.get("shape std. error") as number, f.standardErrors![2])).toBeLessThan(1e-9);
    expect(byLabel.get("edge side")).toBe(f.edge ? f.edge.side : "");
  });
  test('FITREPORT(data, "lmom") leaves the rows that do not apply (standard errors, LR test) blank', async () => {
    const out = await host.run("FITREPORT", col(returns), "lmom") as unknown[][];
    const byLabel = new Map(out.map((r) => [r[0] as string, r[1]]));
    expect(byLabel.get("method")).toBe("L-moments");
    expect(byLabel.get("shape std. error")).toBe("");
    expect(byLabel.get("LR p-value vs normal")).toBe("");
  });
});

describe("ASKEW.LOGLIK in the built bundle", () => {
  test("LOGLIK(data, params) equals the core log-likelihood", async () => {
    const p = { location: 0.0004, scale: 0.011, shape: 0.2 };
    const got = host.call("LOGLIK", col(returns), [[p.location, p.scale, p.shape]]) as number;
    expect(rel(got, logLikelihood(returns, p))).toBeLessThan(1e-12);
  });
  test("LOGLIK gives #N/A naming how many observations lie outside the support", async () => {
    const p = [[0, 0.011, 0.5]]; // upper edge at 0.022
    const outside = returns.filter((x) => x >= 0.022).length;
    expect(outside).toBeGreaterThan(0);
    const e = host.errorOf(host.call("LOGLIK", col(returns), p));
    expect(e?.code).toBe("#N/A");
    expect(e?.message).toMatch(new RegExp(`^${outside} of 250 observations`));
  });
});
