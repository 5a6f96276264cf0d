/**
 * The live-formula block the task pane writes into the sheet next to the data: a small 2-column block of
 * ASKEW formulas that reference the data range, so the sheet refreshes on its own when the data change.
 *
 * Pure text and A1-address arithmetic, no Office types: the pane's host bridge (src/taskpane/hostBridge.ts)
 * reads the target cells, asks before overwriting anything, then writes `cells` as formulas.
 *
 * Block layout (rows × 2 columns; column 1 holds labels, column 2 the live formulas):
 *   title
 *   parameters: ASKEW.FIT spills location, scale, shape down 3 rows
 *   VaR and ES at the chosen level for the long and the short side, reading the parameters above
 *   backtest (only when a VaR column is given): ASKEW.BACKTEST spills its label/value table
 *   report: ASKEW.FITREPORT spills its label/value table (2 columns) from column 1
 */

/** A cell address split into parts (0-based column and row). */
export interface CellRef {
  readonly column: number;
  readonly row: number;
}

/** A rectangular range on one sheet (sheet is "" when the address names none). */
export interface RangeRef {
  readonly sheet: string;
  readonly first: CellRef;
  readonly last: CellRef;
}

/** Column letters for a 0-based index: 0 → A, 25 → Z, 26 → AA. */
export function columnLetters(index: number): string {
  if (!Number.isInteger(index) || index < 0) throw new RangeError(`column index ${index} is not a whole number ≥ 0`);
  let s = "";
  let n = index + 1;
  while (n > 0) {
    const r = (n - 1) % 26;
    s = String.fromCharCode(65 + r) + s;
    n = Math.floor((n - 1) / 26);
  }
  return s;
}

/** 0-based column index for letters: A → 0, AA → 26. */
export function columnIndex(letters: string): number {
  let n = 0;
  for (const ch of letters.toUpperCase()) {
    const c = ch.charCodeAt(0) - 64;
    if (c < 1 || c > 26) throw new RangeError(`"${letters}" is not a column name`);
    n = n * 26 + c;
  }
  return n - 1;
}

const CELL = /^\$?([A-Za-z]{1,3})\$?(\d{1,7})$/;

function parseCell(text: string): CellRef {
  const m = CELL.exec(text.trim());
  if (!m) throw new RangeError(`"${text}" is not a cell address like B7`);
  return { column: columnIndex(m[1]), row: Number(m[2]) - 1 };
}

/** Parses an A1 address as the host reports it: "Sheet1!A2:A751", "'My sheet'!$B$3", "C4:D9". */
export function parseAddress(address: string): RangeRef {
  const bang = address.lastIndexOf("!");
  let sheet = bang >= 0 ? address.slice(0, bang) : "";
  if (sheet.startsWith("'") && sheet.endsWith("'")) sheet = sheet.slice(1, -1).replace(/''/g, "'");
  const body = bang >= 0 ? address.slice(bang + 1) : address;
  const [a, b] = body.split(":");
  const first = parseCell(a);
  const last = b === undefined ? first : parseCell(b);
  return {
    sheet,
    first: { column: Math.min(first.column, last.column), row: Math.min(first.row, last.row) },
    last: { column: Math.max(first.column, last.column), row: Math.max(first.row, last.row) },
  };
}

/** A sheet name as a formula prefix: Sheet1! or 'My sheet'! (quoted when it is not a plain word). */
export function sheetPrefix(sheet: string): string {
  if (sheet === "") return "";
  return /^[A-Za-z_][A-Za-z0-9_.]*$/.test(sheet) ? `${sheet}!` : `'${sheet.replace(/'/g, "''")}'!`;
}

/** Formats a range; absolute gives $A$2:$A$751 (the form written into live formulas). */
export function formatRange(r: RangeRef, absolute = false, withSheet = true): string {
  const d = absolute ? "$" : "";
  const cell = (c: CellRef): string => `${d}${columnLetters(c.column)}${d}${c.row + 1}`;
  const one = r.first.column === r.last.column && r.first.row === r.last.row;
  const body = one ? cell(r.first) : `${cell(r.first)}:${cell(r.last)}`;
  return (withSheet ? sheetPrefix(r.sheet) : "") + body;
}

/** Rows × columns of a range. */
export function rangeSize(r: RangeRef): { rows: number; columns: number } {
  return { rows: r.last.row - r.first.row + 1, columns: r.last.column - r.first.column + 1 };
}

export interface FormulaBlockSpec {
  /** What the formulas reference for the data: an A1 range ("Sheet1!$A$2:$A$751") or a table column ("Book[Return]"). */
  readonly dataRef: string;
  /** VaR/ES confidence level, strictly inside (0, 1). */
  readonly level: number;
  /** Fitting method written into the formulas. */
  readonly method: "mle" | "lmom";
  /** Optional column of VaR forecasts to backtest the data against (same reference forms as dataRef). */
  readonly varRef?: string | null;
  /** Rows the FITREPORT table spills (the pane knows it from the same table builder the function uses). */
  readonly reportRows: number;
  /** Rows the BACKTEST table spills, when a VaR column is given. */
  readonly backtestRows?: number;
}

/** The block to write: `cells[r][c]` is a label, a formula (starting with "=") or "" for a cell left for a spill. */
export interface FormulaBlock {
  readonly cells: readonly (readonly string[])[];
  readonly rows: number;
  readonly columns: 2;
}

/** Percent label for a level: 0.99 → "99%", 0.975 → "97.5%". */
export function levelLabel(level: number): string {
  return `${Number((level * 100).toPrecision(6))}%`;
}

/**
 * Builds the block whose top-left cell is `anchor` (on the data's sheet, so references need no sheet name).
 * The VaR/ES formulas read the parameter cells the FIT formula spills into, by absolute address.
 */
export function buildFormulaBlock(spec: FormulaBlockSpec, anchor: CellRef): FormulaBlock {
  if (!(spec.level > 0 && spec.level < 1)) throw new RangeError(`level ${spec.level} must lie strictly between 0 and 1`);
  const col = (c: number, r: number): string => `$${columnLetters(anchor.column + c)}$${anchor.row + r + 1}`;
  const data = spec.dataRef;
  const method = `"${spec.method}"`;
  const params = `${col(1, 1)}:${col(1, 3)}`;
  const lvl = levelLabel(spec.level);
  const level = String(spec.level);
  const rows: string[][] = [
    ["Askew live block (recalculates with the data)", ""],
    ["location", `=ASKEW.FIT(${data},${method})`],
    ["scale", ""],
    ["shape", ""],
    [`VaR ${lvl}, long`, `=ASKEW.VAR(${level},${params},"long")`],
    [`ES ${lvl}, long`, `=ASKEW.SHORTFALL(${level},${params},"long")`],
    [`VaR ${lvl}, short`, `=ASKEW.VAR(${level},${params},"short")`],
    [`ES ${lvl}, short`, `=ASKEW.SHORTFALL(${level},${params},"short")`],
  ];
  if (spec.varRef) {
    rows.push([`Backtest of ${spec.varRef.replace(/\$/g, "")} (long side)`, ""]);
    rows.push([`=ASKEW.BACKTEST(${data},${spec.varRef},${level},"long")`, ""]);
    for (let i = 1; i < (spec.backtestRows ?? 1); i++) rows.push(["", ""]);
  }
  rows.push(["Fit report", ""]);
  rows.push([`=ASKEW.FITREPORT(${data},${method})`, ""]);
  for (let i = 1; i < spec.reportRows; i++) rows.push(["", ""]);
  return { cells: rows, rows: rows.length, columns: 2 };
}

/** Where the block goes: starting at the data's first row, one empty column right of the data. */
export function blockTarget(data: RangeRef, block: FormulaBlock): RangeRef {
  const first = { column: data.last.column + 2, row: data.first.row };
  return { sheet: data.sheet, first, last: { column: first.column + block.columns - 1, row: first.row + block.rows - 1 } };
}
