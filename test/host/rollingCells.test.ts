/**
 * The decay argument of the volatility and rolling cells, the rolling content cache and the #N/A rows of models
 * that cannot give a value, through the BUILT bundle as the host calls them (npm run build first). References: the
 * EWMA recursion by hand (RiskMetrics Technical Document 1996, §5.2) and the core models (src/core/risk,
 * src/core/vol) for consistency. Data: an invented, simulated scenario (seeded GARCH with skewed innovations).
 */
import { createModel, rollingForecasts } from "../../src/core/risk";
import { fitVolatility } from "../../src/core/vol";
import { runToEnd } from "../../src/core/work";
import { sample } from "../../src/core/gno";
import { simulateGarch } from "../core/vol/simulate";
import { loadBundle, type Bundle } from "./harness";

let b: Bundle;
beforeAll(async () => {
  b = await loadBundle();
});

const col = (x: ArrayLike<number>) => Array.from(x, (v) => [v]);
const sim = simulateGarch({ mu: 0.0003, omega: 3e-6, alpha: 0.1, beta: 0.87, k: 0.3 }, 400, 43).returns;

describe("decay (λ)", () => {
  test("VOLATILITY ewma with decay 0.97 follows σ²ₜ₊₁ = 0.97σ²ₜ + 0.03r²ₜ row to row (by hand), unlike the default 0.94", () => {
    const v = (b.call("VOLATILITY", col(sim), "ewma", null, 0.97) as number[][]).map((r) => r[0]);
    const d = (b.call("VOLATILITY", col(sim), "ewma", null, null) as number[][]).map((r) => r[0]);
    let worst = 0;
    for (let t = 0; t + 1 < sim.length; t++) {
      const want = 0.97 * v[t] ** 2 + 0.03 * sim[t] ** 2;
      worst = Math.max(worst, Math.abs(v[t + 1] ** 2 - want) / want);
    }
    expect(worst).toBeLessThan(1e-12); // rounding only
    expect(Math.abs(d[300] - v[300])).toBeGreaterThan(1e-6 * v[300]);
  });
  test("NEXTDAY and VOLFIT ewma read decay as the core's λ", () => {
    const core = fitVolatility(sim, "ewma", { innovations: "gno", lambda: 0.9 });
    const nd = b.call("NEXTDAY", col(sim), "ewma", null, 0.9) as number[][];
    expect([nd[0][0], nd[1][0], nd[2][0]]).toEqual([core.nextDay.location, core.nextDay.scale, core.nextDay.shape]);
    const t = new Map((b.call("VOLFIT", col(sim), "ewma", null, 0.9) as unknown[][]).map((r) => [r[0] as string, r[1]]));
    const t0 = new Map((b.call("VOLFIT", col(sim), "ewma", null, null) as unknown[][]).map((r) => [r[0] as string, r[1]]));
    expect(t.get("log-likelihood")).toBe(core.logLikelihood);
    expect(t0.get("log-likelihood")).not.toBe(core.logLikelihood);
  });
  test.each([
    ["ewma", null, 0.9],
    ["fhs", null, 0.97],
    ["hs", null, 0.98],
  ])("ROLLVAR model %s, method %s, decay %s equals the core model with that λ row by row", async (model, method, decay) => {
    const core = runToEnd(rollingForecasts(sim, 150, createModel(model, { method: method ?? undefined, lambda: decay })));
    const v = (await b.run("ROLLVAR", col(sim), 150, 0.99, null, method, model, decay)) as unknown[][];
    const dflt = (await b.run("ROLLVAR", col(sim), 150, 0.99, null, method, model, null)) as unknown[][];
    let differs = 0;
    for (let t = 0; t < sim.length; t++) {
      const law = core.laws[t];
      expect({ t, got: v[t][0] }).toEqual({ t, got: law ? law.valueAtRisk(0.99, "long") : "" });
      if (law && v[t][0] !== dflt[t][0]) differs++;
    }
    expect(differs).toBeGreaterThan(100);
  });
  test.each([0, 1, -0.5, 1.2, "fast"])("decay %s is #VALUE! with the (0, 1) rule", async (decay) => {
    for (const e of [b.errorOf(await b.run("ROLLES", col(sim), 150, 0.99, null, null, "ewma", decay)), b.errorOf(b.call("VOLATILITY", col(sim), "ewma", null, decay))]) {
      expect(e?.code).toBe("#VALUE!");
      expect(e?.message).toMatch(/decay/);
    }
  });
  test.each([
    ["iid", null],
    ["garch", null],
    ["cf", null],
    ["fhs", "garch"],
  ])("a model that does not read decay refuses it: %s %s", async (model, method) => {
    const e = b.errorOf(await b.run("ROLLPIT", col(sim), 150, 0.99, null, method, model, 0.9));
    expect(e?.code).toBe("#VALUE!");
    expect(e?.message).toMatch(/decay applies to models "ewma", "hs" and "fhs"/);
    expect(b.errorOf(b.call("NEXTDAY", col(sim), "garch", null, 0.9))?.message).toMatch(/applies to model "ewma" only/);
  });
});

describe("rows where the forecast law has no value for the measure", () => {
  // skewed simulated draws of the law (shape 0.3), short window: the Cornish–Fisher modified ES of the short side
  // falls below its VaR on some rows (the expansion is not a law there; Zangari 1996 / Favre & Galeano 2002 form)
  const x = sample({ location: 0, scale: 0.01, shape: 0.3 }, 400, 61);
  test('cf: ROLLES is #N/A with the reason where the modified ES does not exist, never ""; ROLLVAR has its number there', async () => {
    const core = runToEnd(rollingForecasts(x, 30, createModel("cf")));
    const es = (await b.run("ROLLES", col(x), 30, 0.99, "short", null, "cf")) as unknown[][];
    const v = (await b.run("ROLLVAR", col(x), 30, 0.99, "short", null, "cf")) as unknown[][];
    let missing = 0;
    for (let t = 0; t < x.length; t++) {
      const law = core.laws[t];
      if (t < 30) expect({ t, es: es[t][0] }).toEqual({ t, es: "" });
      if (!law || !Number.isNaN(law.expectedShortfall(0.99, "short"))) continue;
      missing++;
      const e = b.errorOf(es[t][0]);
      expect({ t, code: e?.code }).toEqual({ t, code: "#N/A" });
      expect(e?.message).toMatch(/no modified ES for this row: the modified ES .* falls below the VaR/);
      expect(typeof v[t][0]).toBe("number");
    }
    expect(missing).toBeGreaterThan(5);
    for (let t = 30; t < x.length; t++) expect({ t, blank: es[t][0] === "" }).toEqual({ t, blank: false });
  });
});
