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
 *   with a volatility model (spec.vol): NEXTDAY's law and its next-day VaR; BACKTEST and ESBACKTEST of the model's
 *     rolling columns (and of the iid fit's, when the model is not iid); VOLFIT's report
 *   report: ASKEW.FITREPORT spills its label/value table (2 columns) from column 1
 * With spec.vol the block also gets rolling columns to the right of the two: ROLLVAR, ROLLES, ROLLPIT of the model
 * (then of the iid fit, method "auto"), each one formula in the block's first row spilling one value per data row,
 * so each forecast sits beside its return. The backtests read those columns by absolute address.
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
  /** Rolling forecasts with a volatility model and their backtests (the pane's volatility and backtest view). */
  readonly vol?: VolBlockSpec | null;
}

export interface VolBlockSpec {
  readonly model: "iid" | "ewma" | "garch";
  readonly window: number;
  /** VaR/ES level of the rolling columns, strictly inside (0, 1). */
  readonly level: number;
  readonly side: "long" | "short";
  /** Rows of the data range (the rolling columns spill that many rows). */
  readonly dataRows: number;
  /** Rows the tables spill: BACKTEST, ESBACKTEST, VOLFIT (from the table builders). */
  readonly backtestRows: number;
  readonly esBacktestRows: number;
  readonly volReportRows: number;
}

/** The ROLLVAR `method` written for a model: iid takes "auto" (a number on every forecast row), the others "mle". */
export function rollingMethod(model: VolBlockSpec["model"]): string {
  return model === "iid" ? "auto" : "mle";
}

/** The block to write: `cells[r][c]` is a label, a formula (starting with "=") or "" for a cell left for a spill. */
export interface FormulaBlock {
  readonly cells: readonly (readonly string[])[];
  readonly rows: number;
  /** 2, or 2 + 3 per rolling line with a volatility model. */
  readonly columns: number;
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
  const extra: string[] = [];
  if (spec.vol) {
    const v = spec.vol;
    if (!(v.level > 0 && v.level < 1)) throw new RangeError(`level ${v.level} must lie strictly between 0 and 1`);
    const vl = String(v.level);
    const vlbl = levelLabel(v.level);
    const models = v.model === "iid" ? (["iid"] as const) : ([v.model, "iid"] as const);
    // Rolling columns: line j's VaR, ES, PIT in block columns 2 + 3j, 3 + 3j, 4 + 3j, rows 0 … dataRows − 1.
    const rollCol = (j: number, what: number): string => {
      const letter = columnLetters(anchor.column + 2 + 3 * j + what);
      return `$${letter}$${anchor.row + 1}:$${letter}$${anchor.row + v.dataRows}`;
    };
    models.forEach((m, j) => {
      const args = `${data},${v.window},${vl},"${v.side}","${rollingMethod(m)}","${m}"`;
      extra.push(`=ASKEW.ROLLVAR(${args})`, `=ASKEW.ROLLES(${args})`, `=ASKEW.ROLLPIT(${args})`);
    });
    const first = columnLetters(anchor.column + 2);
    const last = columnLetters(anchor.column + 1 + extra.length);
    rows.push([`Rolling ${vlbl} VaR, ES, PIT (window ${v.window}): columns ${first}–${last}, one row per return, ${models.join(" then ")}`, ""]);
    const nd = rows.length;
    const ndParams = `${col(1, nd)}:${col(1, nd + 2)}`;
    rows.push([`next-day location (${v.model})`, `=ASKEW.NEXTDAY(${data},"${v.model}")`]);
    rows.push(["next-day scale", ""]);
    rows.push(["next-day shape", ""]);
    rows.push([`next-day VaR ${vlbl}, ${v.side}`, `=ASKEW.VAR(${vl},${ndParams},"${v.side}")`]);
    models.forEach((m, j) => {
      rows.push([`Backtest of the ${m} VaR column`, ""]);
      rows.push([`=ASKEW.BACKTEST(${data},${rollCol(j, 0)},${vl},"${v.side}")`, ""]);
      for (let i = 1; i < v.backtestRows; i++) rows.push(["", ""]);
      rows.push([`ES backtest of the ${m} columns`, ""]);
      rows.push([`=ASKEW.ESBACKTEST(${data},${rollCol(j, 0)},${rollCol(j, 1)},${vl},"${v.side}",${rollCol(j, 2)})`, ""]);
      for (let i = 1; i < v.esBacktestRows; i++) rows.push(["", ""]);
    });
    rows.push([`Volatility model report (${v.model})`, ""]);
    rows.push([`=ASKEW.VOLFIT(${data},"${v.model}")`, ""]);
    for (let i = 1; i < v.volReportRows; i++) rows.push(["", ""]);
  }
  rows.push(["Fit report", ""]);
  rows.push([`=ASKEW.FITREPORT(${data},${method})`, ""]);
  for (let i = 1; i < spec.reportRows; i++) rows.push(["", ""]);
  if (extra.length === 0) return { cells: rows, rows: rows.length, columns: 2 };
  const height = Math.max(rows.length, spec.vol!.dataRows);
  const cells = Array.from({ length: height }, (_, r) => [...(rows[r] ?? ["", ""]), ...extra.map((f) => (r === 0 ? f : ""))]);
  return { cells, rows: height, columns: 2 + extra.length };
}

/** Where the block goes: starting at the data's first row, one empty column right of the data. */
export function blockTarget(data: RangeRef, block: FormulaBlock): RangeRef {
  const first = { column: data.last.column + 2, row: data.first.row };
  return { sheet: data.sheet, first, last: { column: first.column + block.columns - 1, row: first.row + block.rows - 1 } };
}
