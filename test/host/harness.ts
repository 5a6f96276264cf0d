/**
 * Loads the BUILT add-in bundle (dist/functions.js) the way the host does: in a bare JavaScript context
 * (node:vm) whose only host globals are `CustomFunctions` (associate, Error, ErrorCode) and `Office` —
 * no DOM, no window, no require. Functions are then called as the host calls them: ranges as 2-D arrays,
 * omitted optional arguments as null, blank cells as null or "".
 *
 * Scalar parameters are treated as the host treats them. A parameter whose metadata is not
 * `dimensionality: "matrix"` never receives an array: given a 1×1 range it gets the cell's value, and given a
 * larger range the host "lifts" the call, calling the function once per cell of that range and spilling the
 * answers in the range's shape (each call's answer, or the top-left cell of an answer that is itself a range).
 * The harness does the same, so a range argument declared scalar in the JSDoc fails the tests that pass a range
 * instead of silently reaching our parser. Platform rule: a parameter that takes a range must be declared a
 * matrix (`any[][]`); https://learn.microsoft.com/en-us/office/dev/add-ins/excel/custom-functions-parameter-options
 * (matrix parameters) and https://learn.microsoft.com/en-us/office/dev/add-ins/excel/custom-functions-json
 * (`dimensionality`: scalar is a non-array value).
 * Run `npm run build` (or `npx webpack --mode production`) first; `npm test` does.
 */
import * as fs from "node:fs";
import * as path from "node:path";
import * as vm from "node:vm";

export const distDir = path.resolve(__dirname, "../../dist");

/** The host's error codes (office-js CustomFunctions.ErrorCode). */
export const ErrorCode = {
  invalidValue: "#VALUE!",
  notAvailable: "#N/A",
  divisionByZero: "#DIV/0!",
  invalidNumber: "#NUM!",
  nullReference: "#NULL!",
  invalidName: "#NAME?",
  invalidReference: "#REF!",
} as const;

/** Stand-in for the host's CustomFunctions.Error: a code and an optional message. */
export class HostError {
  constructor(
    readonly code: string,
    readonly message?: string,
  ) {}
}

export interface Metadata {
  allowErrorForDataTypeAny?: boolean;
  functions: Array<{
    id: string;
    name: string;
    description?: string;
    helpUrl?: string;
    parameters: Array<{ name: string; description?: string; type?: string; dimensionality?: string; optional?: boolean }>;
    result: { dimensionality?: string; type?: string };
    options?: { cancelable?: boolean; requiresAddress?: boolean; stream?: boolean; volatile?: boolean };
  }>;
}

export interface Bundle {
  /**
   * Calls a registered function by id; missing trailing optional arguments are passed as null. A function declared
   * cancelable (metadata options.cancelable) also gets the host's invocation object as its last argument, as the
   * host passes it; an async function returns a Promise (use `run`).
   */
  call(id: string, ...args: unknown[]): unknown;
  /** Calls a function and awaits its result whether it is synchronous or asynchronous. */
  run(id: string, ...args: unknown[]): Promise<unknown>;
  /**
   * Calls a cancelable function and cancels it once `cancelAfterMs` has passed (as the host does when the cell is
   * edited); resolves with what the function settled on and whether onCanceled was installed.
   */
  runAndCancel(id: string, cancelAfterMs: number, ...args: unknown[]): Promise<{ value: unknown; handlerInstalled: boolean; canceled: boolean }>;
  /** Every id the bundle registered through CustomFunctions.associate. */
  ids: string[];
  metadata: Metadata;
  /** The host error held by a value (a scalar error, or the 1×1 range a spilling function returns on failure). */
  errorOf(v: unknown): { code: string; message?: string } | null;
}

export function isHostError(v: unknown): v is HostError {
  return v instanceof HostError;
}

let cached: Bundle | null = null;

/** The bundle, loaded once (async for the tests' beforeAll). */
export async function loadBundle(): Promise<Bundle> {
  return loadBundleSync();
}

/** The same, synchronously (for bench/, whose run(print) is synchronous). */
export function loadBundleSync(): Bundle {
  if (cached) return cached;
  const file = path.join(distDir, "functions.js");
  if (!fs.existsSync(file)) throw new Error(`${file} is missing: run "npm run build" first.`);
  const metadata = JSON.parse(fs.readFileSync(path.join(distDir, "functions.json"), "utf8")) as Metadata;
  const registry = new Map<string, (...a: unknown[]) => unknown>();
  const CustomFunctions = {
    associate(id: string | Record<string, (...a: unknown[]) => unknown>, fn?: (...a: unknown[]) => unknown) {
      if (typeof id === "string") registry.set(id.toUpperCase(), fn!);
      else for (const [k, f] of Object.entries(id)) registry.set(k.toUpperCase(), f);
    },
    Error: HostError,
    ErrorCode,
  };
  const Office = { onReady: (cb?: () => void) => { cb?.(); return Promise.resolve({ host: "Excel", platform: "OfficeOnline" }); } };
  const context = vm.createContext({ CustomFunctions, Office, console, setTimeout, clearTimeout });
  vm.runInContext(fs.readFileSync(file, "utf8"), context, { filename: file });
  const byId = new Map(metadata.functions.map((f) => [f.id.toUpperCase(), f]));
  const invoke = (id: string, args: unknown[], invocation: object): unknown => {
    const key = id.toUpperCase();
    const fn = registry.get(key);
    if (!fn) throw new Error(`function ${id} is not registered by the bundle`);
    const meta = byId.get(key);
    const n = meta ? meta.parameters.length : args.length;
    const full = [...args];
    while (full.length < n) full.push(null);
    const call = (values: unknown[]): unknown => {
      const withInvocation = [...values];
      if (meta?.options?.cancelable) withInvocation.push(invocation);
      return fn(...withInvocation);
    };
    return meta ? lift(meta.parameters, full, call) : call(full);
  };
  const bundle: Bundle = {
    ids: [...registry.keys()],
    metadata,
    call(id: string, ...args: unknown[]) {
      return invoke(id, args, { functionName: id });
    },
    async run(id: string, ...args: unknown[]) {
      return await invoke(id, args, { functionName: id });
    },
    async runAndCancel(id: string, cancelAfterMs: number, ...args: unknown[]) {
      const invocation: { functionName: string; onCanceled?: () => void } = { functionName: id };
      let settled = false;
      const pending = Promise.resolve(invoke(id, args, invocation)).finally(() => (settled = true));
      let timer: ReturnType<typeof setTimeout> | undefined;
      const due = new Promise<void>((r) => (timer = setTimeout(r, cancelAfterMs)));
      await Promise.race([pending.then(() => undefined, () => undefined), due]);
      clearTimeout(timer);
      const handlerInstalled = typeof invocation.onCanceled === "function";
      // Cancel only a call still running, as the host does when a busy cell is edited.
      const canceled = !settled && handlerInstalled;
      if (canceled) invocation.onCanceled!();
      return { value: await pending, handlerInstalled, canceled };
    },
    errorOf(v: unknown) {
      if (isHostError(v)) return { code: v.code, message: v.message };
      if (Array.isArray(v) && v.length === 1 && Array.isArray(v[0]) && v[0].length === 1 && isHostError(v[0][0])) {
        return { code: v[0][0].code, message: v[0][0].message };
      }
      return null;
    },
  };
  cached = bundle;
  return bundle;
}

/** True for a 2-D array (a range as the host passes it). */
function isRange(v: unknown): v is unknown[][] {
  return Array.isArray(v) && v.length > 0 && v.every((row) => Array.isArray(row));
}

/** The top-left cell of a function's answer when the host lifts it (an answer that is a range shows its first cell). */
function firstCell(v: unknown): unknown {
  return isRange(v) ? v[0][0] : v;
}

/**
 * The host's handling of scalar parameters: a 1×1 range becomes its value; a larger range lifts the call cell by
 * cell (the first such parameter drives the grid; others are lifted inside each call, as nested lifting would).
 * Async answers are awaited together and assembled in the same shape.
 */
function lift(params: Metadata["functions"][number]["parameters"], args: unknown[], call: (values: unknown[]) => unknown): unknown {
  const values = [...args];
  for (let i = 0; i < params.length && i < values.length; i++) {
    if (params[i].dimensionality === "matrix" || !isRange(values[i])) continue;
    const range = values[i] as unknown[][];
    if (range.length === 1 && range[0].length === 1) {
      values[i] = range[0][0];
      continue;
    }
    const grid = range.map((row) => row.map((cell) => lift(params, values.map((v, j) => (j === i ? cell : v)), call)));
    // The bundle's promises come from the sandbox's realm, so `instanceof Promise` would miss them: test for a then.
    const pending = grid.some((row) => row.some((c) => typeof (c as { then?: unknown } | null)?.then === "function"));
    if (!pending) return grid.map((row) => row.map(firstCell));
    return Promise.all(grid.map((row) => Promise.all(row as unknown[]))).then((rows) => rows.map((row) => row.map(firstCell)));
  }
  return call(values);
}

/** A column range as the host passes it: [[a], [b], …]. */
export function col(values: ReadonlyArray<unknown>): unknown[][] {
  return values.map((v) => [v]);
}
