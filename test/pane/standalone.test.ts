/**
 * The standalone page (dist/standalone.html, what `npm start` offers for a plain browser) loads office.js from the
 * npm package @microsoft/office-js served from our own origin, so with no network it still starts and makes no
 * outside request; the host page (dist/taskpane.html) keeps the platform's hosted office.js, which add-ins loaded
 * by the host must use (https://learn.microsoft.com/en-us/office/dev/add-ins/develop/referencing-the-javascript-api-for-office-library).
 * Outside a host, Office.onReady resolves with no host and the page goes standalone at once (no timer):
 * https://learn.microsoft.com/en-us/office/dev/add-ins/develop/initialize-add-in.
 */
import * as fs from "node:fs";
import * as path from "node:path";
import type { Browser } from "playwright-core";
import { distDir, launch, newPane, serveDist, type Served } from "./browser";

const pkg = path.resolve(__dirname, "../../node_modules/@microsoft/office-js");

test("the served office.js files are the npm package's own, unmodified", () => {
  for (const [served, original] of [["office-js/office.js", "dist/office.js"], ["office-js/en-us/office_strings.js", "dist/en-us/office_strings.js"]]) {
    expect(fs.readFileSync(path.join(distDir, served)).equals(fs.readFileSync(path.join(pkg, original)))).toBe(true);
  }
});

test("the two pages differ only in where office.js comes from and the policy's script source", () => {
  const host = fs.readFileSync(path.join(distDir, "taskpane.html"), "utf8");
  const alone = fs.readFileSync(path.join(distDir, "standalone.html"), "utf8");
  expect(host).toContain("https://appsforoffice.microsoft.com/lib/1/hosted/office.js");
  expect(alone).not.toMatch(/https?:\/\//);
  expect(alone).toMatch(/<script src="?office-js\/office\.js"?>/);
  const strip = (h: string) => h.replace(/<script src="?[^"> ]*office\.js"?><\/script>/, "").replace(/script-src [^;]*;/, "").replace(/<!--[\s\S]*?-->/g, "");
  expect(strip(alone)).toBe(strip(host));
});

describe("in a browser with every outside request blocked", () => {
  let browser: Browser;
  let served: Served;
  beforeAll(async () => {
    browser = await launch();
    served = await serveDist();
  });
  afterAll(async () => {
    await browser?.close();
    await served?.close();
  });

  test("standalone.html starts standalone, requests only local files that exist, and logs no error", async () => {
    const pane = await newPane(browser, served.origin);
    const missing: string[] = [];
    pane.page.on("response", (r) => {
      if (r.status() >= 400) missing.push(`${r.status()} ${r.url()}`);
    });
    const t0 = Date.now();
    await pane.page.goto(`${served.origin}/standalone.html`);
    await pane.page.waitForFunction(() => document.getElementById("app")?.dataset.mode === "standalone", undefined, { timeout: 30000 });
    const officeLoaded = await pane.page.evaluate(() => typeof (window as unknown as { Office?: unknown }).Office !== "undefined");
    expect(officeLoaded).toBe(true);
    expect(pane.blocked).toEqual([]);
    expect(missing).toEqual([]);
    // office.js, loaded outside a client, tries to frame a telemetry page and to apply an inline style; the page's
    // policy refuses both before any request leaves the browser (no route saw them). Anything else is a failure.
    const refusedByPolicy = /violates the following Content Security Policy directive/;
    const ours = pane.errors.filter((e) => !(refusedByPolicy.test(e) && (/Framing 'https:\/\/[^']*telemetry/.test(e) || /Applying inline style/.test(e))));
    expect(ours).toEqual([]);
    // Went standalone through onReady, not after a fallback delay (a generous bound, not a timing assertion).
    expect(Date.now() - t0).toBeLessThan(7000);
    await pane.page.context().close();
  });
});
