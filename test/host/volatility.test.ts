/**
 * VOLFIT, VOLATILITY, NEXTDAY and the rolling functions with a model, through the BUILT bundle as the host calls
 * them. References: the core (src/core/vol, src/core/risk) for consistency; the DEM/GBP benchmark of Fiorentini,
 * Calzolari & Panattoni (1996) through the cell (fixture from R fGarch, test/fixtures/fgarch/). Other data: an
 * invented, simulated scenario (test/core/vol/simulate.ts, seeded).
 */
import * as fs from "node:fs";
import * as path from "node:path";
import { createModel, rollingForecasts } from "../../src/core/risk";
import { fitVolatility } from "../../src/core/vol";
import { runToEnd } from "../../src/core/work";
import { simulateGarch } from "../core/vol/simulate";
import { loadBundle, type Bundle } from "./harness";

let b: Bundle;
beforeAll(async () => {
  b = await loadBundle();
});

const dem = (JSON.parse(fs.readFileSync(path.join(__dirname, "../fixtures/fgarch/dem2gbp.json"), "utf8")) as { returns: number[] }).returns;
const col = (x: ArrayLike<number>) => Array.from(x, (v) => [v]);
const sim = simulateGarch({ mu: 0.0003, omega: 3e-6, alpha: 0.1, beta: 0.87, k: 0.3 }, 700, 41).returns;
const table = (g: unknown) => new Map((g as unknown[][]).map((r) => [r[0] as string, r[1]]));

describe("VOLFIT", () => {
  test("GARCH with normal innovations on DEM/GBP shows the benchmark estimates (six decimals)", () => {
    const t = table(b.call("VOLFIT", col(dem), "garch", "normal"));
    expect((t.get("mu") as number).toFixed(6)).toBe("-0.006190");
    expect((t.get("omega") as number).toFixed(6)).toBe("0.010761");
    expect((t.get("alpha") as number).toFixed(6)).toBe("0.153134");
    expect((t.get("beta") as number).toFixed(6)).toBe("0.805974");
    expect(t.get("LR p-value")).toBe("");
    expect(typeof t.get("alpha robust std. error")).toBe("number");
  });
  test("every model gives the same 41 labels in the same order, no NaN, blanks where a row does not apply", () => {
    const labels: string[][] = [];
    for (const m of ["iid", "ewma", "garch"]) {
      const g = b.call("VOLFIT", col(sim), m, null) as unknown[][];
      expect(g.length).toBe(41);
      for (const [, v] of g) expect(typeof v === "number" ? Number.isFinite(v) : true).toBe(true);
      labels.push(g.map((r) => r[0] as string));
    }
    expect(labels[1]).toEqual(labels[0]);
    expect(labels[2]).toEqual(labels[0]);
    expect(table(b.call("VOLFIT", col(sim), "ewma", null)).get("omega")).toBe("");
  });
  test("an unknown model is #VALUE! naming the choices", () => {
    const e = b.errorOf(b.call("VOLFIT", col(sim), "arch", null));
    expect(e?.code).toBe("#VALUE!");
    expect(e?.message).toMatch(/"iid".*"ewma".*"garch"/);
  });
});

describe("VOLATILITY and NEXTDAY", () => {
  test("VOLATILITY keeps the shape of returns, blanks give \"\", values are the core's σₜ", () => {
    const r: unknown[][] = col(sim);
    r[5] = [null];
    const out = b.call("VOLATILITY", r, "garch", null) as unknown[][];
    expect(out.length).toBe(700);
    expect(out[5][0]).toBe("");
    const core = fitVolatility(Float64Array.from(sim.filter((_, i) => i !== 5)), "garch");
    expect(out[6][0]).toBe(core.sigmas[5]);
  });
  test("NEXTDAY is the core's next-day law and feeds VAR directly", () => {
    const nd = b.call("NEXTDAY", col(sim), "ewma", null) as number[][];
    const core = fitVolatility(sim, "ewma");
    expect(nd.map((r) => r[0])).toEqual([core.nextDay.location, core.nextDay.scale, core.nextDay.shape]);
    expect(typeof (b.call("VAR", 0.99, nd, null) as number[][])[0][0]).toBe("number");
  });
  test("GARCH on fewer than 100 returns is refused with the reason", () => {
    expect(b.errorOf(b.call("NEXTDAY", col(sim.subarray(0, 60)), "garch", null))?.message).toMatch(/at least 100/);
  });
});

describe("ROLLVAR / ROLLES / ROLLPIT with a model", () => {
  test("are asynchronous and cancelable in the metadata", () => {
    for (const id of ["ROLLVAR", "ROLLES", "ROLLPIT"]) {
      const f = b.metadata.functions.find((x) => x.id === id)!;
      expect(f.options?.cancelable).toBe(true);
      expect(f.parameters.map((p) => p.name)).toEqual(["returns", "window", "confidence", "side", "method", "model", "decay"]);
    }
  });
  test("garch: \"\" for the first window rows, then VaR < ES, and PIT in [0, 1]", async () => {
    const v = (await b.run("ROLLVAR", col(sim), 500, 0.975, null, null, "garch")) as unknown[][];
    const e = (await b.run("ROLLES", col(sim), 500, 0.975, null, null, "garch")) as unknown[][];
    const u = (await b.run("ROLLPIT", col(sim), 500, 0.975, null, null, "garch")) as unknown[][];
    for (let t = 0; t < 500; t++) expect([v[t][0], e[t][0], u[t][0]]).toEqual(["", "", ""]);
    for (let t = 500; t < 700; t++) {
      expect((e[t][0] as number) > (v[t][0] as number)).toBe(true);
      expect((u[t][0] as number) >= 0 && (u[t][0] as number) <= 1).toBe(true);
    }
  });
  test("ROLLES equals the core forecast law's ES row by row, and ROLLPIT short is 1 − ROLLPIT long", async () => {
    const es = (await b.run("ROLLES", col(sim), 500, 0.975, "short", "normal", "ewma")) as unknown[][];
    const long = (await b.run("ROLLPIT", col(sim), 500, 0.975, "long", "normal", "ewma")) as unknown[][];
    const short = (await b.run("ROLLPIT", col(sim), 500, 0.975, "short", "normal", "ewma")) as unknown[][];
    const core = runToEnd(rollingForecasts(sim, 500, createModel("ewma", { method: "normal" })));
    for (const t of [500, 601, 699]) {
      expect(es[t][0]).toBe(core.laws[t]!.expectedShortfall(0.975, "short"));
      expect(long[t][0]).toBe(core.laws[t]!.cdf(sim[t]));
      expect(short[t][0]).toBe(1 - (long[t][0] as number));
    }
  });
  test("a window that never fills (blank rows) is #VALUE! with a message instead of a column of \"\"", async () => {
    const r: unknown[][] = col(sim.subarray(0, 120));
    for (let i = 0; i < 30; i++) r[i] = [""];
    const e = b.errorOf(await b.run("ROLLVAR", r, 100, 0.99, null, null, null));
    expect(e?.code).toBe("#VALUE!");
    expect(e?.message).toMatch(/No row has a full window: returns holds 90 numbers/);
  });
  test("iid with method mle: rows where ML is irregular are #N/A with the reason; method auto shows the L-moment VaR there", async () => {
    // simulated returns with a strong skew (shape 1) through the add-in's own RANDOM: small windows hit the ridge
    const rr = b.call("RANDOM", [[0], [0.01], [1.0]], 300, 4) as number[][];
    const mle = (await b.run("ROLLVAR", rr, 12, 0.99, null, "mle", null)) as unknown[][];
    const auto = (await b.run("ROLLVAR", rr, 12, 0.99, null, "auto", null)) as unknown[][];
    const flagged = mle.map((row, i) => [b.errorOf(row[0]), i] as const).filter(([e]) => e !== null);
    expect(flagged.length).toBeGreaterThan(0);
    for (const [err, i] of flagged) {
      expect(err!.code).toBe("#N/A");
      expect(err!.message).toMatch(/no regular maximum/);
      expect(typeof auto[i][0]).toBe("number");
    }
  });
  test("a model's method is checked: garch with \"lmom\" is #VALUE! naming the choices", async () => {
    const e = b.errorOf(await b.run("ROLLVAR", col(sim), 500, 0.99, null, "lmom", "garch"));
    expect(e?.message).toMatch(/"mle".*"normal"/);
  });
  test("(rows − window) × window above 5,000,000 is refused before any work", async () => {
    const big = Array.from({ length: 20000 }, (_, i) => [Math.sin(i) * 0.01]);
    const e = b.errorOf(await b.run("ROLLVAR", big, 10000, 0.99, null, null, null));
    expect(e?.message).toMatch(/5,000,000/);
  });
  test("cancel stops a long run and installs the handler", async () => {
    const long = col(simulateGarch({ mu: 0, omega: 3e-6, alpha: 0.1, beta: 0.87, k: 0.2 }, 3000, 8).returns);
    const out = await b.runAndCancel("ROLLVAR", 100, long, 1000, 0.99, null, null, "garch");
    expect(out.handlerInstalled).toBe(true);
    expect(b.errorOf(out.value)?.message).toMatch(/Canceled/);
  });
});
