/**
 * ASKEW.GOF and ASKEW.COMPARE through the BUILT bundle, called as the host calls them (2-D ranges, null for an
 * omitted optional argument, blanks as null or ""). Outside references: Marsaglia, Tsang & Wang 2003 (KS) and Marsaglia & Marsaglia 2004 (AD), J. Stat. Software; values recomputed with scipy 1.17 / mpmath outside the repo exact KS value
 * P(D_10 < 0.274) = 0.6284796154565043 and §6 Φ⁻¹(0.01) = −2.3263478740408408. Data are simulated (seeded).
 */
import { loadBundle, col, Bundle } from "./harness";
import { sample } from "../../src/core/gno";
import { normalQuantile } from "../../src/core/normal";

let b: Bundle;
beforeAll(async () => {
  b = await loadBundle();
});

type Table = unknown[][];
const value = (t: Table, label: string): unknown => {
  const row = t.find((r) => r[0] === label);
  if (!row) throw new Error(`no row "${label}" in ${JSON.stringify(t)}`);
  return row[1];
};
const noNonFinite = (t: Table): void => {
  for (const r of t) for (const c of r) if (typeof c === "number" && !Number.isFinite(c)) throw new Error(`non-finite cell in ${JSON.stringify(t)}`);
};

describe("ASKEW.GOF", () => {
  // Hand-built: u_i = 0.08(i − ½) for i ≤ 9 and u_10 = 1 − 0.274, sorted, so D⁺ = 0.274 at i = 10
  // (elsewhere i/10 − u_i ≤ 0.22) and D⁻ ≤ 0.04: D = 0.274.
  const u = Array.from({ length: 10 }, (_, i) => 0.08 * (i + 0.5));
  u[9] = 1 - 0.274;
  const x = u.map(normalQuantile);

  test("GOF(data, params) gives the exact KS p-value of Marsaglia, Tsang & Wang 2003 (KS) and Marsaglia & Marsaglia 2004 (AD), J. Stat. Software; values recomputed with scipy 1.17 / mpmath outside the repo and says how it was obtained", async () => {
    const t = await b.run("GOF", col(x), [[0, 1, 0]]) as Table;
    expect(t.map((r) => r[0])).toEqual(["KS D", "KS p-value", "AD A²", "AD p-value", "p-values from", "Observations", "Note"]);
    expect(Math.abs((value(t, "KS D") as number) - 0.274)).toBeLessThanOrEqual(1e-14);
    expect(Math.abs((value(t, "KS p-value") as number) - (1 - 0.6284796154565043))).toBeLessThanOrEqual(1e-12);
    expect(value(t, "p-values from")).toMatch(/given parameters.*resamples ignored/);
    expect(value(t, "Note")).toBe("");
    noNonFinite(t);
  });

  test("GOF(data) fits, bootstraps 199 resamples by default, skips blanks, and is reproducible", async () => {
    const data = Array.from(sample({ location: 0.0005, scale: 0.01, shape: -0.2 }, 120, 17));
    const withBlanks = [...data.slice(0, 50), null, "", ...data.slice(50)];
    const t1 = await b.run("GOF", col(withBlanks), null, null) as Table;
    const t2 = await b.run("GOF", col(data)) as Table;
    expect(t1).toEqual(t2);
    expect(value(t1, "p-values from")).toMatch(/bootstrap: 199 resamples, maximum-likelihood refit/);
    expect(value(t1, "Observations")).toBe(120);
    for (const label of ["KS p-value", "AD p-value"]) {
      const p = value(t1, label) as number;
      expect(p).toBeGreaterThanOrEqual(1 / 200);
      expect(p).toBeLessThanOrEqual(1);
    }
    noNonFinite(t1);
  });

  test("GOF rejects resamples outside 19…9,999 and work beyond the documented cap with #VALUE!", async () => {
    const data = col(Array.from(sample({ location: 0, scale: 1, shape: 0 }, 30, 1)));
    expect(b.errorOf(await b.run("GOF", data, null, 5))?.code).toBe("#VALUE!");
    expect(b.errorOf(await b.run("GOF", data, null, 10000))?.message).toMatch(/resamples/);
    const big = col(Array.from(sample({ location: 0, scale: 1, shape: 0 }, 5000, 2)));
    const e = b.errorOf(await b.run("GOF", big, null, 999));
    expect(e?.code).toBe("#VALUE!");
    expect(e?.message).toMatch(/at most 400 resamples/);
  });

  test("data outside the support of given params: A² reads \"infinite\", AD p = 0, and a note says why", async () => {
    const data = [...Array.from(sample({ location: 0, scale: 1, shape: 0.5 }, 20, 3)), 2.5];
    const t = await b.run("GOF", col(data), [[0], [1], [0.5]]) as Table;
    expect(value(t, "AD A²")).toBe("infinite");
    expect(value(t, "AD p-value")).toBe(0);
    expect(value(t, "Note")).toMatch(/1 observation lies outside the support/);
    noNonFinite(t);
  });

  test("GOF with bad params or text data gives #VALUE! naming the problem", async () => {
    expect(b.errorOf(await b.run("GOF", col(x), [[0, 1]]))?.message).toMatch(/3 cells/);
    expect(b.errorOf(await b.run("GOF", col([...x, "abc"])))?.message).toMatch(/row 11/);
  });
});

describe("ASKEW.COMPARE", () => {
  const data = Array.from(sample({ location: 0.0004, scale: 0.011, shape: -0.35 }, 600, 99));

  test("header row, five families best first, ΔAIC from 0, no NaN or Infinity", async () => {
    const t = await b.run("COMPARE", col(data)) as Table;
    expect(t[0]).toEqual(["Family", "Log-likelihood", "Parameters", "AIC", "BIC", "ΔAIC", "VaR 99%"]);
    expect(t.length).toBe(6);
    const names = t.slice(1).map((r) => String(r[0]).replace(/ \(.*\)$/, "")).sort();
    expect(names).toEqual(["Asymmetric Laplace", "Generalized normal", "Johnson SU", "Normal", "Student t"]);
    expect(t[1][5]).toBe(0);
    for (let i = 2; i < t.length; i++) expect(t[i][5] as number).toBeGreaterThanOrEqual(t[i - 1][5] as number);
    noNonFinite(t);
  });

  test("the normal row's VaR 99% is −(mean + sd·Φ⁻¹(0.01)) with the divisor-n sd (mpmath at 40 digits; methods Wichura 1988 AS 241 and Cody 1969)", async () => {
    const t = await b.run("COMPARE", col(data)) as Table;
    const row = t.find((r) => r[0] === "Normal")!;
    const n = data.length;
    const mean = data.reduce((s, v) => s + v, 0) / n;
    const sd = Math.sqrt(data.reduce((s, v) => s + (v - mean) ** 2, 0) / n);
    expect(Math.abs((row[6] as number) + (mean - 2.3263478740408408 * sd))).toBeLessThanOrEqual(1e-12);
    expect(row[2]).toBe(2);
  });

  test("COMPARE rejects fewer than 10 numbers with #VALUE!", async () => {
    expect(b.errorOf(await b.run("COMPARE", col([0.01, 0.02, -0.01])))?.code).toBe("#VALUE!");
  });
});
