/** Task pane entry (shared runtime page). Works in the host (office-js) and standalone in a browser. */
function start(): void {
  const status = document.getElementById("status");
  if (status) status.textContent = typeof Office === "undefined" ? "Standalone mode." : "Connected to the workbook.";
}
if (typeof Office !== "undefined") Office.onReady(() => start());
else window.addEventListener("DOMContentLoaded", start);
