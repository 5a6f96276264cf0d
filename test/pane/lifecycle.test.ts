/**
 * The pane's lifecycle in the shared runtime: visibility from Office.addin.onVisibilityModeChanged (SharedRuntime 1.1,
 * https://learn.microsoft.com/en-us/javascript/api/office/office.addin) and the page's visibilityState; no timer that
 * switches a host page to standalone (outside a host, Office.onReady resolves with no host:
 * https://learn.microsoft.com/en-us/office/dev/add-ins/develop/initialize-add-in).
 */
import * as fs from "node:fs";
import * as path from "node:path";
import { followVisibility } from "../../src/taskpane/lifecycle";

function fakeAddin() {
  let handler: ((a: { visibilityMode: string }) => void) | null = null;
  return {
    addin: { onVisibilityModeChanged: (h: (a: { visibilityMode: string }) => void) => ((handler = h), Promise.resolve(() => Promise.resolve())) },
    fire: (mode: string) => handler!({ visibilityMode: mode }),
  };
}

test("a page started hidden (a function calculated) stays idle until the pane is shown, and idles again when hidden", () => {
  const { addin, fire } = fakeAddin();
  const seen: boolean[] = [];
  const v = followVisibility(addin, { visibilityState: "hidden" }, (x) => seen.push(x));
  expect(v.visible()).toBe(false);
  fire("Taskpane");
  expect(v.visible()).toBe(true);
  fire("Taskpane");
  fire("Hidden");
  expect(v.visible()).toBe(false);
  expect(seen).toEqual([true, false]);
});

test("without the host event (older host or standalone) the page's own visibility decides", () => {
  const listeners: Array<() => void> = [];
  const page = { visibilityState: "visible", addEventListener: (_t: string, l: () => void) => listeners.push(l) };
  const seen: boolean[] = [];
  const v = followVisibility(null, page, (x) => seen.push(x));
  expect(v.visible()).toBe(true);
  page.visibilityState = "hidden";
  listeners.forEach((l) => l());
  expect(v.visible()).toBe(false);
  expect(seen).toEqual([false]);
});

test("the pane analyses and watches only through the visibility gate, and the change watcher is guarded by ExcelApi 1.9", () => {
  const app = fs.readFileSync(path.resolve(__dirname, "../../src/taskpane/app.ts"), "utf8");
  const wire = app.slice(app.indexOf("async function wireHost"), app.indexOf("async function writeBlock"));
  // Every watchChanges/analyseSheet() start in wireHost sits inside onVisibility, which runs only when visible.
  const gate = wire.slice(wire.indexOf("const onVisibility"), wire.indexOf("const addin"));
  expect(gate).toContain("watchChanges(");
  expect(wire.replace(gate, "")).not.toMatch(/watchChanges\(|await analyseSheet\(\)/);
  expect(wire).toContain("if (visibility.visible()) await onVisibility(true)");
  expect(wire).toContain("canWatchChanges(");
});

test("no timer switches the host page to standalone", () => {
  const entry = fs.readFileSync(path.resolve(__dirname, "../../src/taskpane/taskpane.ts"), "utf8");
  expect(entry).not.toMatch(/setTimeout\(/);
});
