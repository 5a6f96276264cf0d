/**
 * In real Chromium (the BUILT pane, dist/): while the pane fits 200,000 simulated returns with one 1e10 (a
 * pasted-price mistake), the page keeps turning its event loop, and Cancel during the fit stops the analysis and
 * takes the previous results off the screen. Once with the background worker, once with Worker removed (the fit
 * then runs in 20 ms page slices).
 *
 * No wall-clock assertion: a zero-delay timer loop in the page counts event-loop turns; the test counts the turns
 * seen while the progress line says "fitting the law". The longest gaps between two turns inside the fit are
 * recorded for the notes (printed, not asserted). Needs `npm run build` first.
 */
import type { Browser } from "playwright-core";
import { DEMO } from "../../src/taskpane/demo";
import { sample } from "../../src/core/gno";
import { launch, newPane, serveDist, type PanePage, type Served } from "./browser";

let served: Served;
let browser: Browser;

beforeAll(async () => {
  served = await serveDist();
  browser = await launch();
});

afterAll(async () => {
  await browser?.close();
  await served?.close();
});

const big = sample(DEMO.params, 200_000, 5151); // simulated, as the demo
big[100_000] = 1e10;
const text = Array.from(big, String).join("\n");

async function open(withWorker: boolean): Promise<PanePage> {
  const p = await newPane(browser, served.origin);
  await p.page.addInitScript(
    (keep) => {
      if (!keep) (window as unknown as { Worker: unknown }).Worker = undefined;
      const w = window as unknown as { __turns: number; __fitTurns: number; __last: number; __wasFitting: boolean; __gaps: number[] };
      w.__turns = 0;
      w.__fitTurns = 0;
      w.__last = performance.now();
      w.__wasFitting = false;
      w.__gaps = [];
      const turn = (): void => {
        const now = performance.now();
        w.__turns++;
        const fitting =
          document.getElementById("progress")?.hidden === false && (document.getElementById("progress-text")?.textContent?.startsWith("fitting the law") ?? false);
        if (fitting) w.__fitTurns++;
        // a gap counts when both ends are inside the fit (the text reading and sort before it are not the fit)
        if (fitting && w.__wasFitting) w.__gaps.push(now - w.__last);
        w.__wasFitting = fitting;
        w.__last = now;
        setTimeout(turn, 0);
      };
      setTimeout(turn, 0);
    },
    withWorker,
  );
  await p.page.goto(`${served.origin}/taskpane.html`);
  await p.page.waitForSelector('main[data-mode="standalone"][data-state="ready"]', { timeout: 90_000 });
  expect(await p.page.isVisible("#results")).toBe(true); // the demo's results, to be taken off on Cancel
  return p;
}

describe.each([
  ["in the background worker", true],
  ["in page slices (no worker)", false],
])("the pane's fit of 200,000 returns with one 1e10, %s", (_label, withWorker) => {
  test("the page keeps turning during the fit and Cancel mid-fit clears the results", async () => {
    const p = await open(withWorker);
    await p.page.$eval("#paste", (el, t) => ((el as HTMLTextAreaElement).value = t), text);
    await p.page.click("#analyse", { timeout: 240_000 });
    await p.page.waitForFunction(() => document.getElementById("progress-text")?.textContent?.startsWith("fitting the law"), undefined, {
      timeout: 240_000,
    });
    // still fitting after 10 turns of the page's event loop (before this change the fit was one block: ≤ 1 turn)
    await p.page.waitForFunction(() => (window as unknown as { __fitTurns: number }).__fitTurns >= 10, undefined, { timeout: 120_000 });
    expect(await p.page.textContent("#progress-text")).toMatch(/^fitting the law/);
    await p.page.click("#cancel");
    await p.page.waitForFunction(() => document.querySelector("#message")?.textContent === "Analysis cancelled.", undefined, { timeout: 60_000 });
    expect(await p.page.getAttribute("main", "data-state")).toBe("stopped");
    expect(await p.page.isHidden("#results")).toBe(true);
    expect(await p.page.isHidden("#progress")).toBe(true);
    const seen = await p.page.evaluate(() => {
      const w = window as unknown as { __fitTurns: number; __gaps: number[] };
      return { fitTurns: w.__fitTurns, longestGapsMs: w.__gaps.sort((a, b) => b - a).slice(0, 4).map(Math.round) };
    });
    console.log(`pane fit ${withWorker ? "worker" : "page slices"}: ${JSON.stringify(seen)}`);
    expect(p.errors.filter((e) => !e.includes("ERR_FAILED"))).toEqual([]);
    await p.page.context().close();
  }, 400_000);
});
