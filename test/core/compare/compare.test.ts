/**
 * The comparison table: normal family against jstat's normal pdf (body), each row's 99% VaR against the family's
 * own quantile with Φ⁻¹(0.01) from mpmath (40 digits), ranking by AIC (Akaike 1974) and recovery of the true family
 * from seeded simulations.
 */
import { jStat } from "../../refs/jstat";
import { compareFamilies, fitNormal } from "../../../src/core/compare";
import { sample } from "../../../src/core/gno";

describe("compareFamilies", () => {
  const gnoData = sample({ location: 0.0005, scale: 0.01, shape: -0.45 }, 1500, 101);

  test("normal row: closed-form MLE, log-likelihood equal to the jstat normal density sum", () => {
    const f = fitNormal(gnoData);
    let want = 0;
    for (const x of gnoData) want += Math.log(jStat.normal.pdf(x, f.params.mean, f.params.sd));
    expect(Math.abs(f.logLikelihood - want)).toBeLessThanOrEqual(1e-10 * Math.abs(want));
  });

  test("rows are sorted by AIC, ΔAIC is 0 for the first, AIC/BIC follow their definitions, n is reported", () => {
    const c = compareFamilies(gnoData);
    expect(c.n).toBe(1500);
    expect(c.rows.map((r) => r.family).sort()).toEqual(["asymmetric-laplace", "gno", "johnson-su", "normal", "student-t"]);
    expect(c.rows[0].deltaAic).toBe(0);
    for (let i = 0; i < c.rows.length; i++) {
      const r = c.rows[i];
      expect(r.parameterCount).toBe(r.parameters.length);
      expect(Math.abs(r.aic - (2 * r.parameterCount - 2 * r.logLikelihood))).toBeLessThanOrEqual(1e-9 * Math.abs(r.aic));
      expect(Math.abs(r.bic - (r.parameterCount * Math.log(1500) - 2 * r.logLikelihood))).toBeLessThanOrEqual(1e-9 * Math.abs(r.bic));
      if (i > 0) expect(r.aic).toBeGreaterThanOrEqual(c.rows[i - 1].aic);
      expect(Number.isFinite(r.valueAtRisk99)).toBe(true);
    }
  });

  test("skewed GNO data: GNO or Johnson SU (its nearest rival) ranks first and the normal is far behind", () => {
    const c = compareFamilies(gnoData);
    expect(["gno", "johnson-su"]).toContain(c.best);
    const gno = c.rows.find((r) => r.family === "gno")!;
    const normal = c.rows.find((r) => r.family === "normal")!;
    expect(gno.deltaAic).toBeLessThan(4);
    expect(normal.deltaAic).toBeGreaterThan(20);
  });

  test("normal row's VaR is −(mean + sd·Φ⁻¹(0.01)), Φ⁻¹(0.01) = −2.3263478740408408 (mpmath at 40 digits; methods Wichura 1988 AS 241 and Cody 1969)", () => {
    const c = compareFamilies(gnoData);
    const f = fitNormal(gnoData);
    const normal = c.rows.find((r) => r.family === "normal")!;
    const want = -(f.params.mean - 2.3263478740408408 * f.params.sd);
    expect(Math.abs(normal.valueAtRisk99 - want)).toBeLessThanOrEqual(1e-13);
  });

  test("heavy symmetric tails (t with 4 dof): Student t beats the normal and the GNO", () => {
    const z = sample({ location: 0, scale: 1, shape: 0 }, 10000, 77);
    const x = new Float64Array(2000);
    for (let i = 0; i < 2000; i++) {
      const chi = z[5 * i + 1] ** 2 + z[5 * i + 2] ** 2 + z[5 * i + 3] ** 2 + z[5 * i + 4] ** 2;
      x[i] = 0.01 * (z[5 * i] / Math.sqrt(chi / 4));
    }
    const c = compareFamilies(x);
    const rank = (f: string): number => c.rows.findIndex((r) => r.family === f);
    expect(rank("student-t")).toBeLessThan(rank("normal"));
    expect(rank("student-t")).toBeLessThan(rank("gno"));
  });
});
