/**
 * The pane's workbook path, run against office-addin-mock's OfficeMockObject standing in for the host's
 * `Excel` namespace: a property read without load() + sync() reads as an error string, so a missing load
 * shows up as a failure here. Covers reading the selection and a table column, writing the formula block,
 * and never overwriting filled cells unless the user agreed.
 */
import { OfficeMockObject } from "office-addin-mock";

// office-addin-mock needs only the OfficeApp enum from office-addin-manifest, whose full entry point pulls in an
// ES-module-only dependency that jest (CommonJS) cannot load; hand it the enum's own self-contained file.
jest.mock("office-addin-manifest", () => jest.requireActual("office-addin-manifest/lib/officeApp"));
import { buildFormulaBlock } from "../../src/functions/tables/formulas";
import { canWatchChanges, countFilled, MAX_CELLS_PER_READ, overlaps, readSource, watchChanges, writeFormulaBlock, type ExcelHost } from "../../src/taskpane/hostBridge";

type Grid = unknown[][];
const blank = (rows: number, cols: number): Grid => Array.from({ length: rows }, () => Array<unknown>(cols).fill(""));

/**
 * A range as the pane reads it: address, rowCount and columnCount (loadable through the mock), and the ExcelApi 1.1
 * navigation the chunked reader uses (getCell, getBoundingRect). Each block read is recorded as [rows, columns].
 */
function sheetRange(address: string, values: Grid, blocks: Array<[number, number]> = []): Record<string, unknown> {
  const cellAt = (r: number, c: number) => ({ r, c, getBoundingRect: (other: { r: number; c: number }) => block(r, c, other.r, other.c) });
  const block = (r0: number, c0: number, r1: number, c1: number) => {
    const rows = values.slice(r0, r1 + 1).map((row) => row.slice(c0, c1 + 1));
    blocks.push([rows.length, rows[0]?.length ?? 0]);
    return { values: rows, load: () => undefined };
  };
  return { address, rowCount: values.length, columnCount: values[0]?.length ?? 0, getCell: (r: number, c: number) => cellAt(r, c) };
}

interface Book {
  excel: ExcelHost;
  mock: OfficeMockObject;
  /** The range getRange() handed out, with the address it was asked for. */
  target(): { address: string; range: { values: Grid; formulas: Grid } };
}

function book(targetValues: Grid, targetFormulas: Grid = targetValues): Book {
  const asked: string[] = [];
  const data = {
    context: {
      workbook: {
        selected: sheetRange("Sheet1!A2:A13", [[0.01], [-0.02], [""], [0.004], [0.011], [-0.007], [0.002], [0.009], [-0.031], [0.013], [0.001], [-0.004]]),
        getSelectedRange: function () {
          return (this as unknown as { selected: unknown }).selected;
        },
        worksheets: {
          sheet: {
            target: { values: targetValues, formulas: targetFormulas },
            getRange: function (address: string) {
              asked.push(address);
              return (this as unknown as { target: unknown }).target;
            },
          },
          getItem: function (name: string) {
            if (name !== "Sheet1") throw new Error(`no sheet ${name}`);
            return (this as unknown as { sheet: unknown }).sheet;
          },
        },
        tables: {
          book: {
            body: sheetRange("Sheet1!B2:B13", [[0.01], [0.02]]),
            whole: { address: "Sheet1!A1:C13" },
            columns: {
              column: {
                getDataBodyRange: function () {
                  return (this as unknown as { owner: { body: unknown } }).owner.body;
                },
              },
              getItem: function (name: string) {
                if (name !== "Return") throw new Error(`no column ${name}`);
                return (this as unknown as { column: unknown }).column;
              },
            },
            getRange: function () {
              return (this as unknown as { whole: unknown }).whole;
            },
          },
          getItem: function (name: string) {
            if (name !== "Book") throw new Error(`no table ${name}`);
            return (this as unknown as { book: unknown }).book;
          },
        },
      },
    },
    run: async function (batch: (context: unknown) => Promise<unknown>) {
      return batch((this as unknown as { context: unknown }).context);
    },
  };
  const mock = new OfficeMockObject(data);
  // The column mock reaches its table's body range through an owner link (the real API navigates the same way).
  const m = mock as unknown as { context: { workbook: { tables: { book: { columns: { column: { owner: unknown } }; body: unknown } } } } };
  m.context.workbook.tables.book.columns.column.owner = m.context.workbook.tables.book;
  const ws = (mock as unknown as { context: { workbook: { worksheets: { sheet: { target: { values: Grid; formulas: Grid } } } } } }).context.workbook.worksheets.sheet;
  return { excel: mock as unknown as ExcelHost, mock, target: () => ({ address: asked[asked.length - 1], range: ws.target }) };
}

const spec = { level: 0.99, method: "mle" as const, reportRows: 3 };
const rowsOfBlock = buildFormulaBlock({ ...spec, dataRef: "x" }, { column: 0, row: 0 }).rows;

describe("reading the workbook", () => {
  test("the selection: its address, the reference for formulas, and the values as the host gives them", async () => {
    const b = book(blank(rowsOfBlock, 2));
    const got = await readSource(b.excel, { kind: "selection" });
    expect(got.address).toBe("Sheet1!A2:A13");
    expect(got.reference).toBe("$A$2:$A$13");
    expect(got.footprint).toBe("Sheet1!A2:A13");
    expect(got.values[2][0]).toBe("");
    expect(got.values).toHaveLength(12);
  });

  test("a table column is referenced by name (so formulas grow with the table) and the block avoids the whole table", async () => {
    const b = book(blank(rowsOfBlock, 2));
    const got = await readSource(b.excel, { kind: "tableColumn", table: "Book", column: "Return" });
    expect(got.reference).toBe("Book[Return]");
    expect(got.address).toBe("Sheet1!B2:B13");
    expect(got.footprint).toBe("Sheet1!A1:C13");
  });
});

describe("writing the live-formula block", () => {
  test("into empty cells: the block lands one column right of the data, formulas as built", async () => {
    const b = book(blank(rowsOfBlock, 2));
    const out = await writeFormulaBlock(b.excel, { footprint: "Sheet1!A2:A13", reference: "$A$2:$A$13" }, spec, false);
    expect(out).toEqual({ status: "written", address: `Sheet1!C2:D${1 + rowsOfBlock}` });
    const t = b.target();
    expect(t.address).toBe(`C2:D${1 + rowsOfBlock}`);
    const want = buildFormulaBlock({ ...spec, dataRef: "$A$2:$A$13" }, { column: 2, row: 1 }).cells;
    expect(t.range.formulas).toEqual(want);
    expect(t.range.formulas[1][1]).toBe('=ASKEW.FIT($A$2:$A$13,"mle")');
  });

  test("never overwrites a filled cell without consent, then writes once the user agrees", async () => {
    const values = blank(rowsOfBlock, 2);
    values[4][0] = "my note";
    const formulas = blank(rowsOfBlock, 2);
    formulas[6][1] = "=SUM(A2:A13)";
    values[6][1] = 0.123;
    const b = book(values, formulas);
    const data = { footprint: "Sheet1!A2:A13", reference: "$A$2:$A$13" };
    const first = await writeFormulaBlock(b.excel, data, spec, false);
    expect(first).toEqual({ status: "occupied", address: `Sheet1!C2:D${1 + rowsOfBlock}`, filledCells: 2 });
    expect(b.target().range.formulas[6][1]).toBe("=SUM(A2:A13)");
    expect(b.target().range.values[4][0]).toBe("my note");
    const second = await writeFormulaBlock(b.excel, data, spec, true);
    expect(second.status).toBe("written");
    expect(b.target().range.formulas[1][1]).toBe('=ASKEW.FIT($A$2:$A$13,"mle")');
  });
});

describe("large ranges are read in chunks (the web host caps a request at about 5 MB)", () => {
  // https://learn.microsoft.com/en-us/office/dev/add-ins/concepts/resource-limits-and-performance-optimization
  test("a 60,000 × 2 selection arrives whole, in blocks of at most MAX_CELLS_PER_READ cells, in order", async () => {
    const rows = 60_000;
    const values: Grid = Array.from({ length: rows }, (_, i) => [i * 1e-6, i % 7 === 0 ? "" : -i * 1e-6]);
    const blocks: Array<[number, number]> = [];
    const mock = new OfficeMockObject({
      context: { workbook: { selected: sheetRange("Sheet1!A1:B60000", values, blocks), getSelectedRange: function () { return (this as unknown as { selected: unknown }).selected; } } },
      run: async function (batch: (context: unknown) => Promise<unknown>) {
        return batch((this as unknown as { context: unknown }).context);
      },
    });
    const got = await readSource(mock as unknown as ExcelHost, { kind: "selection" });
    expect(got.values).toEqual(values);
    expect(blocks.length).toBeGreaterThan(1);
    for (const [r, c] of blocks) expect(r * c).toBeLessThanOrEqual(MAX_CELLS_PER_READ);
    expect(blocks.reduce((n, [r]) => n + r, 0)).toBe(rows);
  });

  test("the per-request budget keeps a block of long text cells under 5 MB", () => {
    // 50 bytes per cell as JSON (a 45-character text plus quotes and a comma) times the block size.
    expect(MAX_CELLS_PER_READ * 50).toBeLessThanOrEqual(5 * 1024 * 1024);
  });
});

describe("the change watcher", () => {
  test("is offered only where ExcelApi 1.9 is supported (WorksheetCollection.onChanged)", () => {
    const asked: string[] = [];
    const req = (ok: boolean) => ({ isSetSupported: (n: string, v?: string) => (asked.push(`${n} ${v}`), ok) });
    expect(canWatchChanges(req(true))).toBe(true);
    expect(canWatchChanges(req(false))).toBe(false);
    expect(canWatchChanges(null)).toBe(false);
    expect(asked).toEqual(["ExcelApi 1.9", "ExcelApi 1.9"]);
  });

  test("each change is handled in a fresh Excel.run context, not the one that registered the handler", async () => {
    const contexts: string[] = [];
    let handler: ((e: { worksheetId: string; address: string }) => Promise<void>) | null = null;
    const makeContext = (tag: string) => ({
      tag,
      workbook: {
        worksheets: {
          onChanged: { add: (h: typeof handler) => ((handler = h), { remove: () => undefined, context: { sync: async () => undefined } }) },
          getItem: (id: string) => ({ name: id === "w1" ? "Sheet1" : "?", load: () => contexts.push(`load in ${tag}`) }),
        },
      },
      sync: async () => undefined,
    });
    let n = 0;
    const excel = { run: async <T,>(batch: (c: never) => Promise<T>) => batch(makeContext(`run${++n}`) as never) } as ExcelHost;
    const seen: string[] = [];
    await watchChanges(excel, (a) => seen.push(a));
    await handler!({ worksheetId: "w1", address: "A5" });
    await handler!({ worksheetId: "w1", address: "A6" });
    expect(seen).toEqual(["Sheet1!A5", "Sheet1!A6"]);
    expect(contexts).toEqual(["load in run2", "load in run3"]);
  });
});

describe("helpers", () => {
  test("countFilled counts values and formulas, not blanks", () => {
    expect(countFilled([["", 0], [null, "x"]], [["", "0"], ["=A1", "x"]])).toBe(3);
  });

  test("overlaps decides whether a change touches the source", () => {
    expect(overlaps("Sheet1!A5", "Sheet1!A2:A751")).toBe(true);
    expect(overlaps("Sheet1!B5", "Sheet1!A2:A751")).toBe(false);
    expect(overlaps("Other!A5", "Sheet1!A2:A751")).toBe(false);
    expect(overlaps("Sheet1!A700:C800", "Sheet1!A2:A751")).toBe(true);
  });
});
