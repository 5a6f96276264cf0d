/**
 * Walks every cell a custom function returned and lists what the host must never receive: NaN, ±Infinity,
 * null/undefined, objects other than host errors, error codes other than #VALUE!/#N/A (the only two that carry a
 * message), errors with an empty message, ragged or empty ranges.
 */
import { HostError, isHostError } from "../host/harness";

export interface CellProblem {
  readonly where: string;
  readonly what: string;
}

export const ALLOWED_ERROR_CODES = ["#VALUE!", "#N/A"] as const;

function checkCell(v: unknown, where: string, out: CellProblem[]): void {
  if (typeof v === "number") {
    if (!Number.isFinite(v)) out.push({ where, what: `non-finite number ${v}` });
  } else if (typeof v === "string" || typeof v === "boolean") {
    // text and booleans are legitimate cells ("" looks blank)
  } else if (isHostError(v)) {
    if (!(ALLOWED_ERROR_CODES as readonly string[]).includes(v.code)) out.push({ where, what: `error code ${v.code}` });
    else if (typeof v.message !== "string" || v.message.trim().length < 8) out.push({ where, what: `${v.code} without a useful message (${JSON.stringify(v.message)})` });
  } else {
    out.push({ where, what: `a ${v === null ? "null" : typeof v} value ${String(v)}` });
  }
}

/** Every problem in a result (scalar or 2-D range); an empty list means the host may show it as is. */
export function cellProblems(result: unknown): CellProblem[] {
  const out: CellProblem[] = [];
  if (!Array.isArray(result)) {
    checkCell(result, "scalar", out);
    return out;
  }
  if (result.length === 0) return [{ where: "range", what: "empty range" }];
  let width = -1;
  for (let r = 0; r < result.length; r++) {
    const row: unknown = result[r];
    if (!Array.isArray(row)) {
      out.push({ where: `row ${r + 1}`, what: "not an array" });
      continue;
    }
    if (row.length === 0) out.push({ where: `row ${r + 1}`, what: "empty row" });
    if (width < 0) width = row.length;
    else if (row.length !== width) out.push({ where: `row ${r + 1}`, what: `ragged: ${row.length} cells, first row ${width}` });
    for (let c = 0; c < row.length; c++) {
      checkCell(row[c], `R${r + 1}C${c + 1}`, out);
      if (out.length > 20) return out;
    }
  }
  return out;
}

/** The error cells of a result, as (code, message). */
export function errorCells(result: unknown): HostError[] {
  if (isHostError(result)) return [result];
  if (!Array.isArray(result)) return [];
  const out: HostError[] = [];
  for (const row of result) if (Array.isArray(row)) for (const v of row) if (isHostError(v)) out.push(v);
  return out;
}

/** Structural equality of two results; host errors compare by code and message. */
export function sameResult(a: unknown, b: unknown): boolean {
  if (isHostError(a) || isHostError(b)) return isHostError(a) && isHostError(b) && a.code === b.code && a.message === b.message;
  if (Array.isArray(a) || Array.isArray(b)) {
    if (!Array.isArray(a) || !Array.isArray(b) || a.length !== b.length) return false;
    for (let i = 0; i < a.length; i++) if (!sameResult(a[i], b[i])) return false;
    return true;
  }
  return Object.is(a, b) || (a === 0 && b === 0);
}

/** A short printable form of a result for failure messages. */
export function preview(v: unknown): string {
  const s = JSON.stringify(v, (_k, x: unknown) => (typeof x === "number" && !Number.isFinite(x) ? String(x) : x));
  if (s === undefined) return String(v);
  return s.length > 300 ? s.slice(0, 297) + "..." : s;
}
