/**
 * Every workbook call the pane makes, in one small module that takes the host's `Excel` namespace as a
 * parameter (so tests pass an office-addin-mock object instead of the real host).
 *
 * Sources: the current selection, a named range, or a table column (referenced by name in the live
 * formulas so they grow with the table). Writing: the live-formula block (src/functions/tables/formulas.ts)
 * goes one empty column right of the data; the target cells are read first and nothing is overwritten
 * unless the caller says the user agreed.
 */
import { buildFormulaBlock, blockTarget, formatRange, parseAddress, type FormulaBlockSpec, type RangeRef } from "../functions/tables/formulas";

/** The part of the office-js `Excel` namespace the pane uses. */
export interface ExcelHost {
  run<T>(batch: (context: Excel.RequestContext) => Promise<T>): Promise<T>;
}

/** Where the data come from. */
export type SourceChoice =
  | { readonly kind: "selection" }
  | { readonly kind: "name"; readonly name: string }
  | { readonly kind: "address"; readonly address: string }
  | { readonly kind: "tableColumn"; readonly table: string; readonly column: string };

/** Data read from the workbook. */
export interface SheetData {
  /** Address of the cells read, e.g. "Sheet1!A2:A751". */
  readonly address: string;
  /** What live formulas should reference: an absolute range, a name, or Table[Column]. */
  readonly reference: string;
  /** The range the block must stay clear of (the whole table for a table column). */
  readonly footprint: string;
  /** Cell values as the host returns them (numbers, text, booleans, "" for blanks). */
  readonly values: unknown[][];
}

/** A named range or table column the user may pick. */
export interface SourceOption {
  readonly label: string;
  readonly choice: SourceChoice;
}

/** Lists the workbook's named ranges and table columns. */
export async function listSources(excel: ExcelHost): Promise<SourceOption[]> {
  return excel.run(async (context) => {
    const names = context.workbook.names;
    names.load("items/name,items/type");
    const tables = context.workbook.tables;
    tables.load("items/name");
    await context.sync();
    const columnsByTable = tables.items.map((t) => {
      const cols = t.columns;
      cols.load("items/name");
      return { table: t.name, cols };
    });
    await context.sync();
    const out: SourceOption[] = [];
    for (const n of names.items) if (n.type === "Range") out.push({ label: n.name, choice: { kind: "name", name: n.name } });
    for (const { table, cols } of columnsByTable) {
      for (const c of cols.items) out.push({ label: `${table}[${c.name}]`, choice: { kind: "tableColumn", table, column: c.name } });
    }
    return out;
  });
}

/**
 * Most cells read in one request. The web host refuses a request or response payload above about 5 MB
 * (https://learn.microsoft.com/en-us/office/dev/add-ins/concepts/resource-limits-and-performance-optimization,
 * "Excel add-ins": payload size limit for requests and responses); at up to ~50 bytes per cell as JSON (long text
 * is rarer in a returns column), 50,000 cells stay well under it.
 */
export const MAX_CELLS_PER_READ = 50_000;

/**
 * Reads a range's values in row blocks of at most MAX_CELLS_PER_READ cells, one request (sync) per block, using
 * only ExcelApi 1.1 calls (getCell, getBoundingRect). `range` must have address, rowCount and columnCount loaded.
 */
async function readValuesInChunks(context: Excel.RequestContext, range: Excel.Range): Promise<unknown[][]> {
  const rows = range.rowCount;
  const cols = Math.max(1, range.columnCount);
  const step = Math.max(1, Math.floor(MAX_CELLS_PER_READ / cols));
  const out: unknown[][] = [];
  for (let r0 = 0; r0 < rows; r0 += step) {
    const r1 = Math.min(rows, r0 + step) - 1;
    const block = range.getCell(r0, 0).getBoundingRect(range.getCell(r1, cols - 1));
    block.load("values");
    await context.sync();
    for (const row of block.values) out.push(row);
  }
  return out;
}

/** Reads the chosen source's values and addresses (large ranges in chunks, see MAX_CELLS_PER_READ). */
export async function readSource(excel: ExcelHost, choice: SourceChoice): Promise<SheetData> {
  return excel.run(async (context) => {
    if (choice.kind === "tableColumn") {
      const table = context.workbook.tables.getItem(choice.table);
      const body = table.columns.getItem(choice.column).getDataBodyRange();
      const whole = table.getRange();
      body.load("address,rowCount,columnCount");
      whole.load("address");
      await context.sync();
      const values = await readValuesInChunks(context, body);
      return { address: body.address, reference: `${choice.table}[${choice.column}]`, footprint: whole.address, values };
    }
    let range: Excel.Range;
    if (choice.kind === "name") range = context.workbook.names.getItem(choice.name).getRange();
    else if (choice.kind === "address") {
      const { sheet, local } = splitSheet(choice.address);
      const ws = sheet ? context.workbook.worksheets.getItem(sheet) : context.workbook.worksheets.getActiveWorksheet();
      range = ws.getRange(local);
    } else range = context.workbook.getSelectedRange();
    range.load("address,rowCount,columnCount");
    await context.sync();
    const values = await readValuesInChunks(context, range);
    const reference = choice.kind === "name" ? choice.name : formatRange(parseAddress(range.address), true, false);
    return { address: range.address, reference, footprint: range.address, values };
  });
}

/** Result of an attempt to write the formula block. */
export type WriteOutcome =
  | { readonly status: "written"; readonly address: string }
  | { readonly status: "occupied"; readonly address: string; readonly filledCells: number };

function splitSheet(address: string): { sheet: string; local: string } {
  const r = parseAddress(address);
  return { sheet: r.sheet, local: formatRange(r, false, false) };
}

/**
 * Writes the live-formula block next to the data. Reads the target first: when any target cell holds a
 * value or a formula and `overwrite` is false, nothing is written and the outcome says how many cells are
 * in the way (the pane then asks the user in the pane and calls again with overwrite = true).
 */
export async function writeFormulaBlock(
  excel: ExcelHost,
  data: Pick<SheetData, "footprint" | "reference">,
  spec: Omit<FormulaBlockSpec, "dataRef">,
  overwrite: boolean,
): Promise<WriteOutcome> {
  const footprint = parseAddress(data.footprint);
  const probe = buildFormulaBlock({ ...spec, dataRef: data.reference }, { column: 0, row: 0 });
  const target: RangeRef = blockTarget(footprint, probe);
  const block = buildFormulaBlock({ ...spec, dataRef: data.reference }, target.first);
  const { sheet, local } = splitSheet(formatRange(target));
  const address = formatRange(target);
  return excel.run(async (context) => {
    const ws = sheet ? context.workbook.worksheets.getItem(sheet) : context.workbook.worksheets.getActiveWorksheet();
    const range = ws.getRange(local);
    range.load("values,formulas");
    await context.sync();
    const filledCells = countFilled(range.values, range.formulas);
    if (filledCells > 0 && !overwrite) return { status: "occupied", address, filledCells };
    range.formulas = block.cells.map((row) => [...row]);
    await context.sync();
    return { status: "written", address };
  });
}

/** Cells holding a value or a formula (a blank reads as "" in both). */
export function countFilled(values: unknown[][], formulas: unknown[][]): number {
  let n = 0;
  for (let r = 0; r < values.length; r++) {
    for (let c = 0; c < values[r].length; c++) {
      const v = values[r][c];
      const f = formulas?.[r]?.[c];
      if ((v !== "" && v !== null && v !== undefined) || (typeof f === "string" && f !== "")) n++;
    }
  }
  return n;
}

/** True when two A1 ranges on the same sheet share a cell (a range without a sheet matches any sheet). */
export function overlaps(a: string, b: string): boolean {
  const x = parseAddress(a);
  const y = parseAddress(b);
  if (x.sheet && y.sheet && x.sheet !== y.sheet) return false;
  return x.first.column <= y.last.column && y.first.column <= x.last.column && x.first.row <= y.last.row && y.first.row <= x.last.row;
}

/** The office-js requirement check, as a parameter so tests can pass a stand-in. */
export interface Requirements {
  isSetSupported(name: string, minVersion?: string): boolean;
}

/**
 * True when the host can report cell edits to the pane: WorksheetCollection.onChanged needs ExcelApi 1.9
 * (https://learn.microsoft.com/en-us/javascript/api/excel/excel.worksheetcollection, onChanged: "API set: ExcelApi 1.9").
 * The pane offers "re-analyse when these cells change" only where this holds.
 */
export function canWatchChanges(requirements: Requirements | null | undefined): boolean {
  try {
    return !!requirements && requirements.isSetSupported("ExcelApi", "1.9");
  } catch {
    return false;
  }
}

/**
 * Calls `onChange(address)` whenever cells change on any worksheet (the pane re-analyses when the change touches its
 * source). The event fires for edits (typing, pasting, clearing), not for formula results that change by
 * recalculation (https://learn.microsoft.com/en-us/office/dev/add-ins/excel/excel-add-ins-events); the pane says so.
 * Each handler call works in a fresh Excel.run context, as the documented event pattern does
 * (https://learn.microsoft.com/en-us/office/dev/add-ins/excel/excel-add-ins-worksheets#detect-changes-on-the-worksheet):
 * the registering context is not reused after its batch ended. Returns a function that removes the handler.
 */
export async function watchChanges(excel: ExcelHost, onChange: (address: string) => void): Promise<() => Promise<void>> {
  return excel.run(async (context) => {
    const handler = context.workbook.worksheets.onChanged.add(async (e: Excel.WorksheetChangedEventArgs) => {
      await excel.run(async (fresh) => {
        const ws = fresh.workbook.worksheets.getItem(e.worksheetId);
        ws.load("name");
        await fresh.sync();
        onChange(`${ws.name}!${e.address}`);
      });
    });
    await context.sync();
    return async () => {
      handler.remove();
      await handler.context.sync();
    };
  });
}
