/**
 * Pareto tails through the BUILT bundle, called as the host calls them: the 9-cell params in PDF, CDF, QUANTILE,
 * VAR, SHORTFALL, RANDOM, MOMENTS, BOUND (3 cells unchanged; 9 cells with both sides blank = the 3), TAILFIT and
 * TAILREPORT. References: the core functions of src/core/pareto (tested against outside references in
 * test/core/pareto) — the adapters must pass their numbers through unchanged; the body-only results against the
 * 3-cell path (backward compatibility).
 */
import * as gno from "../../src/core/gno";
import * as pareto from "../../src/core/pareto";
import { fitGno } from "../../src/core/fit";
import { fitVolatility } from "../../src/core/vol";
import { innovationLaw } from "../../src/core/vol/innovation";
import { createModel, rollingForecasts } from "../../src/core/risk";
import { runToEnd } from "../../src/core/work";
import { loadBundle, col, Bundle } from "./harness";

let b: Bundle;
beforeAll(async () => {
  b = await loadBundle();
});

const body = { location: 0.0003, scale: 0.012, shape: -0.08 };
const law: pareto.SplicedParams = {
  body,
  lower: { threshold: gno.quantile(0.1, body), shape: 0.28, scale: 0.007 },
  upper: { threshold: gno.quantile(0.92, body), shape: -0.1, scale: 0.006 },
};
const nine = (p: pareto.SplicedParams): unknown[][] => pareto.splicedCells(p).map((v) => [Number.isNaN(v) ? null : v]);
const three = [[body.location], [body.scale], [body.shape]];
const first = (v: unknown): unknown => (v as unknown[][])[0][0];

describe("params with 3 or 9 cells", () => {
  const xs = [-0.06, -0.02, 0, 0.015, 0.05];
  test("9 cells route PDF, CDF, QUANTILE, VAR and ES to the spliced law", () => {
    const p = nine(law);
    const cdf = b.call("CDF", col(xs), p) as number[][];
    const pdf = b.call("PDF", col(xs), p) as number[][];
    xs.forEach((x, i) => {
      expect(cdf[i][0]).toBe(pareto.splicedCdf(x, law));
      expect(pdf[i][0]).toBe(pareto.splicedPdf(x, law));
    });
    expect(first(b.call("QUANTILE", [[0.001]], p))).toBe(pareto.splicedQuantile(0.001, law));
    for (const side of ["long", "short"] as const) {
      expect(first(b.call("VAR", [[0.99]], p, side))).toBe(pareto.splicedValueAtRisk(0.99, law, side));
      expect(first(b.call("SHORTFALL", [[0.975]], p, side))).toBe(pareto.splicedExpectedShortfall(0.975, law, side));
    }
    // The tail makes a difference where it should: the 99.9% loss is larger than the body's.
    expect(first(b.call("VAR", [[0.999]], p)) as number).toBeGreaterThan(first(b.call("VAR", [[0.999]], three)) as number);
  });

  test("9 cells with both sides blank (null, \"\" or 0) give exactly the 3-cell results", () => {
    for (const blank of [null, "", 0]) {
      const p = [...three, [blank], [blank], [blank], [blank], [blank], [blank]];
      for (const id of ["CDF", "PDF"]) expect(b.call(id, col(xs), p)).toEqual(b.call(id, col(xs), three));
      expect(b.call("VAR", [[0.99]], p)).toEqual(b.call("VAR", [[0.99]], three));
      expect(b.call("SHORTFALL", [[0.99]], p)).toEqual(b.call("SHORTFALL", [[0.99]], three));
      expect(b.call("MOMENTS", p)).toEqual(b.call("MOMENTS", three));
      expect(b.call("RANDOM", p, 5, 3)).toEqual(b.call("RANDOM", three, 5, 3));
    }
  });

  test("3 cells still give the body's results exactly; a 9-cell range is refused where tails are not supported", () => {
    expect(first(b.call("CDF", [[-0.02]], three))).toBe(gno.cdf(-0.02, body));
    const e = b.errorOf(b.call("LOGLIK", col([0.01, 0.02, -0.01, 0, 0.003, 0.004, -0.02, 0.01, 0.02, -0.005]), nine(law)));
    expect(e?.code).toBe("#VALUE!");
    expect(e?.message).toMatch(/3 cells/);
  });

  test("one side only: the other side's three cells left blank", () => {
    const loss = { ...law, upper: null };
    const p = nine(loss).map((r, i) => (i >= 6 ? [""] : r));
    expect(first(b.call("CDF", [[-0.05]], p))).toBe(pareto.splicedCdf(-0.05, loss));
    expect(first(b.call("CDF", [[0.05]], p))).toBe(gno.cdf(0.05, body));
  });

  test("a half-filled side, a β ≤ 0 or a threshold outside the body's support is #VALUE! saying which", () => {
    const half = nine(law).map((r, i) => (i === 5 ? [null] : r));
    expect(b.errorOf(b.call("CDF", [[0]], half))?.message).toMatch(/lower tail's β is blank/);
    const negBeta = nine(law).map((r, i) => (i === 8 ? [-1] : r));
    expect(b.errorOf(b.call("CDF", [[0]], negBeta))?.message).toMatch(/upper tail's β must be greater than 0/);
    const edgeBody = { location: 0, scale: 1, shape: 0.5 }; // upper edge at 2
    const outside = [[0], [1], [0.5], [null], [null], [null], [3], [0.1], [1]];
    expect(b.errorOf(b.call("CDF", [[0]], outside))?.message).toMatch(/outside the body's support/);
    void edgeBody;
    const crossed = nine(law).map((r, i) => (i === 6 ? [law.lower!.threshold - 0.01] : r));
    expect(b.errorOf(b.call("CDF", [[0]], crossed))?.message).toMatch(/below the upper threshold/);
  });

  test("RANDOM draws the spliced law with the seed; BOUND gives the one finite end", () => {
    expect((b.call("RANDOM", nine(law), 4, 11) as number[][]).map((r) => r[0])).toEqual(Array.from(pareto.splicedSample(law, 4, 11)));
    // Loss tail with ξ < 0 (a finite end), no gain tail (the body, shape < 0, is unbounded above).
    const lossBounded = { ...law, lower: { ...law.lower!, shape: -0.2 }, upper: null };
    const end = law.lower!.threshold + law.lower!.scale / -0.2;
    expect(b.call("BOUND", nine(lossBounded))).toBeCloseTo(end, 15);
    const twoEdges = { ...law, lower: { ...law.lower!, shape: -0.2 } };
    const e = b.errorOf(b.call("BOUND", nine(twoEdges)));
    expect(e?.code).toBe("#N/A");
    expect(e?.message).toMatch(/Two edges/);
  });

  test("MOMENTS: finite moments as numbers, a moment the tails lack as #N/A saying why", () => {
    const m = b.call("MOMENTS", nine(law)) as unknown[][];
    const core = pareto.splicedMoments(law);
    expect(m[0][0]).toBe(core.mean);
    expect(m[1][0]).toBe(core.sd);
    expect(m[2][0]).toBe(core.skewness);
    // lower ξ 0.28 ≥ 1/4: no fourth moment.
    const e = b.errorOf([[m[3][0]]]);
    expect(e?.code).toBe("#N/A");
    expect(e?.message).toMatch(/order 4/);
  });
});

describe("TAILFIT and TAILREPORT", () => {
  const x = Array.from(pareto.splicedSample(law, 1500, 5));

  test("TAILFIT returns the core's 9 params; a side without a tail is blank", async () => {
    const got = (await b.run("TAILFIT", col(x), null, "both", null)) as unknown[][];
    const core = pareto.fitSpliced(Float64Array.from(x), { sides: "both", body: fitGno(Float64Array.from(x)) });
    expect(got.map((r) => r[0])).toEqual(pareto.splicedCells(core.params));
    const loss = (await b.run("TAILFIT", col(x), 0.05, null, "pwm")) as unknown[][];
    expect(loss).toHaveLength(9);
    expect(loss.slice(6).map((r) => r[0])).toEqual(["", "", ""]);
    expect(typeof loss[4][0]).toBe("number");
  });

  test("TAILFIT's result feeds VAR and ES directly", async () => {
    const p = (await b.run("TAILFIT", col(x))) as unknown[][];
    const v = first(b.call("VAR", [[0.99]], p)) as number;
    const es = first(b.call("SHORTFALL", [[0.99]], p)) as number;
    expect(es).toBeGreaterThan(v);
    expect(v).toBeGreaterThan(0);
  });

  test("TAILREPORT shows the fit in its fixed rows", async () => {
    const t = (await b.run("TAILREPORT", col(x), 0.1, "loss")) as unknown[][];
    expect(t).toHaveLength(37);
    const row = (label: string): unknown => t.find((r) => r[0] === label)?.[1];
    const core = pareto.fitSpliced(Float64Array.from(x), { sides: "loss", body: fitGno(Float64Array.from(x)) });
    expect(row("observations")).toBe(1500);
    expect(row("loss tail exceedances")).toBe(150);
    expect(row("loss tail ξ")).toBe(core.lower!.fit.params.shape);
    expect(row("loss tail ξ std. error")).toBe(core.lower!.fit.standardErrors![0]);
    expect(row("gain tail ξ")).toBe("");
    expect(typeof row("warnings")).toBe("string");
  });

  test("too few exceedances, a bad share or a bad keyword is #VALUE! with the reason", async () => {
    expect(b.errorOf(await b.run("TAILFIT", col(x.slice(0, 50))))?.message).toMatch(/at least 10/);
    expect(b.errorOf(await b.run("TAILFIT", col(x), 0.7))?.message).toMatch(/tail must be/);
    expect(b.errorOf(await b.run("TAILFIT", col(x), null, "left"))?.message).toMatch(/sides/);
    expect(b.errorOf(await b.run("TAILREPORT", col(x), null, null, "moments"))?.message).toMatch(/method/);
  });
});

describe("gno-gpd innovations in NEXTDAY and the rolling functions", () => {
  // Simulated returns (invented scenario): heavy-tailed spliced law, seeded.
  const r = Array.from(pareto.splicedSample(law, 700, 21));

  test("NEXTDAY(..., \"ewma\", \"gno-gpd\") is the core's spliced next-day law in 9 cells and feeds VAR", () => {
    const got = b.call("NEXTDAY", col(r), "ewma", "gno-gpd") as unknown[][];
    const est = fitVolatility(Float64Array.from(r), "ewma", { innovations: "gno" });
    const t = pareto.residualTailLaw(est.residuals, innovationLaw(est.shape), est.mean, est.nextSigma);
    expect(t.law).not.toBeNull();
    expect(got.map((row) => row[0])).toEqual(pareto.splicedCells(t.law!));
    expect(first(b.call("VAR", [[0.99]], got))).toBe(pareto.splicedValueAtRisk(0.99, t.law!));
  });

  test("NEXTDAY(..., \"iid\", \"gno-gpd\") is TAILFIT with both sides", async () => {
    expect(b.call("NEXTDAY", col(r), "iid", "gno-gpd")).toEqual(await b.run("TAILFIT", col(r), null, "both"));
  });

  test("ROLLVAR and ROLLES with model ewma and method gno-gpd give the core model's forecasts", async () => {
    const v = (await b.run("ROLLVAR", col(r), 500, 0.99, null, "gno-gpd", "ewma")) as unknown[][];
    const es = (await b.run("ROLLES", col(r), 500, 0.99, null, "gno-gpd", "ewma")) as unknown[][];
    const core = runToEnd(rollingForecasts(Float64Array.from(r), 500, createModel("ewma", { method: "gno-gpd" })));
    for (const i of [500, 600, 699]) {
      expect(v[i][0]).toBe(core.laws[i]!.valueAtRisk(0.99, "long"));
      expect(es[i][0]).toBe(core.laws[i]!.expectedShortfall(0.99, "long"));
      expect(core.laws[i]!.params).toHaveLength(9);
    }
    expect(v[10][0]).toBe("");
  });
});
