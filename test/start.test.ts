/**
 * `npm start` on a bare box without sudo (this machine: root, no sudo): the server must generate certificates,
 * fail to install the CA gracefully, say so, and serve dist/ over https on localhost. Uses a fresh HOME so the
 * certificates are made from scratch, and a free port.
 */
import { spawn, ChildProcess } from "node:child_process";
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

function get(url: string): Promise<{ status: number; body: string }> {
  return new Promise((resolve, reject) => {
    https
      .get(url, { rejectUnauthorized: false }, (res) => {
        let body = "";
        res.on("data", (c) => (body += c));
        res.on("end", () => resolve({ status: res.statusCode ?? 0, body }));
      })
      .on("error", reject);
  });
}

let child: ChildProcess | null = null;
afterAll(() => child?.kill());

test("npm start serves the built pane over https with generated certificates and explains trust", async () => {
  expect(fs.existsSync(path.join(root, "dist/taskpane.html"))).toBe(true);
  const port = await freePort();
  const home = fs.mkdtempSync(path.join(os.tmpdir(), "askew-home-"));
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
});
