/**
 * Shared argument parsing and result shaping for the ASKEW cell functions.
 *
 * Adapters do three things only: parse host arguments (this file), call src/core, shape the result
 * (this file). No statistics here. Facts about how the host passes values (DEVELOPERS.md):
 * optional arguments arrive as null; blanks as null, "" or (old desktop builds) 0; error cells reach a
 * function only when its metadata sets allowErrorForDataTypeAny, as CustomFunctions.Error objects;
 * only #VALUE! and #N/A show a custom message; "" looks blank, null would show as 0.
 *
 * Data-type cells: the metadata generator writes allowCustomDataForDataTypeAny (and our build adds
 * allowErrorForDataTypeAny), so entity and other data-type values reach `any` parameters as objects
 * (https://learn.microsoft.com/en-us/office/dev/add-ins/excel/custom-functions-data-types-concepts). No ASKEW
 * function reads them: an object that is not an error cell is refused like text, with a #VALUE! that names the
 * cell (row and column within the range) and says "a data-type value (Entity) ..."; describeCell gives that wording.
 */
import type { GnoParams } from "../core/gno";
import { splicedProblem, type SplicedParams, type TailPiece } from "../core/pareto";

/** A problem with the user's input (or an undefined answer), carried to the host as #VALUE! or #N/A. */
export class CellError extends Error {
  constructor(
    readonly kind: "value" | "na",
    message: string,
  ) {
    super(message);
    this.name = "CellError";
  }
}

/** What a custom function may return in one cell. */
export type CellValue = number | string | boolean | CustomFunctions.Error;
export type Grid = CellValue[][];

/** Throws a #VALUE! with a message that tells the user what to fix. */
export function fail(message: string): never {
  throw new CellError("value", message);
}

/** Throws a #N/A with a message (a defined "no answer", such as no edge for the normal law). */
export function notAvailable(message: string): never {
  throw new CellError("na", message);
}

function hostError(kind: "value" | "na", message: string): CustomFunctions.Error {
  // The host truncates long messages; keep them short and specific.
  const text = message.length > 250 ? message.slice(0, 247) + "..." : message;
  const code = kind === "na" ? CustomFunctions.ErrorCode.notAvailable : CustomFunctions.ErrorCode.invalidValue;
  return new CustomFunctions.Error(code, text);
}

/** Turns anything thrown inside an adapter into a host error; never lets an exception escape. */
export function toHostError(e: unknown): CustomFunctions.Error {
  if (e instanceof CellError) return hostError(e.kind, e.message);
  if (e instanceof RangeError) {
    // The engine's own size limits say "too large"; a core function's RangeError is a domain message.
    const tooLarge = /invalid (typed )?array length|allocation failed|call stack/i.test(e.message);
    return hostError("value", (tooLarge ? "Input too large: " : "Cannot compute: ") + e.message);
  }
  const msg = e instanceof Error ? e.message : String(e);
  return hostError("value", "Unexpected problem: " + msg);
}

/** Runs an adapter body; a CellError (or any exception) becomes a host error with its message. */
export function guard<T>(body: () => T): T | CustomFunctions.Error {
  try {
    return body();
  } catch (e) {
    return toHostError(e);
  }
}

/**
 * Runs the body of a function that spills a range (declared `any[][]`); on failure the result is a 1×1
 * range holding the host error, so the message shows in the anchor cell.
 */
export function guardGrid(body: () => Grid): Grid {
  try {
    return body();
  } catch (e) {
    return [[toHostError(e)]];
  }
}

/** True for the host's blank values (null, undefined, ""). A 0 from an old desktop build cannot be told apart. */
export function isBlank(v: unknown): boolean {
  return v === null || v === undefined || v === "";
}

/** True for an error cell passed in by the host. */
export function isErrorCell(v: unknown): v is { code: string; message?: string } {
  if (typeof v !== "object" || v === null) return false;
  if (typeof CustomFunctions !== "undefined" && v instanceof CustomFunctions.Error) return true;
  const code = (v as { code?: unknown }).code;
  return typeof code === "string" && code.startsWith("#");
}

/** A short description of a bad cell for messages: text "abc", TRUE, #DIV/0!. */
export function describeCell(v: unknown): string {
  if (typeof v === "string") return `text "${v.length > 20 ? v.slice(0, 17) + "..." : v}"`;
  if (typeof v === "boolean") return v ? "TRUE" : "FALSE";
  if (isErrorCell(v)) return `error ${v.code}`;
  if (typeof v === "number") return String(v);
  if (typeof v === "object" && v !== null) {
    const type = (v as { type?: unknown }).type;
    const text = (v as { basicValue?: unknown; text?: unknown }).basicValue ?? (v as { text?: unknown }).text;
    const shown = typeof text === "string" || typeof text === "number" ? ` "${String(text).length > 20 ? String(text).slice(0, 17) + "..." : String(text)}"` : "";
    return `a data-type value${typeof type === "string" ? ` (${type})` : ""}${shown}: use the number it holds (e.g. a field of the card) instead`;
  }
  return typeof v;
}

/** Flattens a host argument (scalar, 1-D or 2-D array) to rows of cells. */
export function asGrid(v: unknown): unknown[][] {
  if (Array.isArray(v)) {
    if (v.length > 0 && Array.isArray(v[0])) return v as unknown[][];
    return [v as unknown[]];
  }
  return [[v]];
}

/** Reads one number; name is the argument's name for messages. */
export function readNumber(v: unknown, name: string): number {
  const x = single(v, name);
  if (isBlank(x)) fail(`${name} is blank: enter a number.`);
  if (typeof x === "number") {
    if (!Number.isFinite(x)) fail(`${name} must be a finite number.`);
    return x;
  }
  if (typeof x === "string" && x.trim() !== "" && Number.isFinite(Number(x))) {
    fail(`${name} is ${describeCell(x)}: enter it as a number, not text.`);
  }
  return fail(`${name} must be a number, not ${describeCell(x)}.`);
}

/** Reads an optional number: blank or omitted gives the default. */
export function readOptionalNumber(v: unknown, name: string, fallback: number): number {
  return isBlank(single(v, name)) ? fallback : readNumber(v, name);
}

/** Reads a probability or confidence level strictly inside (0, 1). */
export function readProbability(v: unknown, name: string): number {
  const p = readNumber(v, name);
  if (!(p > 0 && p < 1)) fail(`${name} must lie strictly between 0 and 1 (got ${p}); e.g. 0.99 for 99%.`);
  return p;
}

/**
 * Reads the optional EWMA / age-weight decay λ: blank or omitted gives undefined (the model's default), else a
 * number strictly between 0 and 1.
 */
export function readDecay(v: unknown): number | undefined {
  if (isBlank(single(v, "decay"))) return undefined;
  const x = readNumber(v, "decay");
  if (!(x > 0 && x < 1)) fail(`decay must lie strictly between 0 and 1 (got ${x}); e.g. 0.94, the usual daily EWMA decay.`);
  return x;
}

/** Reads a whole number in [min, max]; blank/omitted gives the fallback when one is given. */
export function readInteger(v: unknown, name: string, min: number, max: number, fallback?: number): number {
  if (isBlank(single(v, name))) {
    if (fallback !== undefined) return fallback;
    fail(`${name} is required: enter a whole number from ${min} to ${max}.`);
  }
  const x = readNumber(v, name);
  if (!Number.isInteger(x)) fail(`${name} must be a whole number (got ${x}).`);
  if (x < min || x > max) fail(`${name} must be from ${min} to ${max} (got ${x}).`);
  return x;
}

/** Reads an optional keyword (case-insensitive) from a fixed list; blank/omitted gives the fallback. */
export function readChoice<T extends string>(v: unknown, name: string, choices: readonly T[], fallback: T): T {
  const x = single(v, name);
  if (isBlank(x)) return fallback;
  if (typeof x !== "string") fail(`${name} must be one of ${choices.map((c) => `"${c}"`).join(", ")}.`);
  const k = x.trim().toLowerCase();
  const hit = choices.find((c) => c === k);
  if (!hit) fail(`${name} "${x}" is not recognised: use ${choices.map((c) => `"${c}"`).join(" or ")}.`);
  return hit;
}

/** Asks readParams to accept 9 cells as well (the law with generalized Pareto tails). */
export const WITH_TAILS = { tails: true } as const;

/** True for the 9-cell spliced law returned by readParams(v, name, WITH_TAILS). */
export function isSpliced(p: GnoParams | SplicedParams): p is SplicedParams {
  return "body" in p;
}

/**
 * Reads the 3 parameters (location, scale, shape) from a row, a column or an array constant. With WITH_TAILS it
 * also accepts 9 cells: the 3, then lower-tail threshold, ξ, β, then upper-tail threshold, ξ, β, a side without a
 * tail left blank (or all 0, as old desktop builds pass blanks); 9 cells with both sides blank give the 3.
 */
export function readParams(v: unknown, name?: string): GnoParams;
export function readParams(v: unknown, name: string, options: typeof WITH_TAILS): GnoParams | SplicedParams;
export function readParams(v: unknown, name = "params", options?: typeof WITH_TAILS): GnoParams | SplicedParams {
  const cells = asGrid(v).flat();
  if (options?.tails && cells.length === 9) return readTailParams(cells, name);
  if (cells.length !== 3) {
    const also = options?.tails ? " or 9 cells (those 3, then lower-tail threshold, ξ, β, then upper-tail threshold, ξ, β)" : "";
    fail(`${name} must be 3 cells (location, scale, shape)${also} in a row or a column; got ${cells.length}.`);
  }
  const labels = ["location", "scale", "shape"];
  const xs = cells.map((c, i) => {
    if (isBlank(c)) fail(`${name}: ${labels[i]} is blank.`);
    if (typeof c !== "number") fail(`${name}: ${labels[i]} must be a number, not ${describeCell(c)}.`);
    if (!Number.isFinite(c)) fail(`${name}: ${labels[i]} must be finite.`);
    return c;
  });
  if (!(xs[1] > 0)) fail(`${name}: scale must be greater than 0 (got ${xs[1]}).`);
  return { location: xs[0], scale: xs[1], shape: xs[2] };
}

function readTailParams(cells: unknown[], name: string): GnoParams | SplicedParams {
  const body = readParams(cells.slice(0, 3), name);
  const side = (at: number, which: string): TailPiece | null => {
    const three = cells.slice(at, at + 3);
    if (three.every(isBlank) || three.every((c) => c === 0)) return null;
    const labels = ["threshold", "ξ", "β"];
    const xs = three.map((c, i) => {
      if (isBlank(c)) fail(`${name}: the ${which} tail's ${labels[i]} is blank; give threshold, ξ and β, or leave all three blank.`);
      if (typeof c !== "number" || !Number.isFinite(c)) fail(`${name}: the ${which} tail's ${labels[i]} must be a finite number, not ${describeCell(c)}.`);
      return c;
    });
    if (!(xs[2] > 0)) fail(`${name}: the ${which} tail's β must be greater than 0 (got ${xs[2]}).`);
    return { threshold: xs[0], shape: xs[1], scale: xs[2] };
  };
  const lower = side(3, "lower");
  const upper = side(6, "upper");
  if (!lower && !upper) return body;
  const p: SplicedParams = { body, lower, upper };
  const problem = splicedProblem(p);
  if (problem) fail(`${name}: ${problem}.`);
  return p;
}

export interface DataOptions {
  /** Fewest usable numbers accepted (default 10). */
  readonly min?: number;
  /** Reject data whose numbers are all equal (default true). */
  readonly requireSpread?: boolean;
}

/**
 * Reads a data range: numbers are used in row-major order, blanks are skipped, anything else (text,
 * booleans, error cells, non-finite numbers) is an error naming its row and column within the range.
 * Copies the numbers once into a Float64Array.
 */
export function readData(v: unknown, name = "data", options: DataOptions = {}): Float64Array {
  const min = options.min ?? 10;
  const grid = asGrid(v);
  let cells = 0;
  for (let r = 0; r < grid.length; r++) cells += grid[r].length;
  // one loop: check, copy and watch for a spread; the buffer is trimmed only when blanks were skipped
  let out = new Float64Array(cells);
  let count = 0;
  let same = true;
  for (let r = 0; r < grid.length; r++) {
    const row = grid[r];
    for (let c = 0; c < row.length; c++) {
      const x = row[c];
      if (typeof x === "number") {
        if (x - x !== 0) fail(`${name}: the cell at row ${r + 1}, column ${c + 1} is not a finite number.`);
        if (same && count > 0 && x !== out[0]) same = false;
        out[count++] = x;
      } else if (!isBlank(x)) {
        fail(`${name}: the cell at row ${r + 1}, column ${c + 1} holds ${describeCell(x)}; only numbers and blanks are allowed.`);
      }
    }
  }
  if (count < min) fail(`${name} has ${count} usable number${count === 1 ? "" : "s"}; at least ${min} are needed.`);
  if (count < cells) out = out.slice(0, count);
  if (options.requireSpread !== false && same) {
    fail(`${name}: all ${count} numbers are equal (${out[0]}); a law cannot be fitted to constant data.`);
  }
  return out;
}

/** A finite number for a cell, or a host error with the message when it is not. */
export function numberCell(x: number, whatIfNot: string): number | CustomFunctions.Error {
  return Number.isFinite(x) ? x : hostError("value", whatIfNot);
}

/**
 * Applies f to every cell of a range argument, keeping its shape. Blank cells give "" (blank-looking);
 * a bad cell gives an error in that cell only; a non-finite result gives #VALUE! with `whatIfNotFinite`.
 * An empty range (no cell at all) is a #VALUE! that says so: an empty result would spill nothing and hide the slip.
 */
export function mapCells(
  v: unknown,
  name: string,
  f: (x: number) => number,
  whatIfNotFinite = "The result is not a finite number.",
): Grid {
  const grid = asGrid(v);
  if (grid.length === 0 || grid.every((row) => row.length === 0)) fail(`${name} is an empty range: give at least one cell.`);
  // Sized once, and no closure made per call: a push-grown outer array, or a fresh inner closure per call (which
  // the optimizer sees as a new call target each time and stops inlining), cost more than the law's own arithmetic
  // on a long column (bench/scipy.ts, "CDF/QUANTILE over 100,000 cells").
  const out: Grid = new Array(grid.length);
  for (let r = 0; r < grid.length; r++) {
    const row = grid[r];
    if (row.length === 1) {
      out[r] = [mapCell(row[0], name, f, whatIfNotFinite)]; // a column: one packed 1-element row each
      continue;
    }
    const o: CellValue[] = new Array(row.length);
    for (let c = 0; c < row.length; c++) o[c] = mapCell(row[c], name, f, whatIfNotFinite);
    out[r] = o;
  }
  return out;
}

/** One cell of mapCells: a finite number in, f's value (or its error) out; "" for a blank; #VALUE! otherwise. */
function mapCell(x: unknown, name: string, f: (x: number) => number, whatIfNotFinite: string): CellValue {
  if (typeof x === "number" && x - x === 0) {
    let y: number;
    try {
      y = f(x);
    } catch (e) {
      return toHostError(e);
    }
    return y - y === 0 ? y : hostError("value", whatIfNotFinite);
  }
  if (isBlank(x)) return "";
  if (typeof x !== "number") return hostError("value", `${name} must be a number, not ${describeCell(x)}.`);
  return hostError("value", `${name} must be finite.`);
}

/** A column of numbers (n×1), each checked for finiteness. */
export function column(values: ArrayLike<number>, whatIfNotFinite = "The result is not a finite number."): Grid {
  const out: Grid = new Array(values.length);
  for (let i = 0; i < values.length; i++) out[i] = [numberCell(values[i], whatIfNotFinite)];
  return out;
}

/** A two-column label/value table; non-finite numbers become "" with no error (a row that does not apply). */
export function labelTable(rows: ReadonlyArray<readonly [string, number | string | boolean | null]>): Grid {
  return rows.map(([label, value]) => [label, value === null || (typeof value === "number" && !Number.isFinite(value)) ? "" : value]);
}

function single(v: unknown, name: string): unknown {
  if (!Array.isArray(v)) return v;
  const cells = asGrid(v).flat();
  if (cells.length !== 1) fail(`${name} must be a single value, not a range of ${cells.length} cells.`);
  return cells[0];
}
