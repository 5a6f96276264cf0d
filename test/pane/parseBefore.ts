/**
 * The pane's text reader as it was before it became a stepped, linear-time reader (it split every line into an
 * array of cells up front and scanned all lines once per decision). Kept unchanged as the oracle for the
 * property test: the new reader must give the same numbers, label, column, or the same message, on any input.
 */
import { InputProblem, MIN_POINTS, type ParsedColumn } from "../../src/taskpane/parse";

type Delimiter = "\t" | ";" | ",";

/** Decimal mark of a file: "." (the default) or "," (tab- or semicolon-separated files whose numbers use commas). */
type DecimalMark = "." | ",";

const PLAIN = /^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/;
/** Digit groups of three after a first group of one to three digits, with a separator that is not the decimal mark. */
const GROUPED_POINT = /^[-+]?\d{1,3}(,\d{3})+(\.\d*)?$/; // 1,234,567.89
const GROUPED_COMMA = /^[-+]?\d{1,3}(\.\d{3})+(,\d*)?$/; // 1.234.567,89
const GROUPED_SPACE = /^[-+]?\d{1,3}([ \u00a0\u202f'’]\d{3})+([.,]\d*)?$/; // 1 234 567,89 or 1'234.5

/**
 * One cell as a number, or NaN. Never truncates: a cell is read whole or not at all. With decimal mark ",",
 * "1,25" is 1.25 and "1.234,5" is 1234.5; with ".", "1,234.5" (a quoted CSV field) is 1234.5. Spaces, no-break
 * spaces and apostrophes between groups of three digits are thousands separators in either mode.
 */
function toNumber(cell: string, mark: DecimalMark): number {
  let t = cell.trim();
  let factor = 1;
  if (t.endsWith("%")) {
    factor = 0.01;
    t = t.slice(0, -1).trim();
  }
  if (t === "") return NaN;
  if (PLAIN.test(t)) return Number(t) * factor; // the common case, one test
  if (GROUPED_SPACE.test(t)) {
    t = t.replace(/[ \u00a0\u202f'’]/g, "");
    if (t.includes(",") && !t.includes(".")) t = t.replace(",", ".");
  } else if (mark === "," && GROUPED_COMMA.test(t) && /\.\d{3}(,|$)/.test(t) && (t.includes(",") || (t.match(/\./g) ?? []).length > 1)) {
    t = t.replace(/\./g, "").replace(",", ".");
  } else if (mark === ",") {
    if (/^[-+]?\d*,\d+([eE][-+]?\d+)?$/.test(t)) t = t.replace(",", ".");
  } else if (GROUPED_POINT.test(t)) {
    t = t.replace(/,/g, "");
  }
  if (!PLAIN.test(t)) return NaN;
  return Number(t) * factor;
}

/** Splits a line on the delimiter, honouring double-quoted fields ("a,b" is one field, "" inside is a quote). */
function splitRow(line: string, delimiter: Delimiter): string[] {
  if (!line.includes('"')) return line.split(delimiter);
  const out: string[] = [];
  let cur = "";
  let quoted = false;
  for (let i = 0; i < line.length; i++) {
    const ch = line[i];
    if (quoted) {
      if (ch === '"' && line[i + 1] === '"') {
        cur += '"';
        i++;
      } else if (ch === '"') quoted = false;
      else cur += ch;
    } else if (ch === '"' && cur.trim() === "") {
      quoted = true;
      cur = "";
    } else if (ch === delimiter) {
      out.push(cur);
      cur = "";
    } else cur += ch;
  }
  out.push(cur);
  return out;
}

/** The file's delimiter: tab if any line has one, else semicolon if any line has one, else comma. */
function delimiterOf(lines: readonly string[]): Delimiter {
  if (lines.some((l) => l.includes("\t"))) return "\t";
  if (lines.some((l) => l.includes(";"))) return ";";
  return ",";
}

/** A comma-separated line that reads as one number written with a decimal comma (e.g. 1,25 or -0,5). */
const LOOKS_DECIMAL_COMMA = /^\s*[-+]?\d+,\d+\s*%?\s*$/;

/** Parses pasted text or CSV content into one column of numbers; throws InputProblem with a plain message. */
export function parseColumnBefore(text: string): ParsedColumn {
  const raw = text.split(/\r\n|\n|\r/);
  const delimiter = delimiterOf(raw);
  // a decimal comma is unambiguous only when the comma is not the delimiter
  const mark: DecimalMark = delimiter !== "," ? "," : ".";
  const lines = raw.map((l, i) => ({ line: i + 1, text: l, cells: splitRow(l, delimiter) })).filter((r) => r.cells.some((c) => c.trim() !== ""));
  if (lines.length === 0) throw new InputProblem("No data: paste a column of numbers (one per line) or drop a CSV file.");
  if (delimiter === ",") {
    // "1,25" in a comma-separated file: two columns, or one number with a decimal comma? Refuse rather than guess.
    const hasPoint = lines.some((r) => /\d\.\d/.test(r.text));
    const suspect = lines.find((r) => LOOKS_DECIMAL_COMMA.test(r.text) && !r.text.includes('"'));
    if (suspect && !hasPoint) {
      throw new InputProblem(
        `Line ${suspect.line} holds "${suspect.text.trim()}": is that one number with a decimal comma, or two numbers? ` +
          "Use a point as the decimal mark (1.25), or separate the columns with semicolons or tabs so the comma can be read as a decimal comma.",
      );
    }
  }
  let width = 0;
  for (const r of lines) if (r.cells.length > width) width = r.cells.length;
  const headerCandidate = lines[0].cells.every((c) => Number.isNaN(toNumber(c, mark)));
  const body = headerCandidate ? lines.slice(1) : lines;
  if (body.length === 0) throw new InputProblem("Only a header line was found: there are no numbers under it.");
  let chosen = -1;
  const out: number[] = [];
  for (let c = 0; c < width && chosen < 0; c++) {
    out.length = 0;
    let ok = true;
    for (const r of body) {
      const cell = r.cells[c];
      if (cell === undefined || cell.trim() === "") continue;
      const v = toNumber(cell, mark);
      if (!Number.isFinite(v)) {
        ok = false;
        break;
      }
      out.push(v);
    }
    if (ok && out.length > 0) chosen = c;
  }
  if (chosen < 0) {
    const bad = body.find((r) => r.cells.every((c) => c.trim() === "" || !Number.isFinite(toNumber(c, mark)))) ?? body[0];
    const shown = bad.text.trim();
    throw new InputProblem(
      `Line ${bad.line} holds "${shown.length > 30 ? shown.slice(0, 27) + "..." : shown}", which is not a number. ` +
        "Every line needs a number (or a column of numbers in a CSV file).",
    );
  }
  if (out.length < MIN_POINTS) {
    throw new InputProblem(`Found ${out.length} number${out.length === 1 ? "" : "s"}; at least ${MIN_POINTS} are needed to fit the law.`);
  }
  if (out.every((x) => x === out[0])) throw new InputProblem(`All ${out.length} numbers are equal (${out[0]}): there is no spread to fit.`);
  return { values: Float64Array.from(out), label: headerCandidate ? (lines[0].cells[chosen] ?? "").trim() : "", column: chosen + 1 };
}

