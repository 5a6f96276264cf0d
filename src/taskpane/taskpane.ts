/**
 * Task pane entry (the shared runtime's page). In the host, office-js reports Excel and the pane reads the
 * workbook; opened in an ordinary browser (no Office, or onReady reports no host) it runs standalone on pasted
 * data, a dropped CSV file or the simulated demo. The same file, started as a Web Worker by the pane, serves
 * the background model comparison (worker.ts).
 */
import { startPane } from "./app";
import { serveComparisons } from "./worker";

function boot(scriptUrl: string | null): void {
  if (typeof Office === "undefined" || typeof Office.onReady !== "function") {
    startPane(null, scriptUrl);
    return;
  }
  let started = false;
  const once = (host: boolean): void => {
    if (started) return;
    started = true;
    startPane(host && typeof Excel !== "undefined" ? Excel : null, scriptUrl);
  };
  // Outside a host office.js resolves onReady with no host, so the pane goes standalone without any timer.
  Office.onReady((info) => once(!!info && info.host === Office.HostType.Excel)).catch(() => once(false));
}

if (typeof document === "undefined") {
  serveComparisons(self as unknown as Parameters<typeof serveComparisons>[0]);
} else {
  const script = document.currentScript as HTMLScriptElement | null;
  const url = script && script.src ? script.src : null;
  if (document.readyState === "loading") document.addEventListener("DOMContentLoaded", () => boot(url));
  else boot(url);
}
