// npm start: build the add-in, then serve dist/ on https://localhost:3000 for sideloading.
// Certificates come from office-addin-dev-certs. Installing its CA needs administrator rights (sudo); where that
// fails (e.g. a bare Linux box as root without sudo) the certificates are still generated and served untrusted,
// and if they cannot be made at all the server falls back to http on localhost. Every case says so.
// Options: --no-build (serve the existing dist/), --http (skip certificates), PORT=NNNN.
import { spawnSync } from "node:child_process";
import { createRequire } from "node:module";
import fs from "node:fs";
import http from "node:http";
import https from "node:https";
import path from "node:path";
import { fileURLToPath } from "node:url";

const require = createRequire(import.meta.url);
const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
const dist = path.join(root, "dist");
const port = Number(process.env.PORT || 3000);
const args = new Set(process.argv.slice(2));

if (!args.has("--no-build")) {
  console.log("Building the add-in (webpack, production)…");
  const r = spawnSync(process.execPath, [require.resolve("webpack-cli/bin/cli.js"), "--mode", "production"], { cwd: root, stdio: "inherit" });
  if (r.status !== 0) {
    console.error("Build failed; nothing to serve. Fix the errors above and run npm start again.");
    process.exit(1);
  }
}
if (!fs.existsSync(path.join(dist, "taskpane.html"))) {
  console.error("dist/taskpane.html is missing: run npm start without --no-build.");
  process.exit(1);
}

async function tlsOptions() {
  if (args.has("--http")) return { options: null, note: "http requested with --http." };
  try {
    const certs = require("office-addin-dev-certs");
    const dir = path.join(process.env.HOME || root, ".office-addin-dev-certs");
    const files = { ca: path.join(dir, "ca.crt"), cert: path.join(dir, "localhost.crt"), key: path.join(dir, "localhost.key") };
    if (!certs.verifyCertificates(files.cert, files.key)) await certs.generateCertificates(files.ca, files.cert, files.key);
    let trusted = false;
    try {
      trusted = certs.isCaCertificateInstalled();
      if (!trusted) {
        await certs.installCaCertificate(files.ca);
        trusted = certs.isCaCertificateInstalled();
      }
    } catch {
      trusted = false;
    }
    const options = { key: fs.readFileSync(files.key), cert: fs.readFileSync(files.cert), ca: fs.readFileSync(files.ca) };
    const note = trusted
      ? "The development certificate authority is trusted on this machine."
      : `Serving with certificates that this machine does NOT trust (installing the CA needs administrator rights).\n` +
        `  To trust them: import ${files.ca} as a trusted root in your browser/OS (or run "npx office-addin-dev-certs install" with sudo).`;
    return { options, note };
  } catch (e) {
    return { options: null, note: `Could not create development certificates (${e && e.message ? e.message : e}); falling back to http.` };
  }
}

const types = { ".html": "text/html; charset=utf-8", ".js": "text/javascript; charset=utf-8", ".json": "application/json; charset=utf-8",
  ".css": "text/css; charset=utf-8", ".png": "image/png", ".xml": "application/xml; charset=utf-8", ".map": "application/json; charset=utf-8",
  ".csv": "text/csv; charset=utf-8", ".svg": "image/svg+xml" };

function handler(req, res) {
  const url = new URL(req.url || "/", "http://localhost");
  let rel = decodeURIComponent(url.pathname);
  if (rel === "/") rel = "/taskpane.html";
  const file = path.resolve(dist, "." + rel);
  if (!file.startsWith(dist + path.sep) || !fs.existsSync(file) || !fs.statSync(file).isFile()) {
    res.writeHead(404, { "Content-Type": "text/plain" });
    res.end("Not found");
    return;
  }
  res.writeHead(200, {
    "Content-Type": types[path.extname(file)] || "application/octet-stream",
    "Cache-Control": "no-store",
    "X-Content-Type-Options": "nosniff",
    "Access-Control-Allow-Origin": "*",
  });
  fs.createReadStream(file).pipe(res);
}

const { options, note } = await tlsOptions();
const scheme = options ? "https" : "http";
const server = options ? https.createServer(options, handler) : http.createServer(handler);
server.on("error", (e) => {
  console.error(e.code === "EADDRINUSE" ? `Port ${port} is in use: stop the other server or run PORT=3001 npm start.` : `Server error: ${e.message}`);
  process.exit(1);
});
server.listen(port, "localhost", () => {
  console.log(`\nAskew is served at ${scheme}://localhost:${port}/taskpane.html`);
  console.log(`  ${note}`);
  if (!options) console.log("  Note: the spreadsheet host only sideloads add-ins over https; http is fine for the standalone pane in a browser.");
  console.log("  Standalone: open the URL above in a browser (demo data built in).");
  console.log("  Sideload on the web: Insert > Add-ins > Upload My Add-in > choose manifest.xml.");
  console.log("  Sideload on desktop: see README (shared-folder catalog on Windows, ~/Library/Containers/com.microsoft.Excel/Data/Documents/wef on Mac).");
  console.log("  Press Ctrl+C to stop.");
});
