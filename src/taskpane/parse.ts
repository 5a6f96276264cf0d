/**
 * Reading a column of numbers from pasted text or a CSV file (standalone pane). Pure: no DOM.
 *
 * Accepted: one number per line, or delimited rows (comma, semicolon or tab). With several columns the
 * first column whose non-header cells are all numbers is used (a date column next to returns is skipped).
 * A first line that is not numeric is taken as a header. Blank lines are skipped. Anything else is an
 * error that names the line, so the user can fix it. Percent signs are read as percent ("1.2%" → 0.012).
 */

export interface ParsedColumn {
  readonly values: Float64Array;
  /** Header of the column used, or "" when there was none. */
  readonly label: string;
  /** Which column (1-based) of a delimited file was used. */
  readonly column: number;
}

export class InputProblem extends Error {
  constructor(message: string) {
    super(message);
    this.name = "InputProblem";
  }
}

/** Fewest numbers the pane analyses (the cell functions ask for the same). */
export const MIN_POINTS = 10;

function toNumber(cell: string): number {
  let t = cell.trim().replace(/^"(.*)"$/, "$1").trim();
  let factor = 1;
  if (t.endsWith("%")) {
    factor = 0.01;
    t = t.slice(0, -1).trim();
  }
  if (t === "" || !/^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/.test(t)) return NaN;
  return Number(t) * factor;
}

function splitRow(line: string): string[] {
  if (line.includes("\t")) return line.split("\t");
  if (line.includes(";")) return line.split(";");
  return line.split(",");
}

/** Parses pasted text or CSV content into one column of numbers; throws InputProblem with a plain message. */
export function parseColumn(text: string): ParsedColumn {
  const lines = text.split(/\r\n|\n|\r/).map((l, i) => ({ line: i + 1, cells: splitRow(l) })).filter((r) => r.cells.some((c) => c.trim() !== ""));
  if (lines.length === 0) throw new InputProblem("No data: paste a column of numbers (one per line) or drop a CSV file.");
  const width = Math.max(...lines.map((r) => r.cells.length));
  const headerCandidate = lines[0].cells.every((c) => Number.isNaN(toNumber(c)));
  const body = headerCandidate ? lines.slice(1) : lines;
  if (body.length === 0) throw new InputProblem("Only a header line was found: there are no numbers under it.");
  let chosen = -1;
  for (let c = 0; c < width && chosen < 0; c++) {
    if (body.every((r) => r.cells[c] === undefined || r.cells[c].trim() === "" || Number.isFinite(toNumber(r.cells[c])))) {
      if (body.some((r) => r.cells[c] !== undefined && r.cells[c].trim() !== "")) chosen = c;
    }
  }
  if (chosen < 0) {
    const bad = body.find((r) => r.cells.every((c) => c.trim() === "" || !Number.isFinite(toNumber(c)))) ?? body[0];
    const shown = bad.cells.join(",").trim();
    throw new InputProblem(
      `Line ${bad.line} holds "${shown.length > 30 ? shown.slice(0, 27) + "..." : shown}", which is not a number. ` +
        "Every line needs a number (or a column of numbers in a CSV file).",
    );
  }
  const out: number[] = [];
  for (const r of body) {
    const cell = r.cells[chosen];
    if (cell !== undefined && cell.trim() !== "") out.push(toNumber(cell));
  }
  if (out.length < MIN_POINTS) {
    throw new InputProblem(`Found ${out.length} number${out.length === 1 ? "" : "s"}; at least ${MIN_POINTS} are needed to fit the law.`);
  }
  if (out.every((x) => x === out[0])) throw new InputProblem(`All ${out.length} numbers are equal (${out[0]}): there is no spread to fit.`);
  return { values: Float64Array.from(out), label: headerCandidate ? (lines[0].cells[chosen] ?? "").trim() : "", column: chosen + 1 };
}

/** The numbers as text, one per line, at full precision (round-trips exactly through parseColumn). */
export function formatColumn(values: ArrayLike<number>): string {
  const out: string[] = [];
  for (let i = 0; i < values.length; i++) out.push(String(values[i]));
  return out.join("\n");
}
