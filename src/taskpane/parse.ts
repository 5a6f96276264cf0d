/**
 * Reading a column of numbers from pasted text or a CSV file (standalone pane). Pure: no DOM.
 *
 * Accepted: one number per line, or delimited rows (tab, else semicolon, else comma: the first that occurs in
 * the text), with double-quoted fields. With several columns the first column whose non-header cells are all
 * numbers is used (a date column next to returns is skipped). A first line that is not numeric is taken as a
 * header. Blank lines are skipped. Percent signs are read as percent ("1.2%" → 0.012). A cell is read whole or
 * not at all (never truncated). Decimal commas are read in tab- or semicolon-separated text ("1,25" → 1.25,
 * "1.234,5" → 1234.5); in comma-separated text a line such as 1,25 with no decimal point anywhere is refused,
 * because it could be one number or two. Thousands separators: "1,234.5" in a quoted field, spaces, no-break
 * spaces and apostrophes between digit groups. Anything else is an error that names the line.
 */
import { runToEnd, type Work } from "../core/work";

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

/** A comma-separated line that reads as one number written with a decimal comma (e.g. 1,25 or -0,5). */
const LOOKS_DECIMAL_COMMA = /^\s*[-+]?\d+,\d+\s*%?\s*$/;

/** Lines the stepped reader handles between two yields (a few milliseconds of work on a typical machine). */
export const LINES_PER_STEP = 4096;

/** Whitespace as String.prototype.trim sees it (the same set as \s). */
const SPACE = /\s/;

/** True for a character that cannot make a cell non-blank: whitespace, or the delimiter itself. */
function blankChar(code: number, delimiter: number): boolean {
  if (code === delimiter || code === 32 || (code >= 9 && code <= 13)) return true;
  return code >= 128 && SPACE.test(String.fromCharCode(code));
}

/** A growable list of 32-bit integers (line offsets), so that a million lines cost no million small objects. */
class IntList {
  data = new Int32Array(1024);
  length = 0;
  push(x: number): void {
    if (this.length === this.data.length) {
      const bigger = new Int32Array(this.data.length * 2);
      bigger.set(this.data);
      this.data = bigger;
    }
    this.data[this.length++] = x;
  }
}

/** A growable list of doubles (the numbers read). */
class NumberList {
  data = new Float64Array(1024);
  length = 0;
  push(x: number): void {
    if (this.length === this.data.length) {
      const bigger = new Float64Array(this.data.length * 2);
      bigger.set(this.data);
      this.data = bigger;
    }
    this.data[this.length++] = x;
  }
}

/**
 * Parses pasted text or CSV content into one column of numbers, as resumable work: it yields a progress fraction
 * every `linesPerStep` lines (tests use small steps to resume it often), so a driver can keep the page responsive
 * and stop on Cancel; InputProblem (a plain message) is thrown from inside the work. Time and memory are linear in
 * the text: the separator decision and the decimal-comma check are single native scans of the whole text, lines
 * are kept as offsets (no per-line arrays), and cells are cut out of the text only for the column being read. A
 * file whose first columns are not numeric costs one pass per column tried.
 */
export function* parseColumnWork(text: string, linesPerStep = LINES_PER_STEP): Work<ParsedColumn> {
  const step = Math.max(1, Math.floor(linesPerStep));
  const delimiter: Delimiter = text.includes("\t") ? "\t" : text.includes(";") ? ";" : ",";
  // a decimal comma is unambiguous only when the comma is not the delimiter
  const mark: DecimalMark = delimiter !== "," ? "," : ".";
  const dcode = delimiter.charCodeAt(0);
  const len = text.length;
  const at = (i: number): number => (i < 0 ? len : i);
  // "1,25" in a comma-separated file: two columns, or one number with a decimal comma? Refuse rather than guess,
  // unless a decimal point anywhere shows the file's decimal mark (a match cannot span a line break).
  const checkComma = delimiter === "," && !/\d\.\d/.test(text);
  yield 0;

  // Pass 1: the non-blank lines, as offsets into the text with their 1-based line numbers.
  const starts = new IntList();
  const ends = new IntList();
  const numbers = new IntList();
  const quotedLines = new IntList(); // 1 where the line holds a double quote (read by splitRow)
  let nextNewline = -1;
  let nextReturn = text.includes("\r") ? -1 : len;
  let nextQuote = -1;
  let suspectLine = 0;
  let suspectText = "";
  let pos = 0;
  for (let lineNo = 1; ; lineNo++) {
    if (nextNewline < pos) nextNewline = at(text.indexOf("\n", pos));
    if (nextReturn < pos) nextReturn = at(text.indexOf("\r", pos));
    if (nextQuote < pos) nextQuote = at(text.indexOf('"', pos));
    const end = nextNewline < nextReturn ? nextNewline : nextReturn;
    const quoted = nextQuote < end;
    let blank = true;
    if (quoted) blank = splitRow(text.slice(pos, end), delimiter).every((c) => c.trim() === "");
    else for (let i = pos; i < end && blank; i++) blank = blankChar(text.charCodeAt(i), dcode);
    if (!blank) {
      starts.push(pos);
      ends.push(end);
      numbers.push(lineNo);
      quotedLines.push(quoted ? 1 : 0);
      if (checkComma && suspectLine === 0 && !quoted) {
        const line = text.slice(pos, end);
        if (LOOKS_DECIMAL_COMMA.test(line)) {
          suspectLine = lineNo;
          suspectText = line;
        }
      }
    }
    if (end >= len) break;
    pos = end + (text.charCodeAt(end) === 13 && text.charCodeAt(end + 1) === 10 ? 2 : 1);
    if (lineNo % step === 0) yield (0.3 * pos) / len;
  }
  const n = starts.length;
  if (n === 0) throw new InputProblem("No data: paste a column of numbers (one per line) or drop a CSV file.");
  if (suspectLine > 0) {
    throw new InputProblem(
      `Line ${suspectLine} holds "${suspectText.trim()}": is that one number with a decimal comma, or two numbers? ` +
        "Use a point as the decimal mark (1.25), or separate the columns with semicolons or tabs so the comma can be read as a decimal comma.",
    );
  }
  const lineText = (k: number): string => text.slice(starts.data[k], ends.data[k]);
  const cellsOf = (k: number): string[] => splitRow(lineText(k), delimiter);
  const first = cellsOf(0);
  const header = first.every((c) => Number.isNaN(toNumber(c, mark)));
  const from = header ? 1 : 0;
  if (from >= n) throw new InputProblem("Only a header line was found: there are no numbers under it.");

  // Pass 2, once per column tried: the first column whose non-blank body cells are all numbers.
  let chosen = -1;
  const out = new NumberList();
  for (let c = 0; chosen < 0; c++) {
    out.length = 0;
    let ok = true;
    let reached = false; // some body line has a cell in column c
    let nextDelimiter = -1;
    for (let k = from; k < n; k++) {
      if ((k - from) % step === step - 1) yield 0.3 + (0.7 * k) / n;
      let cell: string | undefined;
      if (quotedLines.data[k] === 1) cell = cellsOf(k)[c];
      else {
        const end = ends.data[k];
        let p = starts.data[k];
        for (let j = 0; j < c && p >= 0; j++) {
          if (nextDelimiter < p) nextDelimiter = at(text.indexOf(delimiter, p));
          p = nextDelimiter < end ? nextDelimiter + 1 : -1;
        }
        if (p >= 0) {
          if (nextDelimiter < p) nextDelimiter = at(text.indexOf(delimiter, p));
          cell = text.slice(p, nextDelimiter < end ? nextDelimiter : end);
        }
      }
      if (cell === undefined) continue;
      reached = true;
      if (cell.trim() === "") continue;
      const v = toNumber(cell, mark);
      if (!Number.isFinite(v)) {
        ok = false;
        break;
      }
      out.push(v);
    }
    if (ok && out.length > 0) chosen = c;
    else if (!reached) break;
  }
  if (chosen < 0) {
    let bad = from;
    for (let k = from; k < n; k++) {
      if ((k - from) % step === step - 1) yield 1;
      if (cellsOf(k).every((c) => c.trim() === "" || !Number.isFinite(toNumber(c, mark)))) {
        bad = k;
        break;
      }
    }
    const shown = lineText(bad).trim();
    throw new InputProblem(
      `Line ${numbers.data[bad]} holds "${shown.length > 30 ? shown.slice(0, 27) + "..." : shown}", which is not a number. ` +
        "Every line needs a number (or a column of numbers in a CSV file).",
    );
  }
  const count = out.length;
  if (count < MIN_POINTS) {
    throw new InputProblem(`Found ${count} number${count === 1 ? "" : "s"}; at least ${MIN_POINTS} are needed to fit the law.`);
  }
  const values = out.data.slice(0, count);
  let spread = false;
  for (let i = 1; i < count && !spread; i++) spread = values[i] !== values[0];
  if (!spread) throw new InputProblem(`All ${count} numbers are equal (${values[0]}): there is no spread to fit.`);
  return { values, label: header ? (first[chosen] ?? "").trim() : "", column: chosen + 1 };
}

/** Parses pasted text or CSV content into one column of numbers in one go; throws InputProblem with a plain message. */
export function parseColumn(text: string): ParsedColumn {
  return runToEnd(parseColumnWork(text));
}

/** The numbers as text, one per line, at full precision (round-trips exactly through parseColumn). */
export function formatColumn(values: ArrayLike<number>): string {
  const out: string[] = [];
  for (let i = 0; i < values.length; i++) out.push(String(values[i]));
  return out.join("\n");
}
