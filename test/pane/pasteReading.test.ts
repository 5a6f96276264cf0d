/**
 * Pasting a large column in real Chromium (Debian's /usr/bin/chromium via playwright-core, the BUILT pane from
 * dist/): the text is read in slices, the page gets control back between them, and Cancel stops the reading
 * mid-way with no results left on screen. Responsiveness is shown by counting the reader's steps and the pauses
 * the page got (data-read-yields / data-read-slices on the pane's main element), never by wall-clock time.
 * Needs `npx webpack --mode production` first (`npm test` builds).
 */
import type { Browser } from "playwright-core";
import { sample } from "../../src/core/gno";
import { LINES_PER_STEP } from "../../src/taskpane/parse";
import { DEMO } from "../../src/taskpane/demo";
import { launch, newPane, serveDist, type PanePage, type Served } from "./browser";

const ROWS = 200_000;
/** The reader's steps for a whole one-column paste: one pass over the lines, one over the column. */
const FULL_READ_STEPS = 2 * Math.floor(ROWS / LINES_PER_STEP);

let served: Served;
let browser: Browser;
let pane: PanePage;
let text: string;
let values: Float64Array;

beforeAll(async () => {
  served = await serveDist();
  browser = await launch();
  pane = await newPane(browser, served.origin);
  await pane.page.goto(`${served.origin}/taskpane.html`);
  await pane.page.waitForSelector('main[data-mode="standalone"][data-state="ready"]', { timeout: 90_000 });
  values = sample(DEMO.params, ROWS, 5151); // simulated, as the demo
  text = Array.from(values, String).join("\n");
}, 120_000);

afterAll(async () => {
  await browser?.close();
  await served?.close();
});

const attr = (name: string): Promise<string | null> => pane.page.getAttribute("main", name);

test(`Cancel during the reading of ${ROWS} pasted rows stops it mid-way and clears the results`, async () => {
  const note = await pane.page.textContent("#source-note");
  expect(await pane.page.isVisible("#results")).toBe(true);
  await pane.page.$eval("#paste", (el, t) => ((el as HTMLTextAreaElement).value = t), text);
  // Click Cancel from inside the page as soon as the reader has handed control back twice: the observer
  // runs while the reader is paused, exactly as a user's click would be handled then.
  await pane.page.evaluate(() => {
    const main = document.querySelector("main")!;
    const seen = new MutationObserver(() => {
      if (Number(main.dataset.readSlices) >= 2) {
        seen.disconnect();
        (document.getElementById("cancel") as HTMLButtonElement).click();
      }
    });
    seen.observe(main, { attributes: true, attributeFilter: ["data-read-slices"] });
  });
  await pane.page.click("#analyse");
  await pane.page.waitForFunction(() => document.querySelector("#message")?.textContent === "Analysis cancelled.", undefined, { timeout: 120_000 });
  const slices = Number(await attr("data-read-slices"));
  const steps = Number(await attr("data-read-yields"));
  expect(slices).toBe(2); // stopped at the first pause after the click
  expect(steps).toBeGreaterThanOrEqual(2);
  expect(steps).toBeLessThan(FULL_READ_STEPS); // mid-way: the reading never finished
  expect(await attr("data-state")).toBe("stopped");
  expect(await pane.page.isHidden("#progress")).toBe(true);
  // the previous data's results are taken off the screen, and the data named above them is unchanged
  expect(await pane.page.isHidden("#results")).toBe(true);
  expect(await pane.page.textContent("#source-note")).toBe(note);
}, 180_000);

test(`${ROWS} pasted rows are read in steps with pauses between them, every number exact`, async () => {
  await pane.page.$eval("#paste", (el, t) => ((el as HTMLTextAreaElement).value = t), text);
  await pane.page.click("#analyse");
  await pane.page.waitForFunction((n) => document.querySelector("#source-note")?.textContent?.includes(`${n} numbers`), ROWS, { timeout: 180_000 });
  const steps = Number(await attr("data-read-yields"));
  const slices = Number(await attr("data-read-slices"));
  console.log(`${ROWS} rows read in ${steps} steps and ${slices} slices`);
  expect(steps).toBeGreaterThanOrEqual(FULL_READ_STEPS);
  // the page got control back during the reading (each pause follows at most a 20 ms slice plus one step)
  expect(slices).toBeGreaterThanOrEqual(1);
  expect(slices).toBeLessThanOrEqual(steps);
  // stop the analysis that follows (not under test here) and check the numbers the pane took
  await pane.page.click("#cancel");
  await pane.page.waitForSelector('main[data-state="stopped"], main[data-state="ready"]', { timeout: 120_000 });
  const got = (await pane.page.inputValue("#data-text")).split("\n").map(Number);
  expect(got.length).toBe(ROWS);
  const wrong = got.findIndex((x, i) => x !== values[i]);
  if (wrong >= 0) throw new Error(`row ${wrong + 1}: got ${got[wrong]}, want ${values[wrong]}`);
}, 300_000);
