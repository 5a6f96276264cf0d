/**
 * The pane's "Volatility and backtest" view in Debian's Chromium (playwright-core), on the simulated
 * volatility-cluster demo. The page runs with a minimal CustomFunctions global defined first (as the host's shared
 * runtime does), so dist/functions.js registers the cell functions in the same page: every number the view shows
 * must then equal what ROLLVAR / ROLLES / ROLLPIT / BACKTEST / ESBACKTEST / VOLATILITY / VOLFIT return for the
 * same column — exactly (same engine, same code; the view computes in a Web Worker built from the same sources).
 * Also: Cancel stops a GARCH run mid-way and leaves nothing half-drawn; exceptions are marked by shape (triangles
 * for the chosen model, squares for the iid fit) as well as colour; a screenshot is written to test-output/.
 * Needs `npx webpack --mode production` first (`npm test` builds).
 */
import * as fs from "node:fs";
import * as path from "node:path";
import type { Browser } from "playwright-core";
import { col } from "../host/harness";
import { CLUSTER_DEMO, scenarioData } from "../../src/taskpane/demo";
import { launch, newPane, serveDist, type PanePage, type Served } from "./browser";

const SCREENSHOT = path.resolve(__dirname, "../../test-output/pane-volatility-backtest.png");
const EPS = Number.EPSILON;

let served: Served;
let browser: Browser;
let shared: PanePage;

interface Columns {
  head: string[];
  rows: number[][];
}

async function choose(spec: { model: string; window: string; level: string; side: string }): Promise<void> {
  const p = shared.page;
  await p.selectOption("#vol-model", spec.model);
  await p.fill("#vol-window", spec.window);
  await p.selectOption("#vol-level", spec.level);
  await p.selectOption("#vol-side", spec.side);
}

async function runView(): Promise<void> {
  await shared.page.click("#vol-run");
  await shared.page.waitForSelector('#volbt[data-state="ready"], #volbt[data-state="stopped"]', { timeout: 110_000 });
  expect(await shared.page.getAttribute("#volbt", "data-state")).toBe("ready");
}

async function shownColumns(): Promise<Columns> {
  const text = await shared.page.inputValue("#vol-columns");
  const [head, ...lines] = text.split("\n");
  return { head: head.split("\t"), rows: lines.map((l) => l.split("\t").map((c) => (c === "" ? NaN : Number(c)))) };
}

function column(c: Columns, name: string): number[] {
  const j = c.head.indexOf(name);
  if (j < 0) throw new Error(`column "${name}" missing from the view's copy (has ${c.head.join(", ")})`);
  return c.rows.map((r) => r[j]);
}

const memo = new Map<string, Promise<unknown[][]>>();
/** callInPage, remembered per argument list (the rolling columns are used by several tests). */
function cellOnce(id: string, ...args: unknown[]): Promise<unknown[][]> {
  const key = JSON.stringify([id, args]);
  if (!memo.has(key)) memo.set(key, callInPage(id, ...args));
  return memo.get(key)!;
}

/** Calls a cell function registered in the page, as the host would (2-D arrays, null for omitted). */
async function callInPage(id: string, ...args: unknown[]): Promise<unknown[][]> {
  return shared.page.evaluate(([fid, a]) => {
    const reg = (window as unknown as { __askew: Record<string, (...x: unknown[]) => unknown> }).__askew;
    if (!reg[fid as string]) throw new Error(`ASKEW.${fid} is not registered by dist/functions.js`);
    return reg[fid as string](...(a as unknown[]));
  }, [id, args] as const) as Promise<unknown[][]>;
}

/** A cell column as numbers (NaN for "" and for an error cell, which the page cannot pass back as a number). */
const cellNumbers = (g: unknown[][]): number[] => g.map((r) => (typeof r[0] === "number" ? r[0] : NaN));

function sameColumn(what: string, got: number[], want: number[]): void {
  expect(got).toHaveLength(want.length);
  const bad = got.findIndex((g, i) => !Object.is(g, want[i]));
  if (bad >= 0) throw new Error(`${what}, row ${bad + 1}: the view shows ${got[bad]}, the cell function returns ${want[bad]} (tolerance 0: same engine, same code)`);
}

/** The label/value rows of a side-by-side table, for column `k` (1 = the chosen model, 2 = iid). */
async function shownRows(table: string, k: number): Promise<Array<[string, unknown]>> {
  return shared.page.$$eval(
    `${table} tbody tr`,
    (trs, kk) =>
      trs.map((tr) => {
        const td = tr.querySelectorAll("td")[kk - 1] as HTMLElement;
        return [(tr as HTMLElement).dataset.label ?? tr.querySelector("th")!.textContent ?? "", td.dataset.value !== undefined ? Number(td.dataset.value) : td.textContent];
      }) as Array<[string, unknown]>,
    k,
  );
}

/** A cell's table as the pane prints it: booleans as TRUE/FALSE, blanks as "". */
const asShown = (rows: unknown[][]): Array<[string, unknown]> =>
  rows.map(([l, v]) => [l as string, typeof v === "boolean" ? (v ? "TRUE" : "FALSE") : v === null ? "" : v]);

beforeAll(async () => {
  served = await serveDist();
  browser = await launch();
  shared = await newPane(browser, served.origin, { sharedRuntime: true, height: 1400 });
  await shared.page.goto(`${served.origin}/taskpane.html`);
  await shared.page.waitForSelector('main[data-mode="standalone"][data-state="ready"]', { timeout: 90_000 });
  await shared.page.click("#demo-cluster");
  await shared.page.waitForFunction(() => document.getElementById("source-note")?.textContent?.includes("volatility clusters"));
  await shared.page.waitForSelector('main[data-state="ready"]', { timeout: 90_000 });
});

afterAll(async () => {
  await browser?.close();
  await served?.close();
});

describe("volatility and backtest view on the simulated volatility-cluster demo", () => {
  const data = scenarioData(CLUSTER_DEMO);
  const returns = col(Array.from(data));

  test("the data are the seeded simulated scenario, labelled as not market data", async () => {
    const xs = (await shared.page.inputValue("#data-text")).split("\n").map(Number);
    expect(xs).toHaveLength(data.length);
    // Engines may round Math.exp/log differently in the last place inside the sampler: allow 8 ulps.
    xs.forEach((x, i) => {
      if (!(Math.abs(x - data[i]) <= 8 * EPS * Math.abs(data[i]))) throw new Error(`demo value ${i}: page ${x}, node ${data[i]}`);
    });
    expect(await shared.page.textContent("#source-note")).toContain("not market data");
  });

  describe("EWMA at 97.5%, long side, window 250", () => {
    beforeAll(async () => {
      await choose({ model: "ewma", window: "250", level: "0.975", side: "long" });
      await runView();
    });

    test("it ran off the page thread, in a worker", async () => {
      expect(await shared.page.getAttribute("#volbt", "data-ran-in")).toBe("worker");
    });

    test("each line's VaR, ES and PIT equal ROLLVAR / ROLLES / ROLLPIT row by row", async () => {
      const shown = await shownColumns();
      const xs = (await shared.page.inputValue("#data-text")).split("\n").map(Number);
      const r = col(xs);
      for (const [line, method] of [["EWMA", null], ["iid", "auto"]] as const) {
        const model = line === "EWMA" ? "ewma" : "iid";
        sameColumn(`VaR ${line}`, column(shown, `VaR ${line}`), cellNumbers(await cellOnce("ROLLVAR", r, 250, 0.975, "long", method, model)));
        sameColumn(`ES ${line}`, column(shown, `ES ${line}`), cellNumbers(await cellOnce("ROLLES", r, 250, 0.975, "long", method, model)));
        sameColumn(`PIT ${line}`, column(shown, `PIT ${line}`), cellNumbers(await cellOnce("ROLLPIT", r, 250, 0.975, "long", method, model)));
      }
      // The first 250 rows have no forecast; every later row has one.
      expect(column(shown, "VaR EWMA").filter(Number.isFinite)).toHaveLength(data.length - 250);
    });

    test("σₜ equals VOLATILITY and the model report equals VOLFIT", async () => {
      const shown = await shownColumns();
      const r = col((await shared.page.inputValue("#data-text")).split("\n").map(Number));
      sameColumn("sigma", column(shown, "sigma"), cellNumbers(await callInPage("VOLATILITY", r, "ewma", null)));
      const report = await shared.page.$$eval("#vol-report tbody tr", (trs) =>
        trs.map((tr) => {
          const td = tr.querySelector("td") as HTMLElement;
          return [tr.querySelector("th")!.textContent, td.dataset.value !== undefined ? Number(td.dataset.value) : td.textContent];
        }),
      );
      expect(report).toEqual(asShown(await callInPage("VOLFIT", r, "ewma", null)));
    });

    test("the backtest rows of each line equal BACKTEST on its ROLLVAR column, the ES rows ESBACKTEST", async () => {
      const r = col((await shared.page.inputValue("#data-text")).split("\n").map(Number));
      for (const [k, method, model] of [[1, null, "ewma"], [2, "auto", "iid"]] as const) {
        const v = await cellOnce("ROLLVAR", r, 250, 0.975, "long", method, model);
        const e = await cellOnce("ROLLES", r, 250, 0.975, "long", method, model);
        const u = await cellOnce("ROLLPIT", r, 250, 0.975, "long", method, model);
        expect(await shownRows("#vol-bt-rows", k)).toEqual(asShown(await callInPage("BACKTEST", r, v, 0.975, "long")));
        expect(await shownRows("#vol-es-rows", k)).toEqual(asShown(await callInPage("ESBACKTEST", r, v, e, 0.975, "long", u)));
      }
    });

    test("the summary and the answer repeat the backtest rows' numbers", async () => {
      const bt = await shownRows("#vol-bt-rows", 1);
      const summary = await shownRows("#vol-summary", 1);
      for (const label of ["Observations used", "Exceptions", "Kupiec p-value", "Independence p-value", "Traffic-light zone"]) {
        expect([label, summary.find(([l]) => l === label)?.[1]]).toEqual([label, bt.find(([l]) => l === label)?.[1]]);
      }
      const exceptions = bt.find(([l]) => l === "Exceptions")?.[1];
      expect(await shared.page.textContent("#vol-answer")).toContain(`EWMA (λ 0.94): ${exceptions} exceptions in 750 days`);
    });

    test("exceptions are marked by shape as well as colour: one triangle per EWMA exception, one square per iid exception", async () => {
      const counts = await shared.page.evaluate(() => ({
        triangles: document.querySelectorAll("#chart-backtest .series-hit-first path").length,
        squares: document.querySelectorAll("#chart-backtest .series-hit-second rect").length,
      }));
      const ex1 = (await shownRows("#vol-bt-rows", 1)).find(([l]) => l === "Exceptions")?.[1];
      const ex2 = (await shownRows("#vol-bt-rows", 2)).find(([l]) => l === "Exceptions")?.[1];
      expect(counts).toEqual({ triangles: ex1, squares: ex2 });
      const charts = await shared.page.$$eval("#volbt svg.chart", (svgs) => svgs.map((s) => ({ label: s.getAttribute("aria-label"), desc: s.querySelector("desc")?.textContent ?? "" })));
      expect(charts).toHaveLength(2);
      for (const c of charts) {
        expect(c.label).toBeTruthy();
        expect(c.desc.length).toBeGreaterThan(60);
      }
    });

    test("verdict words are spelled out for both lines (colour only repeats them)", async () => {
      const cells = await shared.page.$$eval("#vol-verdicts td.verdict", (tds) => tds.map((td) => [td.className, td.querySelector("strong")!.textContent]));
      expect(cells.length).toBeGreaterThanOrEqual(2 * 8);
      for (const [cls, word] of cells) expect(cls).toContain(`verdict-${word === "n/a" ? "na" : word}`);
    });
  });

  test("method comparison: the chosen model and the reference methods on the same rows, best first by mean FZ0 loss", async () => {
    await choose({ model: "ewma", window: "250", level: "0.975", side: "long" });
    await shared.page.check("#vol-compare");
    await runView();
    await shared.page.uncheck("#vol-compare");
    const rows = await shared.page.$$eval("#vol-methods tbody tr", (trs) =>
      trs.map((tr) => ({ name: (tr as HTMLElement).dataset.method, fz0: Number((tr.querySelectorAll("td")[3] as HTMLElement).dataset.value), dm: tr.querySelectorAll("td")[4].textContent })),
    );
    // The chosen model plus the five reference methods of src/core/risk/comparison (iid, hs, normal, cf, fhs).
    expect(rows.map((r) => r.name)).toEqual(expect.arrayContaining(["Generalized normal, EWMA", "Historical simulation", "Normal", "Cornish–Fisher", "Filtered historical simulation"]));
    expect(rows).toHaveLength(6);
    const fz0 = rows.map((r) => r.fz0).filter(Number.isFinite);
    expect(fz0).toEqual([...fz0].sort((a, b) => a - b));
    expect(rows[0].dm).toBe("–"); // no test of the best against itself
  });

  test("Cancel stops a GARCH run mid-way: nothing half-drawn, the page keeps answering", async () => {
    await choose({ model: "garch", window: "250", level: "0.99", side: "long" });
    await shared.page.click("#vol-run");
    await shared.page.waitForFunction(() => (document.getElementById("vol-progress-bar") as HTMLProgressElement).value > 0.05, undefined, { timeout: 60_000 });
    expect(await shared.page.isVisible("#vol-results")).toBe(true); // the previous (EWMA) result stays until replaced
    await shared.page.click("#vol-cancel");
    await shared.page.waitForSelector('#volbt[data-state="stopped"]', { timeout: 10_000 });
    expect(await shared.page.textContent("#vol-message")).toContain("cancelled");
    expect(await shared.page.isHidden("#vol-progress")).toBe(true);
    // The old answer is the EWMA one, not a partial GARCH one.
    expect(await shared.page.textContent("#vol-answer")).toContain("EWMA");
    expect(await shared.page.evaluate(() => 1 + 1)).toBe(2);
  });

  test("screenshot of a GARCH run at 99% (test-output/pane-volatility-backtest.png)", async () => {
    await choose({ model: "garch", window: "250", level: "0.99", side: "long" });
    await runView();
    expect(await shared.page.textContent("#vol-answer")).toMatch(/^99% VaR, long side, 250-day window\. GARCH\(1,1\): \d+ exceptions in 750 days/);
    fs.mkdirSync(path.dirname(SCREENSHOT), { recursive: true });
    const el = await shared.page.$("#volbt");
    await el!.screenshot({ path: SCREENSHOT });
    expect(fs.statSync(SCREENSHOT).size).toBeGreaterThan(10_000);
  });

  test("the view's script raised no error", () => {
    expect(shared.errors.filter((e) => !e.includes("ERR_FAILED"))).toEqual([]);
  });
});
