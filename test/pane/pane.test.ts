/**
 * End to end in real Chromium (Debian's /usr/bin/chromium driven by playwright-core): the BUILT pane
 * (dist/taskpane.html) served from a local static server, every other request aborted and recorded.
 *
 * Two pages:
 *  - "plain": an ordinary browser, no host — the standalone pane on the simulated demo data, bad input, the
 *    edge warnings, the screenshot, and proof that nothing but the local server was reached;
 *  - "shared": the same page with a minimal CustomFunctions global defined first, as in the host's shared
 *    runtime, so dist/functions.js registers the cell functions in the page. The pane's numbers must then
 *    equal the functions' results EXACTLY (same runtime, same numbers, same code).
 * The Node-side bundle (test/host/harness.ts) is also called on the pane's numbers. Node's and Chromium's
 * JavaScript engines may round Math.exp/log differently in the last place, so that cross-check allows a few
 * ulps (tolerances written beside each check).
 * Needs `npx webpack --mode production` first (`npm test` builds).
 */
import * as fs from "node:fs";
import * as path from "node:path";
import type { Browser } from "playwright-core";
import { col, loadBundle, type Bundle } from "../host/harness";
import { DEMO, scenarioData } from "../../src/taskpane/demo";
import { sample } from "../../src/core/gno";
import { launch, newPane, serveDist, type PanePage, type Served } from "./browser";

const OFFICE_JS = "https://appsforoffice.microsoft.com/lib/1/hosted/office.js";
// Written to test-output/ (ignored by git) so a test run never changes a tracked file; the README's picture,
// assets/pane-standalone.png, is refreshed from it by hand: cp test-output/pane-standalone.png assets/
const SCREENSHOT = path.resolve(__dirname, "../../test-output/pane-standalone.png");
const EPS = Number.EPSILON;

let served: Served;
let browser: Browser;
let plain: PanePage;
let shared: PanePage;
let bundle: Bundle;

async function openReady(p: PanePage): Promise<void> {
  await p.page.goto(`${served.origin}/taskpane.html`);
  await p.page.waitForSelector('main[data-mode="standalone"][data-state="ready"]', { timeout: 90_000 });
}

beforeAll(async () => {
  served = await serveDist();
  browser = await launch();
  bundle = await loadBundle();
  plain = await newPane(browser, served.origin);
  shared = await newPane(browser, served.origin, { sharedRuntime: true });
  await Promise.all([openReady(plain), openReady(shared)]);
});

afterAll(async () => {
  await browser?.close();
  await served?.close();
});

async function analysedNumbers(p: PanePage): Promise<number[]> {
  return (await p.page.inputValue("#data-text")).split("\n").map(Number);
}

function check(what: string, got: number, want: number, relTol: number): void {
  const diff = Math.abs(got - want);
  if (!(diff <= relTol * Math.abs(want))) {
    throw new Error(`${what}: pane shows ${got}, the cell function returns ${want}; |diff| ${diff} > tolerance ${relTol * Math.abs(want)} (rel ${relTol})`);
  }
}

/** Calls a cell function registered in the shared-runtime page, as the host would (2-D arrays, null for omitted). */
async function callInPage(id: string, ...args: unknown[]): Promise<unknown> {
  const ids = await shared.page.evaluate(() => Object.keys((window as unknown as { __askew: Record<string, unknown> }).__askew));
  if (!ids.includes(id)) throw new Error(`ASKEW.${id} is not registered by dist/functions.js (registered: ${ids.join(", ")}); rebuild once it lands`);
  return shared.page.evaluate(([fid, a]) => (window as unknown as { __askew: Record<string, (...x: unknown[]) => unknown> }).__askew[fid as string](...(a as unknown[])), [id, args] as const);
}

interface ShownRisk {
  side: string;
  c: number;
  var: number;
  es: number;
}

async function shownParams(p: PanePage): Promise<[number, number, number]> {
  const d = await p.page.$eval("#params", (t) => ({ ...(t as HTMLElement).dataset }));
  return [Number(d.location), Number(d.scale), Number(d.shape)];
}

async function shownRisk(p: PanePage): Promise<ShownRisk[]> {
  return p.page.$$eval("#risk tr[data-side]", (trs) =>
    trs.map((tr) => ({
      side: (tr as HTMLElement).dataset.side!,
      c: Number((tr as HTMLElement).dataset.confidence),
      var: Number((tr.querySelector("td.var") as HTMLElement).dataset.value),
      es: Number((tr.querySelector("td.es") as HTMLElement).dataset.value),
    })),
  );
}

describe("standalone pane on the simulated demo data", () => {
  test("analyses the seeded demo scenario and says it is simulated", async () => {
    const xs = await analysedNumbers(plain);
    const want = scenarioData(DEMO); // regenerated in Node from the same seed
    expect(xs).toHaveLength(want.length);
    // Engines may differ by an ulp in Math.exp/log inside the inversion sampler: allow 4 ulps.
    xs.forEach((x, i) => check(`demo value ${i}`, x, want[i], 4 * EPS));
    expect(await plain.page.textContent("#source-note")).toContain("not market data");
  });

  test("in the shared runtime the parameters shown equal ASKEW.FIT exactly", async () => {
    const fit = (await callInPage("FIT", col(await analysedNumbers(shared)), null)) as unknown[][];
    if (!Array.isArray(fit) || typeof fit[0]?.[0] !== "number") throw new Error(`ASKEW.FIT did not return 3 numbers: ${JSON.stringify(fit)}`);
    expect(await shownParams(shared)).toEqual([fit[0][0], fit[1][0], fit[2][0]]);
  });

  test("in the shared runtime VaR and ES shown equal ASKEW.VAR and ASKEW.SHORTFALL exactly, every level and side", async () => {
    const [l, s, k] = await shownParams(shared);
    const rows = await shownRisk(shared);
    expect(rows.map((r) => `${r.side} ${r.c}`)).toEqual(["long 0.95", "long 0.975", "long 0.99", "short 0.95", "short 0.975", "short 0.99"]);
    for (const r of rows) {
      const v = (await callInPage("VAR", [[r.c]], [[l], [s], [k]], r.side)) as number[][];
      const e = (await callInPage("SHORTFALL", [[r.c]], [[l], [s], [k]], r.side)) as number[][];
      expect([r.var, r.es]).toEqual([v[0][0], e[0][0]]);
    }
  });

  test("in the shared runtime the goodness-of-fit rows equal ASKEW.GOF exactly (same bootstrap seed and size)", async () => {
    const gof = (await callInPage("GOF", col(await analysedNumbers(shared)), null, null)) as Array<[string, number | string]>;
    const shown = await shared.page.$$eval("#gof tbody tr", (trs) =>
      trs.map((tr) => [tr.querySelector("th")!.textContent ?? "", (tr.querySelector("td") as HTMLElement).dataset.value ?? ""]),
    );
    const numeric = gof.filter(([, v]) => typeof v === "number");
    expect(numeric.length).toBeGreaterThanOrEqual(4);
    for (const [label, value] of numeric) expect([label, Number(shown.find((r) => r[0] === label)?.[1])]).toEqual([label, value]);
  });

  test("in the shared runtime the VaR intervals equal ASKEW.VARCI's default profile interval exactly (computed off the page)", async () => {
    const data = col(await analysedNumbers(shared));
    const shown = await shared.page.$$eval("#risk tr[data-side]", (trs) =>
      trs.map((tr) => {
        const td = tr.querySelector("td.interval") as HTMLElement | null;
        return { side: (tr as HTMLElement).dataset.side!, c: Number((tr as HTMLElement).dataset.confidence), lower: td?.dataset.lower, upper: td?.dataset.upper };
      }),
    );
    expect(shown.length).toBe(6);
    for (const r of shown) {
      const ci = (await callInPage("VARCI", data, r.c, r.side)) as unknown[][];
      expect([r.side, r.c, Number(r.lower), Number(r.upper)]).toEqual([r.side, r.c, ci[0][0], ci[2][0]]);
    }
  });

  test("in the shared runtime the full report equals ASKEW.FITREPORT exactly", async () => {
    const table = (await callInPage("FITREPORT", col(await analysedNumbers(shared)), null)) as Array<[string, unknown]>;
    const shown = await shared.page.$$eval("#report tbody tr", (trs) =>
      trs.map((tr) => {
        const td = tr.querySelector("td") as HTMLElement;
        return [tr.querySelector("th")!.textContent, td.dataset.value !== undefined ? Number(td.dataset.value) : td.textContent];
      }),
    );
    // The cell shows "" for a row that does not apply and TRUE/FALSE for booleans; the pane prints the same.
    expect(shown).toEqual(table.map(([l, v]) => [l, typeof v === "boolean" ? (v ? "TRUE" : "FALSE") : v]));
  });

  test("in the shared runtime the comparison rows equal ASKEW.COMPARE exactly, computed off the page in a worker", async () => {
    expect(await shared.page.getAttribute("main", "data-compared-in")).toBe("worker");
    const table = (await callInPage("COMPARE", col(await analysedNumbers(shared)))) as unknown[][];
    const [header, ...rows] = table as [string[], ...unknown[][]];
    const pick = ["Family", "ΔAIC", "VaR 99%"].map((h) => header.indexOf(h));
    const want = rows.map((r) => pick.map((i) => r[i]));
    const shown = await shared.page.$$eval("#compare tbody tr", (trs) =>
      trs.map((tr) => [tr.querySelector("th")!.textContent, ...Array.from(tr.querySelectorAll("td"), (td) => Number((td as HTMLElement).dataset.value))]),
    );
    expect(shown).toEqual(want);
  });

  test("in the shared runtime the Pareto tails equal ASKEW.TAILFIT and ASKEW.TAILREPORT (sides \"both\") exactly", async () => {
    const x = col(await analysedNumbers(shared));
    const cells = (await callInPage("TAILFIT", x, null, "both", null)) as unknown[][];
    const shownCells = JSON.parse((await shared.page.getAttribute("#tail-risk", "data-cells")) ?? "null") as Array<number | null>;
    expect(shownCells).toEqual(cells.map((r) => (r[0] === "" ? null : r[0])));
    const report = (await callInPage("TAILREPORT", x, null, "both", null)) as Array<[string, unknown]>;
    const shown = await shared.page.$$eval("#tail-report tbody tr", (trs) =>
      trs.map((tr) => {
        const td = tr.querySelector("td") as HTMLElement;
        return [tr.querySelector("th")!.textContent, td.dataset.value !== undefined ? Number(td.dataset.value) : td.textContent];
      }),
    );
    expect(shown).toEqual(report.map(([l, v]) => [l, typeof v === "boolean" ? (v ? "TRUE" : "FALSE") : v === null ? "" : v]));
  });

  test("in the shared runtime the Pareto-tail VaR and ES shown equal ASKEW.VAR and ASKEW.SHORTFALL on the 9 cells, both sides", async () => {
    for (const side of ["long", "short"] as const) {
      await shared.page.click(side === "long" ? "#tail-long" : "#tail-short");
      const cells = JSON.parse((await shared.page.getAttribute("#tail-risk", "data-cells")) ?? "[]") as Array<number | null>;
      const params = cells.map((v) => [v === null ? null : v]);
      const rows = await shared.page.$$eval("#tail-risk tbody tr", (trs) => trs.map((tr) => Array.from(tr.querySelectorAll("td"), (td) => Number((td as HTMLElement).dataset.value))));
      expect(rows).toHaveLength(2);
      for (const [i, c] of [0.975, 0.99].entries()) {
        const v = (await callInPage("VAR", [[c]], params, side)) as number[][];
        const e = (await callInPage("SHORTFALL", [[c]], params, side)) as number[][];
        expect([rows[i][1], rows[i][3]]).toEqual([v[0][0], e[0][0]]);
      }
    }
    await shared.page.click("#tail-long");
  });

  test("in the shared runtime the h-day VaR and ES equal ASKEW.VAR and ASKEW.SHORTFALL with that horizon, every level and side", async () => {
    const [l, s, k] = await shownParams(shared);
    for (const h of [10, 3]) {
      await shared.page.fill("#horizon", String(h));
      await shared.page.dispatchEvent("#horizon", "change");
      expect(await shared.page.getAttribute("#horizon-risk", "data-horizon")).toBe(String(h));
      const rows = await shared.page.$$eval("#horizon-risk tr[data-side]", (trs) =>
        trs.map((tr) => ({
          side: (tr as HTMLElement).dataset.side!,
          c: Number((tr as HTMLElement).dataset.confidence),
          v: Number((tr.querySelector("td.var-h") as HTMLElement).dataset.value),
          e: Number((tr.querySelector("td.es-h") as HTMLElement).dataset.value),
        })),
      );
      expect(rows).toHaveLength(6);
      for (const r of rows) {
        const v = (await callInPage("VAR", [[r.c]], [[l], [s], [k]], r.side, h)) as number[][];
        const e = (await callInPage("SHORTFALL", [[r.c]], [[l], [s], [k]], r.side, h)) as number[][];
        expect([r.side, r.c, r.v, r.e]).toEqual([r.side, r.c, v[0][0], e[0][0]]);
      }
    }
  });

  test("the Node-built functions agree with the browser pane to a few ulps", async () => {
    const [l, s, k] = await shownParams(plain);
    for (const r of await shownRisk(plain)) {
      const v = (bundle.call("VAR", [[r.c]], [[l], [s], [k]], r.side) as number[][])[0][0];
      const e = (bundle.call("SHORTFALL", [[r.c]], [[l], [s], [k]], r.side) as number[][])[0][0];
      // Same parameters, different JavaScript engines: 16 ulps relative covers last-place Math differences.
      check(`VaR ${r.c} ${r.side}`, r.var, v, 16 * EPS);
      check(`ES ${r.c} ${r.side}`, r.es, e, 16 * EPS);
    }
    const fit = (await bundle.run("FIT", col(await analysedNumbers(plain)), null)) as number[][];
    expect(bundle.errorOf(fit)).toBeNull();
    // A refit in another engine may stop at a different last iterate: allow 1e-9 relative (well inside the
    // standard errors, which are ~3% of the estimates here).
    const shown = await shownParams(plain);
    shown.forEach((x, i) => check(["location", "scale", "shape"][i], x, fit[i][0], 1e-9));
  });

  test("the pictures are SVG with text alternatives", async () => {
    const charts = await plain.page.$$eval("svg.chart", (svgs) =>
      svgs.map((s) => ({ role: s.getAttribute("role"), label: s.getAttribute("aria-label"), title: s.querySelector("title")?.textContent, desc: s.querySelector("desc")?.textContent ?? "" })),
    );
    expect(charts).toHaveLength(5); // one-day and h-day laws, histogram, quantile plot, loss tail, mean excess
    for (const c of charts) {
      expect(c.role).toBe("img");
      expect(c.label).toBeTruthy();
      expect(c.title).toBe(c.label);
      expect(c.desc.length).toBeGreaterThan(40);
    }
  });

  test("the caution is shown once", async () => {
    expect(await plain.page.locator("text=Statistical estimates, not advice").count()).toBe(1);
  });

  test("screenshot of the standalone pane (test-output/pane-standalone.png, copied to assets/ for the README)", async () => {
    fs.mkdirSync(path.dirname(SCREENSHOT), { recursive: true });
    await plain.page.screenshot({ path: SCREENSHOT, fullPage: true });
    expect(fs.statSync(SCREENSHOT).size).toBeGreaterThan(10_000);
  });
});

describe("edge and bad input (plain browser)", () => {
  test("data whose fitted edge hugs the largest return raise the edge panel and the warnings", async () => {
    await plain.page.click("#demo-capped");
    await plain.page.waitForFunction(() => document.querySelector("#source-note")?.textContent?.includes("capped-upside"));
    await plain.page.waitForSelector('main[data-state="ready"]', { timeout: 90_000 });
    expect(await plain.page.isVisible("#warnings")).toBe(true);
    expect(await plain.page.locator("#warning-list li.severe").count()).toBeGreaterThan(0);
    expect(await plain.page.getAttribute("#edge-panel", "class")).toContain("edge-close");
    expect(await plain.page.textContent("#edge-body")).toMatch(/Upper edge/);
    expect(await plain.page.isVisible(".edge-alert")).toBe(true);
  });

  test("pasted text gets a message naming the line", async () => {
    await plain.page.fill("#paste", "0.01\n-0.02\nabc\n0.03");
    await plain.page.click("#analyse");
    await plain.page.waitForSelector("#message:not([hidden])");
    expect(await plain.page.textContent("#message")).toMatch(/Line 3 holds "abc", which is not a number/);
    // the previous data's results do not stay on screen next to a failed input
    expect(await plain.page.isHidden("#results")).toBe(true);
  });

  test("a single value gets a message asking for more numbers", async () => {
    await plain.page.fill("#paste", "0.5");
    await plain.page.click("#analyse");
    await plain.page.waitForFunction(() => /at least 10/.test(document.querySelector("#message")?.textContent ?? ""));
    expect(await plain.page.isVisible("#message")).toBe(true);
  });

  test("80,000 pasted rows are analysed to the end (no argument spread overflows the stack)", async () => {
    const big = sample(DEMO.params, 80_000, 4343); // simulated, as the demo
    await plain.page.$eval("#paste", (el, text) => ((el as HTMLTextAreaElement).value = text), Array.from(big, String).join("\n"));
    // the click returns once the pasted text is read (seconds for this size on a loaded machine)
    await plain.page.click("#analyse", { timeout: 240_000 });
    await plain.page.waitForFunction(() => /80000 numbers/.test(document.querySelector("#source-note")?.textContent ?? ""), undefined, { timeout: 240_000 });
    await plain.page.waitForSelector('main[data-state="ready"], main[data-state="stopped"]', { timeout: 240_000 });
    expect(await plain.page.textContent("#message")).toBe("");
    expect(await plain.page.getAttribute("main", "data-state")).toBe("ready");
    expect(await plain.page.isVisible("#results")).toBe(true);
  }, 300_000);

  test("long work shows progress and stops on Cancel", async () => {
    const big = sample(DEMO.params, 20_000, 4242); // simulated, as the demo
    await plain.page.$eval("#paste", (el, text) => ((el as HTMLTextAreaElement).value = text), Array.from(big, String).join("\n"));
    await plain.page.click("#analyse");
    await plain.page.waitForSelector("#progress:not([hidden])");
    expect(await plain.page.getAttribute("main", "data-state")).toBe("busy");
    await plain.page.click("#cancel");
    await plain.page.waitForFunction(() => document.querySelector("#message")?.textContent === "Analysis cancelled.", undefined, { timeout: 60_000 });
    expect(await plain.page.isHidden("#progress")).toBe(true);
    expect(await plain.page.getAttribute("main", "data-state")).toBe("stopped");
  });

  test("the pages reached nothing but the local server (office.js, the platform's script, was refused)", () => {
    expect(plain.blocked.filter((u) => u !== OFFICE_JS)).toEqual([]);
    expect(shared.blocked.filter((u) => u !== OFFICE_JS)).toEqual([]);
  });

  test("the pane's own script raised no error", () => {
    // Expected in a plain browser: only the refused office.js (the functions bundle registers into a do-nothing
    // registry when there is no host at all: src/functions/standalone.ts).
    expect(plain.errors.filter((e) => !e.includes("ERR_FAILED"))).toEqual([]);
    expect(shared.errors.filter((e) => !e.includes("ERR_FAILED"))).toEqual([]);
  });
});
