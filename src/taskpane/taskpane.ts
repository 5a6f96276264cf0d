/**
 * Task pane entry (the shared runtime's page). In the host, office-js reports Excel and the pane reads the
 * workbook; opened in an ordinary browser (no Office, or onReady reports no host) it runs standalone on pasted
 * data, a dropped CSV file or the simulated demo.
 */
import { startPane } from "./app";

function boot(): void {
  if (typeof Office === "undefined" || typeof Office.onReady !== "function") {
    startPane(null);
    return;
  }
  let started = false;
  const once = (host: boolean): void => {
    if (started) return;
    started = true;
    startPane(host && typeof Excel !== "undefined" ? Excel : null);
  };
  Office.onReady((info) => once(!!info && info.host === Office.HostType.Excel)).catch(() => once(false));
  // office.js outside a host may never call back: fall back to standalone.
  setTimeout(() => once(false), 1500);
}

if (document.readyState === "loading") document.addEventListener("DOMContentLoaded", boot);
else boot();
