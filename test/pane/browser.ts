/**
 * Browser helpers for the pane tests: a tiny static server for dist/ on 127.0.0.1 (random port) and a
 * Chromium page (Debian's /usr/bin/chromium via playwright-core; never a browser download) whose every request
 * not aimed at that server is aborted and recorded — so a test can also prove the pane makes no network use.
 */
import * as fs from "node:fs";
import * as http from "node:http";
import * as path from "node:path";
import type { AddressInfo } from "node:net";
import { chromium, type Browser, type Page } from "playwright-core";

export const CHROMIUM = "/usr/bin/chromium";
export const distDir = path.resolve(__dirname, "../../dist");

const TYPES: Record<string, string> = {
  ".html": "text/html; charset=utf-8",
  ".js": "text/javascript; charset=utf-8",
  ".css": "text/css; charset=utf-8",
  ".json": "application/json",
  ".png": "image/png",
  ".map": "application/json",
  ".xml": "application/xml",
};

export interface Served {
  readonly origin: string;
  close(): Promise<void>;
}

export async function serveDist(): Promise<Served> {
  const server = http.createServer((req, res) => {
    const url = new URL(req.url ?? "/", "http://127.0.0.1");
    const file = path.normalize(path.join(distDir, decodeURIComponent(url.pathname)));
    if (!file.startsWith(distDir) || !fs.existsSync(file) || fs.statSync(file).isDirectory()) {
      res.writeHead(404).end("not found");
      return;
    }
    res.writeHead(200, { "content-type": TYPES[path.extname(file)] ?? "application/octet-stream" });
    fs.createReadStream(file).pipe(res);
  });
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  const { port } = server.address() as AddressInfo;
  return { origin: `http://127.0.0.1:${port}`, close: () => new Promise((resolve) => server.close(() => resolve())) };
}

export interface PanePage {
  readonly page: Page;
  /** URLs the page tried to reach outside the local server (all aborted). */
  readonly blocked: string[];
  /** Console errors and uncaught page errors. */
  readonly errors: string[];
}

export async function launch(): Promise<Browser> {
  if (!fs.existsSync(CHROMIUM)) {
    throw new Error(`${CHROMIUM} is missing: install Debian's chromium (apt-get install chromium); CI does this in .ci/run.`);
  }
  if (!fs.existsSync(path.join(distDir, "taskpane.html"))) throw new Error("dist/taskpane.html is missing: run `npx webpack --mode production` first.");
  return chromium.launch({
    executablePath: CHROMIUM,
    args: ["--headless", "--no-sandbox", "--disable-gpu", "--disable-background-networking"],
  });
}

export interface PaneOptions {
  readonly width?: number;
  readonly height?: number;
  /**
   * Define a minimal CustomFunctions global before any page script runs, as the host's shared runtime does,
   * so dist/functions.js registers its functions in the page (window.__askew) next to the pane.
   */
  readonly sharedRuntime?: boolean;
}

/** A fresh page (own context) whose requests outside `origin` are aborted and recorded. */
export async function newPane(browser: Browser, origin: string, options: PaneOptions = {}): Promise<PanePage> {
  const context = await browser.newContext({ viewport: { width: options.width ?? 340, height: options.height ?? 900 }, deviceScaleFactor: 2 });
  const page = await context.newPage();
  const blocked: string[] = [];
  const errors: string[] = [];
  await page.route("**/*", (route) => {
    const url = route.request().url();
    if (url.startsWith(origin + "/")) return route.continue();
    blocked.push(url);
    return route.abort();
  });
  page.on("pageerror", (e) => errors.push(`pageerror: ${e.message}`));
  page.on("console", (m) => {
    if (m.type() === "error") errors.push(`console: ${m.text()}`);
  });
  if (options.sharedRuntime) {
    await page.addInitScript(() => {
      const registry: Record<string, (...a: unknown[]) => unknown> = {};
      class HostError {
        constructor(
          readonly code: string,
          readonly message?: string,
        ) {}
      }
      (window as unknown as { __askew: typeof registry }).__askew = registry;
      (window as unknown as { CustomFunctions: unknown }).CustomFunctions = {
        associate(id: string | Record<string, (...a: unknown[]) => unknown>, fn?: (...a: unknown[]) => unknown) {
          if (typeof id === "string") registry[id.toUpperCase()] = fn!;
          else for (const k of Object.keys(id)) registry[k.toUpperCase()] = id[k];
        },
        Error: HostError,
        ErrorCode: { invalidValue: "#VALUE!", notAvailable: "#N/A", divisionByZero: "#DIV/0!", invalidNumber: "#NUM!", nullReference: "#NULL!", invalidName: "#NAME?", invalidReference: "#REF!" },
      };
    });
  }
  return { page, blocked, errors };
}
