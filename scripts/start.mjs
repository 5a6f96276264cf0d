// npm start: build the add-in, then serve dist/ on https://localhost:3000 for sideloading.
// Certificates come from office-addin-dev-certs. Installing its CA needs administrator rights (sudo); where that
// fails (e.g. a bare Linux box as root without sudo) the certificates are still generated and served untrusted,
// and if they cannot be made at all the server falls back to http on localhost. Every case says so.
// Options: --no-build (serve the existing dist/), --http (skip certificates), PORT=NNNN.
import { spawnSync } from "node:child_process";
import { createRequire } from "node:module";
import crypto from "node:crypto";
import fs from "node:fs";
import os from "node:os";
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

/** Days before expiry at which the development certificate is renewed (the library issues it for 30 days). */
const RENEW_DAYS = 5;

/** True when the PEM certificate at `file` is missing, unreadable, expired or expires within RENEW_DAYS. */
function needsRenewal(file) {
  try {
    const cert = new crypto.X509Certificate(fs.readFileSync(file));
    return Date.parse(cert.validTo) - Date.now() < RENEW_DAYS * 86400000;
  } catch {
    return true;
  }
}

async function tlsOptions() {
  if (args.has("--http")) return { options: null, note: "http requested with --http." };
  try {
    // The library keeps its files in <OS home>/.office-addin-dev-certs (os.homedir(): HOME on Linux/macOS, the user
    // profile on Windows); never in this repository (and .gitignore lists the folder and *.key anyway).
    const certs = require("office-addin-dev-certs");
    const defaults = require("office-addin-dev-certs/lib/defaults");
    const home = os.homedir();
    const files = { ca: defaults.caCertificatePath, cert: defaults.localhostCertificatePath, key: defaults.localhostKeyPath };
    if (!home || path.resolve(files.key).startsWith(root + path.sep)) {
      return { options: null, note: `No usable home folder for certificates (os.homedir() = "${home}"); falling back to http.` };
    }
    // Renew before the library's own check (which tests the key pair, not the dates) would accept an old pair.
    if (needsRenewal(files.cert) || needsRenewal(files.ca)) certs.deleteCertificateFiles?.(defaults.certificateDirectory);
    let trusted = false;
    let why = "";
    try {
      // The library's own path: reuse valid certificates, otherwise generate them and install the CA.
      await certs.getHttpsServerOptions(defaults.daysUntilCertificateExpires, defaults.domain, false);
      trusted = certs.isCaCertificateInstalled();
    } catch (e) {
      // Installing the CA needs administrator rights; the certificates are generated before that step.
      why = e && e.message ? e.message.split("\n")[0] : String(e);
      if (!fs.existsSync(files.cert) || !fs.existsSync(files.key)) await certs.generateCertificates(files.ca, files.cert, files.key, defaults.daysUntilCertificateExpires, defaults.domain);
    }
    const options = { key: fs.readFileSync(files.key), cert: fs.readFileSync(files.cert), ca: fs.readFileSync(files.ca) };
    const until = new crypto.X509Certificate(options.cert).validTo;
    const note = trusted
      ? `The development certificate authority is trusted on this machine (certificate valid until ${until}).`
      : `Serving with certificates that this machine does NOT trust (installing the CA needs administrator rights${why ? `: ${why}` : ""}).\n` +
        `  Certificates: ${defaults.certificateDirectory} (valid until ${until}; renewed ${RENEW_DAYS} days before expiry).\n` +
        `  To trust them: import ${files.ca} as a trusted root in your browser/OS (or run "npx office-addin-dev-certs install" with sudo).`;
    return { options, note };
  } catch (e) {
    return { options: null, note: `Could not create development certificates (${e && e.message ? e.message : e}); falling back to http.` };
  }
}

const types = { ".html": "text/html; charset=utf-8", ".js": "text/javascript; charset=utf-8", ".json": "application/json; charset=utf-8",
  ".css": "text/css; charset=utf-8", ".png": "image/png", ".xml": "application/xml; charset=utf-8", ".map": "application/json; charset=utf-8",
  ".csv": "text/csv; charset=utf-8", ".svg": "image/svg+xml" };

/** Built files the host may cache: icons and other images (the manifest's image rules ask that they be cacheable). */
const CACHEABLE = new Set([".png", ".svg"]);

function answer(res, status, text) {
  res.writeHead(status, { "Content-Type": "text/plain; charset=utf-8", "X-Content-Type-Options": "nosniff" });
  res.end(text);
}

function handler(req, res) {
  let rel;
  try {
    const url = new URL(req.url || "/", "http://localhost");
    rel = decodeURIComponent(url.pathname);
  } catch {
    // A malformed URL (e.g. "/%zz") is the client's error: answer 400 and keep serving.
    answer(res, 400, "Bad request");
    return;
  }
  if (rel === "/") rel = "/taskpane.html";
  const file = path.resolve(dist, "." + rel);
  if (rel.includes("\0") || !file.startsWith(dist + path.sep) || !fs.existsSync(file) || !fs.statSync(file).isFile()) {
    answer(res, 404, "Not found");
    return;
  }
  // No Access-Control-Allow-Origin: the host loads these files from this origin, so no other web page needs to read them.
  // Pages and scripts are never cached (a rebuild shows at once); images are, as the host requires for icons.
  const ext = path.extname(file);
  res.writeHead(200, {
    "Content-Type": types[ext] || "application/octet-stream",
    "Cache-Control": CACHEABLE.has(ext) ? "public, max-age=86400" : "no-store",
    "X-Content-Type-Options": "nosniff",
  });
  const stream = fs.createReadStream(file);
  stream.on("error", () => res.destroy());
  stream.pipe(res);
}

const { options, note } = await tlsOptions();
const scheme = options ? "https" : "http";
const server = options ? https.createServer(options, handler) : http.createServer(handler);
// A handler bug or a broken connection must never stop the server.
server.on("clientError", (_e, socket) => socket.destroy());
server.on("error", (e) => {
  console.error(e.code === "EADDRINUSE" ? `Port ${port} is in use: stop the other server or run PORT=3001 npm start.` : `Server error: ${e.message}`);
  process.exit(1);
});
server.listen(port, "localhost", () => {
  console.log(`\nAskew is served at ${scheme}://localhost:${port}/taskpane.html`);
  console.log(`  ${note}`);
  if (!options) console.log("  Note: the spreadsheet host only sideloads add-ins over https; http is fine for the standalone pane in a browser.");
  console.log(`  Standalone (a browser, no spreadsheet): ${scheme}://localhost:${port}/standalone.html (demo data built in; office.js served from here).`);
  console.log("  Sideload on the web: Insert > Add-ins > Upload My Add-in > choose manifest.xml.");
  console.log("  Sideload on desktop: see README (shared-folder catalog on Windows, ~/Library/Containers/com.microsoft.Excel/Data/Documents/wef on Mac).");
  console.log("  Press Ctrl+C to stop.");
});
