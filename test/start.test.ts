/**
 * `npm start` on a bare box without sudo (this machine: root, no sudo): the server must generate certificates,
 * fail to install the CA gracefully, say so, and serve dist/ over https on localhost. Uses a fresh HOME (which
 * os.homedir() reads on Linux) holding a certificate that expires tomorrow, so the renewal path runs, and a free port.
 * Also: a malformed URL answers 400 and the server lives on; no CORS wildcard; icons are cacheable, because the
 * manifest's image rules say an image served with no-cache/no-store headers is replaced by a default image
 * (https://learn.microsoft.com/en-us/javascript/api/manifest/iconurl, "the image must not be served with
 * Cache-Control no-cache or no-store"; the same rule in https://learn.microsoft.com/en-us/office/dev/add-ins/reference/manifest/image).
 */
import { spawn, ChildProcess } from "node:child_process";
import * as crypto from "node:crypto";
import * as fs from "node:fs";
import * as https from "node:https";
import * as net from "node:net";
import * as os from "node:os";
import * as path from "node:path";

const root = path.resolve(__dirname, "..");

function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const s = net.createServer();
    s.listen(0, "127.0.0.1", () => {
      const port = (s.address() as net.AddressInfo).port;
      s.close(() => resolve(port));
    });
  });
}

function get(url: string, headers: Record<string, string> = {}): Promise<{ status: number; body: string; headers: Record<string, unknown> }> {
  return new Promise((resolve, reject) => {
    https
      .get(url, { rejectUnauthorized: false, headers }, (res) => {
        let body = "";
        res.on("data", (c) => (body += c));
        res.on("end", () => resolve({ status: res.statusCode ?? 0, body, headers: res.headers }));
      })
      .on("error", reject);
  });
}

/** A raw request line (the https client would normalise a malformed path before sending it). */
function rawGet(port: number, target: string): Promise<number> {
  return new Promise((resolve, reject) => {
    const req = https.request({ host: "localhost", port, path: target, rejectUnauthorized: false }, (res) => {
      res.resume();
      resolve(res.statusCode ?? 0);
    });
    req.on("error", reject);
    req.end();
  });
}

let child: ChildProcess | null = null;
afterAll(() => child?.kill());

test("npm start serves the built pane over https with generated certificates and explains trust", async () => {
  expect(fs.existsSync(path.join(root, "dist/taskpane.html"))).toBe(true);
  const port = await freePort();
  const home = fs.mkdtempSync(path.join(os.tmpdir(), "askew-home-"));
  // A certificate pair made by the library with one day left: start must renew it (30 days again).
  const certDir = path.join(home, ".office-addin-dev-certs");
  fs.mkdirSync(certDir);
  // eslint-disable-next-line @typescript-eslint/no-require-imports
  const devCerts = require("office-addin-dev-certs") as { generateCertificates(ca: string, cert: string, key: string, days: number): Promise<void> };
  await devCerts.generateCertificates(path.join(certDir, "ca.crt"), path.join(certDir, "localhost.crt"), path.join(certDir, "localhost.key"), 1);
  const daysLeft = () => (Date.parse(new crypto.X509Certificate(fs.readFileSync(path.join(certDir, "localhost.crt"))).validTo) - Date.now()) / 86400000;
  expect(daysLeft()).toBeLessThan(2);
  const repoKeysBefore = fs.readdirSync(root).filter((f) => /\.(key|crt|pem)$/.test(f));
  child = spawn(process.execPath, [path.join(root, "scripts/start.mjs"), "--no-build"], {
    cwd: root,
    env: { ...process.env, HOME: home, PORT: String(port) },
  });
  let out = "";
  child.stdout!.on("data", (c) => (out += c));
  child.stderr!.on("data", (c) => (out += c));
  const deadline = Date.now() + 60000;
  while (!/served at/.test(out)) {
    if (child.exitCode !== null) throw new Error(`start exited early (${child.exitCode}):\n${out}`);
    if (Date.now() > deadline) throw new Error(`no "served at" line within 60 s:\n${out}`);
    await new Promise((r) => setTimeout(r, 100));
  }
  expect(out).toContain(`https://localhost:${port}/taskpane.html`);
  expect(out).toMatch(/does NOT trust|is trusted/);
  expect(fs.existsSync(path.join(home, ".office-addin-dev-certs", "localhost.crt"))).toBe(true);
  const page = await get(`https://localhost:${port}/taskpane.html`);
  expect(page.status).toBe(200);
  expect(page.body).toContain("Content-Security-Policy");
  const meta = await get(`https://localhost:${port}/functions.json`);
  expect(JSON.parse(meta.body).functions.length).toBeGreaterThan(0);
  expect((await get(`https://localhost:${port}/..%2Fpackage.json`)).status).toBe(404);

  // Renewed in the OS home folder; nothing written into the repository.
  expect(daysLeft()).toBeGreaterThan(20);
  expect(fs.readdirSync(root).filter((f) => /\.(key|crt|pem)$/.test(f))).toEqual(repoKeysBefore);
  expect(fs.existsSync(path.join(root, ".office-addin-dev-certs"))).toBe(false);

  // A malformed URL is a 400, and the server still answers afterwards.
  expect(await rawGet(port, "/%zz")).toBe(400);
  expect(await rawGet(port, "/%E0%A4%A")).toBe(400);
  expect((await get(`https://localhost:${port}/functions.json`)).status).toBe(200);
  expect(child!.exitCode).toBeNull();

  // No CORS wildcard: another web page cannot read the files.
  const cross = await get(`https://localhost:${port}/functions.json`, { Origin: "https://elsewhere.example" });
  expect(cross.headers["access-control-allow-origin"]).toBeUndefined();

  // Icons are cacheable; pages are not cached.
  const icon = await get(`https://localhost:${port}/assets/icon-32.png`);
  expect(icon.status).toBe(200);
  expect(String(icon.headers["cache-control"] ?? "")).not.toMatch(/no-store|no-cache/);
  expect(String(page.headers["cache-control"])).toMatch(/no-store/);
});
