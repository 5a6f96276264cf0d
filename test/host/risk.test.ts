/**
 * The risk cell functions through the BUILT bundle, called as the host calls them (2-D ranges, null for an
 * omitted optional argument, blanks as null or ""). References: lognormal partial expectation with the Hosking & Wallis 1997 App. A.8 law; values recomputed with mpmath (40 digits) outside the repo check values (GNO VaR/ES,
 * recomputed there with scipy/mpmath), Kupiec 1995; Christoffersen 1998; Basel Committee 1996 backtesting framework; values recomputed with scipy 1.17 outside the repo (Kupiec/Christoffersen worked example, Basel 1996
 * table), the core fit (src/core/fit, the engine behind FIT) and the core VaR intervals (src/core/risk) for
 * VARCI/ROLLVAR consistency. Data are an invented, simulated scenario.
 */
import { fitGno } from "../../src/core/fit";
import { varInterval, varProfileInterval } from "../../src/core/risk";
import { loadBundle, Bundle } from "./harness";

let b: Bundle;
beforeAll(async () => {
  b = await loadBundle();
});

const P = (loc: number, scale: number, shape: number) => [[loc], [scale], [shape]];
const num = (v: unknown): number => {
  const x = Array.isArray(v) ? (v as unknown[][])[0][0] : v;
  if (typeof x !== "number") throw new Error(`expected a number, got ${JSON.stringify(v)}`);
  return x;
};
const closeRel = (label: string, got: number, want: number, rel: number) => {
  if (!(Math.abs(got - want) <= rel * Math.abs(want))) throw new Error(`${label}: got ${got}, want ${want}, rel tol ${rel}`);
};

/** Parameters of the maximum-likelihood fit to a column, as the 3×1 column FIT spills. */
function fitColumn(data: unknown[][]): number[][] {
  const p = fitGno(Float64Array.from(data.map((r) => r[0] as number))).params;
  return P(p.location, p.scale, p.shape);
}

/** A simulated daily-return column (invented scenario): a GNO with ξ = 0.0004, α = 0.011, k = 0.15, via RANDOM. */
function simulated(n: number, seed: number): number[][] {
  return b.call("RANDOM", P(0.0004, 0.011, 0.15), n, seed) as number[][];
}

describe("VAR and ES", () => {
  test("match lognormal partial expectation with the Hosking & Wallis 1997 App. A.8 law; values recomputed with mpmath (40 digits) outside the repo (ξ = 0.001, α = 0.01, k = −0.2 and 0.3) within 1e-13", async () => {
    closeRel("VAR k=-0.2", num(b.call("VAR", 0.99, P(0.001, 0.01, -0.2), null)), 0.0176017100694712, 1e-13);
    closeRel("ES k=-0.2", num(b.call("SHORTFALL", 0.975, P(0.001, 0.01, -0.2), null)), 0.0176028367464197, 1e-13);
    closeRel("VAR k=0.3", num(b.call("VAR", [[0.99]], P(0.001, 0.01, 0.3), "long")), 0.0326512343336949, 1e-13);
    closeRel("ES k=0.3", num(b.call("SHORTFALL", 0.99, [[0.001, 0.01, 0.3]], "")), 0.0401597997067423, 1e-13);
    closeRel("ES short k=-0.2", num(b.call("SHORTFALL", 0.99, P(0.001, 0.01, -0.2), "short")), 0.0363763259731979, 1e-13);
  });
  test("a range of confidence levels gives one value per cell; a bad level errors only its cell; a blank gives \"\"", async () => {
    const out = b.call("VAR", [[0.95], [1.5], [null], [0.99]], P(0, 0.01, 0), null) as unknown[][];
    expect(out.length).toBe(4);
    expect(typeof out[0][0]).toBe("number");
    expect(b.errorOf(out[1][0])?.code).toBe("#VALUE!");
    expect(out[2][0]).toBe("");
    expect(num(out[3][0])).toBeGreaterThan(num(out[0][0]));
  });
  test("rejects an unknown side with #VALUE! naming the choices", async () => {
    const e = b.errorOf(b.call("VAR", 0.99, P(0, 0.01, 0), "sideways"));
    expect(e?.code).toBe("#VALUE!");
    expect(e?.message).toMatch(/long/);
  });
});

describe("VARCI", () => {
  test("3×1: lower < VaR of the fit < upper, the middle equals VAR of FIT", async () => {
    const data = simulated(500, 11);
    const ci = await b.run("VARCI", data, 0.99, null, null) as number[][];
    expect(ci.length).toBe(3);
    const fit = fitColumn(data);
    closeRel("middle", ci[1][0], num(b.call("VAR", 0.99, fit, null)), 1e-12);
    expect(ci[0][0]).toBeLessThan(ci[1][0]);
    expect(ci[2][0]).toBeGreaterThan(ci[1][0]);
    const wide = await b.run("VARCI", data, 0.99, "long", 0.99) as number[][];
    expect(wide[2][0] - wide[0][0]).toBeGreaterThan(ci[2][0] - ci[0][0]);
  });
  test("by default the ends equal the core profile-likelihood interval for the same data (long and short, 1e-9)", async () => {
    const data = simulated(500, 11);
    const x = Float64Array.from(data.map((r) => r[0] as number));
    const fit = fitGno(x);
    for (const side of ["long", "short"] as const) {
      const cell = await b.run("VARCI", data, 0.99, side, 0.9, null) as number[][];
      const core = varProfileInterval(x, fit, 0.99, side, 0.9);
      expect(core.reason).toBeUndefined();
      closeRel(`${side} lower`, cell[0][0], core.lower, 1e-9);
      closeRel(`${side} VaR`, cell[1][0], core.valueAtRisk, 1e-12);
      closeRel(`${side} upper`, cell[2][0], core.upper, 1e-9);
    }
  });
  test("method \"delta\" gives the core delta-method interval; an unknown method is #VALUE!", async () => {
    const data = simulated(500, 11);
    const fit = fitGno(Float64Array.from(data.map((r) => r[0] as number)));
    const cell = await b.run("VARCI", data, 0.99, "long", null, "delta") as number[][];
    const core = varInterval(fit.params, fit.covariance!, 0.99, "long", 0.95);
    closeRel("delta lower", cell[0][0], core.lower, 1e-9);
    closeRel("delta upper", cell[2][0], core.upper, 1e-9);
    expect(b.errorOf(await b.run("VARCI", data, 0.99, null, null, "bootstrap"))?.code).toBe("#VALUE!");
  });
  test("a 12-point sample at level 0.99: the upper end the data cannot bound is #VALUE! with the reason; lower and VaR are numbers", async () => {
    // Invented 12-point sample with one large loss (a left-skewed fit, k ≈ 1.1): the profile flattens above the VaR.
    const x = [...Array(12)].map((_, i) => [Math.sin(i * 1.7) * 0.8 - (i === 3 ? 4.5 : 0)]);
    const out = await b.run("VARCI", x, 0.99, "long", 0.99, null) as unknown[][];
    expect(out.length).toBe(3);
    expect(typeof out[0][0]).toBe("number");
    expect(typeof out[1][0]).toBe("number");
    const e = b.errorOf(out[2][0]);
    expect(e?.code).toBe("#VALUE!");
    expect(e?.message).toMatch(/No upper end: upper end not found/);
  });
});

describe("ROLLVAR", () => {
  const data = () => simulated(120, 5);
  test("a column as long as returns, \"\" for the first window rows, then forecasts", async () => {
    const out = await b.run("ROLLVAR", data(), 60, 0.99, null, null) as unknown[][];
    expect(out.length).toBe(120);
    for (let t = 0; t < 60; t++) expect(out[t][0]).toBe("");
    for (let t = 60; t < 120; t++) expect(typeof out[t][0]).toBe("number");
  });
  test("row t equals VAR of FIT on rows t−window … t−1 (several rows, within 1e-5: optimizer tolerance)", async () => {
    const r = data();
    const out = await b.run("ROLLVAR", r, 60, 0.99, null, null) as unknown[][];
    for (const t of [60, 85, 119]) {
      const fit = fitColumn(r.slice(t - 60, t));
      closeRel(`row ${t}`, num(out[t][0]), num(b.call("VAR", 0.99, fit, null)), 1e-5);
    }
  });
  test("changing row t does not change row t's forecast", async () => {
    const r = data();
    const before = await b.run("ROLLVAR", r, 60, 0.99, null, null) as unknown[][];
    const changed = r.map((row) => [...row]);
    changed[90][0] = -0.25;
    const after = await b.run("ROLLVAR", changed, 60, 0.99, null, null) as unknown[][];
    expect(after[90][0]).toBe(before[90][0]);
    expect(after[91][0]).not.toBe(before[91][0]);
  });
  test("blank rows are skipped from windows and give \"\"", async () => {
    const r: unknown[][] = data();
    r[70] = [null];
    r[71] = [""];
    const out = await b.run("ROLLVAR", r, 60, 0.99, null, null) as unknown[][];
    expect(out[70][0]).toBe("");
    expect(out[71][0]).toBe("");
    expect(typeof out[72][0]).toBe("number");
  });
  test("window below 10, not less than the rows, or a fraction gives #VALUE! with a message", async () => {
    for (const w of [9, 120, 30.5]) {
      const e = b.errorOf(await b.run("ROLLVAR", data(), w, 0.99, null, null));
      expect({ w, code: e?.code }).toEqual({ w, code: "#VALUE!" });
      expect(e?.message).toMatch(/window/);
    }
  });
  test("more than 20,000 rows is refused with a message saying so", async () => {
    const big = Array.from({ length: 20001 }, (_, i) => [Math.sin(i) * 0.01]);
    const e = b.errorOf(await b.run("ROLLVAR", big, 250, 0.99, null, null));
    expect(e?.code).toBe("#VALUE!");
    expect(e?.message).toMatch(/20000|20,000/);
  });
});

describe("BACKTEST", () => {
  // Kupiec 1995; Christoffersen 1998; Basel Committee 1996 backtesting framework; values recomputed with scipy 1.17 outside the repo worked example: 250 days, 99%, exceptions on days 10, 11, 50, 120, 121.
  const hitDays = new Set([10, 11, 50, 120, 121]);
  const returns = Array.from({ length: 250 }, (_, i) => [hitDays.has(i + 1) ? -0.03 : 0.001]);
  const vars = Array.from({ length: 250 }, () => [0.02]);
  test("the label/value table reproduces Kupiec and Christoffersen and the yellow zone", async () => {
    const t = b.call("BACKTEST", returns, vars, 0.99, null) as unknown[][];
    expect(t.length).toBe(20);
    expect(t.every((row) => row.length === 2)).toBe(true);
    const value = (label: string) => t.find((row) => row[0] === label)?.[1];
    expect(value("Observations used")).toBe(250);
    expect(value("Exceptions")).toBe(5);
    closeRel("LR_pof", value("Kupiec POF LR") as number, 1.956809788, 1e-9);
    closeRel("LR_ind", value("Independence LR") as number, 9.894654433, 1e-9);
    closeRel("LR_cc", value("Conditional coverage LR") as number, 11.85146422, 1e-9);
    expect(value("Traffic-light zone")).toBe("yellow");
    expect(value("Most exceptions still green")).toBe(4);
    expect(value("Fewest exceptions in red")).toBe(10);
  });
  test("rows with a blank VaR are skipped", async () => {
    const v = vars.map((row, i) => (i < 10 ? [null] : row));
    const t = b.call("BACKTEST", returns, v, 0.99, null) as unknown[][];
    expect(t[0][1]).toBe(240);
  });
  test("different lengths give #VALUE!", async () => {
    const e = b.errorOf(b.call("BACKTEST", returns, vars.slice(1), 0.99, null));
    expect(e?.code).toBe("#VALUE!");
    expect(e?.message).toMatch(/same length/);
  });
  test("zero exceptions still gives a full table without errors", async () => {
    const t = b.call("BACKTEST", vars.map(() => [0.0]), vars, 0.99, null) as unknown[][];
    // Duration rows are blank ("") when the sequence has fewer than 2 complete durations; the flag row says so.
    expect(t.every((row) => b.errorOf(row[1]) === null && (row[1] !== "" || String(row[0]).startsWith("Duration")))).toBe(true);
    expect(t.find((row) => row[0] === "Duration test informative")?.[1]).toBe(false);
  });
});

describe("RETURNS", () => {
  test("log (default) and simple returns, one shorter than prices", async () => {
    const prices = [[100], [110], [99]];
    const log = b.call("RETURNS", prices, null) as number[][];
    expect(log.length).toBe(2);
    closeRel("log", log[0][0], Math.log(1.1), 1e-15);
    const simple = b.call("RETURNS", prices, "simple") as number[][];
    closeRel("simple", simple[1][0], -0.1, 1e-14);
  });
  test("a blank price leaves the two returns touching it blank", async () => {
    const out = b.call("RETURNS", [[100], [null], [102], [103]], null) as unknown[][];
    expect(out[0][0]).toBe("");
    expect(out[1][0]).toBe("");
    expect(typeof out[2][0]).toBe("number");
  });
  test("a price ≤ 0 or text gives #VALUE! naming the row", async () => {
    const e = b.errorOf(b.call("RETURNS", [[100], [0], [102]], null));
    expect(e?.code).toBe("#VALUE!");
    expect(e?.message).toMatch(/row 2/);
    const t = b.errorOf(b.call("RETURNS", [[100], ["abc"], [102]], null));
    expect(t?.message).toMatch(/row 2/);
  });
});
