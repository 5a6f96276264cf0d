/**
 * Security posture of the built add-in (dist/) and of the dev tooling installed with it.
 *
 * - No network at run time: the bundles hold no fetch(, XMLHttpRequest, WebSocket, EventSource, sendBeacon or
 *   importScripts, and no http(s) URL outside the allow-list below (each entry says why it is harmless).
 * - The page carries a strict Content-Security-Policy (meta tag in dist/taskpane.html): default-src 'self',
 *   script-src without 'unsafe-eval' / 'unsafe-inline', no inline scripts, no remote connections.
 * - Usage telemetry of the office-addin tooling is off for every installed copy of office-addin-usage-data:
 *   the installed versions (2.1.1 via custom-functions-metadata, 3.0.0 via the dev-certs/mock tools) have their
 *   reporting removed; the test calls their API with the network and the file system watched, so an upgrade that
 *   brings reporting back fails here.
 * Not repeated here (tested elsewhere): eval / new Function in the bundles (test/host/registration.test.ts); the
 * manifest's ReadWriteDocument permission and single origin, no AppDomains (test/manifest.test.ts); `npm audit --omit=dev`
 * (.ci/run through scripts/audit.mjs).
 */
import * as fs from "node:fs";
import * as os from "node:os";
import * as path from "node:path";
// The mutable module objects (an ES namespace import is read-only), so the test can watch their calls.
const http = require("node:http") as typeof import("node:http");
const https = require("node:https") as typeof import("node:https");
const net = require("node:net") as typeof import("node:net");

const root = path.resolve(__dirname, "..");
const dist = path.join(root, "dist");

/** Run-time JavaScript shipped to the host: every .js in dist/ (source maps are not loaded by the host). */
function bundles(): string[] {
  return fs.readdirSync(dist).filter((f) => f.endsWith(".js"));
}

/**
 * URLs allowed in the shipped files, and why:
 * - the host's office.js CDN, loaded by taskpane.html (the platform requires it), and its origin as the
 *   policy's script-src source;
 * - the SVG namespace, an XML identifier passed to createElementNS (never fetched).
 */
const ALLOWED_URLS: ReadonlyArray<{ readonly url: RegExp; readonly why: string }> = [
  { url: /^https:\/\/appsforoffice\.microsoft\.com\/lib\/1\/hosted\/office\.js$/, why: "office.js from the host's CDN (required by the platform)" },
  { url: /^https:\/\/appsforoffice\.microsoft\.com$/, why: "the CDN's origin, named in the policy's script-src" },
  { url: /^http:\/\/www\.w3\.org\/2000\/svg$/, why: "SVG namespace identifier for createElementNS, never fetched" },
];

const NETWORK_APIS = [/\bfetch\s*\(/, /\bXMLHttpRequest\b/, /\bWebSocket\b/, /\bEventSource\b/, /\bsendBeacon\b/, /\bimportScripts\b/, /\bRTCPeerConnection\b/];

describe("no network requests at run time", () => {
  test.each(bundles())("dist/%s calls no network API", (name) => {
    const src = fs.readFileSync(path.join(dist, name), "utf8");
    expect(src.length).toBeGreaterThan(100);
    const hits = NETWORK_APIS.flatMap((re) => src.match(new RegExp(re.source, "g")) ?? []);
    expect(`${name}: ${hits.join(", ")}`).toBe(`${name}: `);
  });

  test.each([...bundles(), "taskpane.html", "standalone.html", "help.html"])("dist/%s names no URL outside the allow-list", (name) => {
    const src = fs.readFileSync(path.join(dist, name), "utf8");
    const urls = [...new Set(src.match(/https?:\/\/[^\s"'`)<>\\;]+/g) ?? [])];
    const unexpected = urls.filter((u) => !ALLOWED_URLS.some((a) => a.url.test(u)));
    expect(unexpected).toEqual([]);
  });

  test("a Worker, if the pane starts one, loads the pane's own script (same origin), never a remote or blob URL", () => {
    const src = fs.readFileSync(path.join(dist, "taskpane.js"), "utf8");
    const workers = src.match(/new Worker\([^)]*\)/g) ?? [];
    for (const w of workers) expect(w).not.toMatch(/https?:|blob:|data:/);
  });
});

/** Parses the CSP meta tag: directive → sources. */
function pagePolicy(html: string): Map<string, string[]> {
  const tags = html.match(/<meta[^>]+http-equiv=["']?Content-Security-Policy["']?[^>]*>/gi) ?? [];
  if (tags.length !== 1) throw new Error(`expected one CSP meta tag, found ${tags.length}`);
  const content = /content=(?:"([^"]*)"|'([^']*)')/i.exec(tags[0]);
  if (!content) throw new Error("the CSP meta tag has no content attribute");
  const policy = new Map<string, string[]>();
  for (const part of (content[1] ?? content[2]).split(";")) {
    const [name, ...sources] = part.trim().split(/\s+/);
    if (name) policy.set(name.toLowerCase(), sources);
  }
  return policy;
}

describe("the page's Content-Security-Policy (dist/taskpane.html)", () => {
  const html = fs.readFileSync(path.join(dist, "taskpane.html"), "utf8");
  const policy = pagePolicy(html);
  const scriptSrc = policy.get("script-src") ?? policy.get("default-src") ?? [];

  test("default-src is 'self' only", () => {
    expect(policy.get("default-src")).toEqual(["'self'"]);
  });

  test("script-src allows neither 'unsafe-eval' nor 'unsafe-inline', and only 'self' plus the office.js host", () => {
    expect(scriptSrc).not.toContain("'unsafe-eval'");
    expect(scriptSrc).not.toContain("'unsafe-inline'");
    expect(scriptSrc.filter((s) => s !== "'self'" && s !== "https://appsforoffice.microsoft.com")).toEqual([]);
  });

  test("no remote connections, plugins or base-URL changes: connect-src 'self', object-src and base-uri 'none'", () => {
    expect(policy.get("connect-src") ?? policy.get("default-src")).toEqual(["'self'"]);
    expect(policy.get("object-src")).toEqual(["'none'"]);
    expect(policy.get("base-uri")).toEqual(["'none'"]);
  });

  test("every script on the page is an external file the policy allows; no inline script or event-handler attribute", () => {
    const scripts = [...html.matchAll(/<script\b([^>]*)>([\s\S]*?)<\/script>/gi)];
    expect(scripts.length).toBeGreaterThan(0);
    for (const [, attrs, body] of scripts) {
      expect(body.trim()).toBe("");
      const src = /src=["']?([^"' >]+)/.exec(attrs)?.[1] ?? "";
      const remote = /^https?:\/\//.test(src);
      expect(remote ? src.startsWith("https://appsforoffice.microsoft.com/") : !src.includes(":")).toBe(true);
    }
    expect(html.match(/\son[a-z]+\s*=/gi) ?? []).toEqual([]);
  });
});

describe("the standalone page (dist/standalone.html) allows no remote script at all", () => {
  const html = fs.readFileSync(path.join(dist, "standalone.html"), "utf8");
  const policy = pagePolicy(html);

  test("script-src is 'self' only, connect-src 'self', and every script is a local file", () => {
    expect(policy.get("script-src")).toEqual(["'self'"]);
    expect(policy.get("connect-src") ?? policy.get("default-src")).toEqual(["'self'"]);
    const scripts = [...html.matchAll(/<script\b([^>]*)>([\s\S]*?)<\/script>/gi)];
    expect(scripts.length).toBeGreaterThan(0);
    for (const [, attrs, body] of scripts) {
      expect(body.trim()).toBe("");
      expect(/src=["']?([^"' >]+)/.exec(attrs)?.[1] ?? "").not.toMatch(/:/);
    }
  });
});

/** Every installed copy of office-addin-usage-data (nested copies included). */
function usageDataCopies(): string[] {
  const found: string[] = [];
  const walk = (dir: string, depth: number) => {
    if (depth > 6 || !fs.existsSync(dir)) return;
    for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
      if (!entry.isDirectory()) continue;
      const p = path.join(dir, entry.name);
      if (entry.name === "office-addin-usage-data" && fs.existsSync(path.join(p, "package.json"))) found.push(p);
      else if (entry.name.startsWith("@")) walk(p, depth);
      else if (entry.name !== ".bin" && fs.existsSync(path.join(p, "node_modules"))) walk(path.join(p, "node_modules"), depth + 1);
    }
  };
  walk(path.join(root, "node_modules"), 0);
  return found;
}

interface UsageDataModule {
  OfficeAddinUsageData: new (options: Record<string, unknown>) => {
    reportEvent(name: string, data: object): Promise<void> | void;
    reportError(name: string, err: Error): Promise<void> | void;
    reportException(method: string, err: Error, data?: object): void;
    reportSuccess(method: string, data?: object): void;
    sendUsageDataEvent(data: object): void;
    setUsageDataOn(): void;
    isUsageDataOn(): boolean;
    getUsageDataLevel(): string;
  };
  readUsageDataLevel?(group: string): string;
  writeUsageDataJsonData?(group: string, level: string): void;
  UsageDataLevel: { on: string; off: string };
}

describe("telemetry of the office-addin tooling is off", () => {
  const copies = usageDataCopies();

  test("the copies installed are the ones this test was written against", () => {
    const versions = copies.map((c) => JSON.parse(fs.readFileSync(path.join(c, "package.json"), "utf8")).version as string);
    expect(copies.length).toBeGreaterThan(0);
    // A new major version must be re-read before it is trusted: extend this list after checking its source.
    for (const v of versions) expect(["2.1.1", "3.0.0"]).toContain(v);
  });

  test.each(copies.map((c) => [path.relative(root, c)]))("%s: no reporting dependency, and reporting calls send nothing and write nothing", async (rel) => {
    const dir = path.join(root, rel);
    const pkg = JSON.parse(fs.readFileSync(path.join(dir, "package.json"), "utf8")) as { dependencies?: Record<string, string> };
    expect(Object.keys(pkg.dependencies ?? {}).filter((d) => /applicationinsights|telemetry|analytics/i.test(d))).toEqual([]);

    // Watch the network (http, https, raw sockets, fetch) and give the module an empty home directory.
    const attempts: string[] = [];
    const saved = { httpRequest: http.request, httpsRequest: https.request, connect: net.connect, createConnection: net.createConnection, fetch: globalThis.fetch, home: process.env.HOME, userprofile: process.env.USERPROFILE };
    const home = fs.mkdtempSync(path.join(os.tmpdir(), "askew-usage-"));
    const deny = (what: string) => (..._a: unknown[]) => {
      attempts.push(what);
      throw new Error(`network call blocked in test: ${what}`);
    };
    try {
      (http as { request: unknown }).request = deny("http.request");
      (https as { request: unknown }).request = deny("https.request");
      (net as { connect: unknown }).connect = deny("net.connect");
      (net as { createConnection: unknown }).createConnection = deny("net.createConnection");
      (globalThis as { fetch: unknown }).fetch = deny("fetch");
      process.env.HOME = home;
      process.env.USERPROFILE = home;

      let mod: UsageDataModule | undefined;
      jest.isolateModules(() => {
        mod = require(path.join(dir, "lib", "main.js")) as UsageDataModule;
      });
      const m = mod!;
      const usage = new m.OfficeAddinUsageData({
        projectName: "askew-test",
        instrumentationKey: "00000000-0000-0000-0000-000000000000",
        promptQuestion: "",
        raisePrompt: false,
        usageDataLevel: m.UsageDataLevel.on,
      });
      usage.setUsageDataOn();
      expect(usage.isUsageDataOn()).toBe(false);
      expect(usage.getUsageDataLevel()).toBe("off");
      if (m.readUsageDataLevel) expect(m.readUsageDataLevel("askew-test")).toBe("off");
      m.writeUsageDataJsonData?.("askew-test", "on");
      await usage.reportEvent("askew-test-event", { a: 1 });
      await usage.reportError("askew-test-error", new Error("x"));
      usage.reportException("method", new Error("x"));
      usage.reportSuccess("method");
      usage.sendUsageDataEvent({ a: 1 });
      await new Promise((r) => setTimeout(r, 50));
      expect(attempts).toEqual([]);
      expect(fs.readdirSync(home)).toEqual([]);
    } finally {
      (http as { request: unknown }).request = saved.httpRequest;
      (https as { request: unknown }).request = saved.httpsRequest;
      (net as { connect: unknown }).connect = saved.connect;
      (net as { createConnection: unknown }).createConnection = saved.createConnection;
      (globalThis as { fetch: unknown }).fetch = saved.fetch;
      if (saved.home === undefined) delete process.env.HOME;
      else process.env.HOME = saved.home;
      if (saved.userprofile === undefined) delete process.env.USERPROFILE;
      else process.env.USERPROFILE = saved.userprofile;
      fs.rmSync(home, { recursive: true, force: true });
    }
  });
});
