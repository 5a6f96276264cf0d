/**
 * The BUILT bundle (dist/functions.js) loaded for timing: compiled by vm.runInThisContext in this very process,
 * so its global lookups (Math, Number, Float64Array) are the plain fast ones. test/host/harness.ts loads the same
 * file into a bare node:vm context instead, which is right for checking isolation but makes every global lookup go
 * through the sandbox's interceptors (6–18× slower in hot loops), so its times are not the host's.
 * Only the host globals the bundle needs are installed (CustomFunctions, Office); bench processes are
 * short-lived, so nothing is removed afterwards.
 */
import * as fs from "node:fs";
import * as path from "node:path";
import * as vm from "node:vm";
import { distDir, ErrorCode, HostError, type Metadata } from "../../test/host/harness";

export interface FastBundle {
  /** Calls a function by id as the host does (missing optionals as null, an invocation for cancelable ones). */
  call(id: string, ...args: unknown[]): unknown;
  /** The same, awaiting an asynchronous function's promise. */
  run(id: string, ...args: unknown[]): Promise<unknown>;
}

let loaded: FastBundle | null | undefined;

/** The bundle, or null when dist/functions.js has not been built. */
export function loadFastBundle(): FastBundle | null {
  if (loaded !== undefined) return loaded;
  const file = path.join(distDir, "functions.js");
  if (!fs.existsSync(file)) return (loaded = null);
  const metadata = JSON.parse(fs.readFileSync(path.join(distDir, "functions.json"), "utf8")) as Metadata;
  const registry = new Map<string, (...a: unknown[]) => unknown>();
  const g = globalThis as Record<string, unknown>;
  g.CustomFunctions = {
    associate(id: string | Record<string, (...a: unknown[]) => unknown>, fn?: (...a: unknown[]) => unknown) {
      if (typeof id === "string") registry.set(id.toUpperCase(), fn!);
      else for (const [k, f] of Object.entries(id)) registry.set(k.toUpperCase(), f);
    },
    Error: HostError,
    ErrorCode,
  };
  g.Office ??= { onReady: (cb?: () => void) => { cb?.(); return Promise.resolve({ host: "Excel", platform: "OfficeOnline" }); } };
  vm.runInThisContext(fs.readFileSync(file, "utf8"), { filename: file });
  const byId = new Map(metadata.functions.map((f) => [f.id.toUpperCase(), f]));
  const call = (id: string, ...args: unknown[]): unknown => {
    const key = id.toUpperCase();
    const fn = registry.get(key);
    if (!fn) throw new Error(`function ${id} is not registered by the bundle`);
    const meta = byId.get(key);
    const full = [...args];
    while (full.length < (meta ? meta.parameters.length : args.length)) full.push(null);
    if (meta?.options?.cancelable) full.push({ functionName: id });
    return fn(...full);
  };
  loaded = { call, run: async (id, ...args) => await call(id, ...args) };
  return loaded;
}
