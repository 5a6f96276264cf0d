/**
 * The live-formula block the pane writes next to the data: A1-address arithmetic (the spreadsheet column
 * naming A…Z, AA…ZZ, AAA…, common practice), the block's layout, and — evaluated by a real calculation
 * engine (HyperFormula, test/workbook/engine.ts) on the built functions — that the block's cells give the
 * numbers the pane shows for the same data.
 */
import { fitGnoCached } from "../../src/core/fit";
import { expectedShortfall, valueAtRisk } from "../../src/core/risk";
import { BACKTEST_LABELS } from "../../src/functions/tables/backtest";
import {
  blockTarget,
  buildFormulaBlock,
  columnIndex,
  columnLetters,
  formatRange,
  levelLabel,
  parseAddress,
  sheetPrefix,
} from "../../src/functions/tables/formulas";
import { CLUSTER_DEMO, DEMO, scenarioData } from "../../src/taskpane/demo";
import { volBacktestWork } from "../../src/taskpane/volView";
import { runToEnd } from "../../src/core/work";
import { ES_BACKTEST_LABELS, ES_BACKTEST_PIT_LABELS } from "../../src/functions/tables/esBacktest";
import { VOL_ROW_LABELS } from "../../src/functions/tables/volReport";
import { fitReportRows, ROW_LABELS } from "../../src/functions/tables/fitReport";
import { addSizeRule, askewEngine } from "../workbook/engine";

describe("A1 addresses", () => {
  test.each([
    [0, "A"],
    [25, "Z"],
    [26, "AA"],
    [51, "AZ"],
    [701, "ZZ"],
    [702, "AAA"],
    [16383, "XFD"], // the last column of a 16,384-column sheet (common practice)
  ])("column %i is %s and back", (i, letters) => {
    expect(columnLetters(i)).toBe(letters);
    expect(columnIndex(letters)).toBe(i);
  });

  test("parseAddress reads sheet names, $ signs, single cells and reversed corners", () => {
    expect(parseAddress("Sheet1!A2:A751")).toEqual({ sheet: "Sheet1", first: { column: 0, row: 1 }, last: { column: 0, row: 750 } });
    expect(parseAddress("'My ''book'' sheet'!$B$3")).toEqual({ sheet: "My 'book' sheet", first: { column: 1, row: 2 }, last: { column: 1, row: 2 } });
    expect(parseAddress("D9:B2")).toEqual({ sheet: "", first: { column: 1, row: 1 }, last: { column: 3, row: 8 } });
    expect(() => parseAddress("Sheet1!2A")).toThrow(/not a cell address/);
  });

  test("formatRange writes absolute references and quotes sheet names that need it", () => {
    const r = parseAddress("'Q3 risk'!A2:A751");
    expect(formatRange(r, true)).toBe("'Q3 risk'!$A$2:$A$751");
    expect(formatRange(r, false, false)).toBe("A2:A751");
    expect(sheetPrefix("Sheet1")).toBe("Sheet1!");
    expect(sheetPrefix("it's")).toBe("'it''s'!");
  });

  test("levelLabel prints levels as users write them", () => {
    expect([0.95, 0.975, 0.99, 0.999].map(levelLabel)).toEqual(["95%", "97.5%", "99%", "99.9%"]);
  });
});

describe("the formula block", () => {
  const spec = { dataRef: "$A$2:$A$751", level: 0.99, method: "mle" as const, reportRows: 20 };

  test("sits one empty column right of the data, from the data's first row", () => {
    const block = buildFormulaBlock(spec, { column: 0, row: 0 });
    const t = blockTarget(parseAddress("Data!A2:B751"), block);
    expect(formatRange(t)).toBe(`Data!D2:E${2 + block.rows - 1}`);
  });

  test("references the data and the spilled parameters, and leaves room for the spills", () => {
    const block = buildFormulaBlock(spec, { column: 2, row: 1 });
    const flat = block.cells.flat();
    expect(block.cells[1][1]).toBe('=ASKEW.FIT($A$2:$A$751,"mle")');
    expect(block.cells[2][1]).toBe("");
    expect(block.cells[3][1]).toBe("");
    expect(flat).toContain('=ASKEW.VAR(0.99,$D$3:$D$5,"long")');
    expect(flat).toContain('=ASKEW.SHORTFALL(0.99,$D$3:$D$5,"short")');
    const report = block.cells.findIndex((r) => r[0].startsWith("=ASKEW.FITREPORT("));
    expect(block.rows - report).toBe(spec.reportRows);
    for (let r = report; r < block.rows; r++) expect(block.cells[r][1]).toBe("");
    expect(flat.some((c) => c.includes("BACKTEST"))).toBe(false);
  });

  test("adds a backtest of a chosen VaR column with room for its table", () => {
    const block = buildFormulaBlock({ ...spec, varRef: "Book[VaR99]", backtestRows: BACKTEST_LABELS.length }, { column: 2, row: 1 });
    const at = block.cells.findIndex((r) => r[0].startsWith("=ASKEW.BACKTEST("));
    expect(block.cells[at][0]).toBe('=ASKEW.BACKTEST($A$2:$A$751,Book[VaR99],0.99,"long")');
    expect(block.cells[at + BACKTEST_LABELS.length][0]).toBe("Fit report");
  });

  test("rejects a level outside (0, 1)", () => {
    expect(() => buildFormulaBlock({ ...spec, level: 99 }, { column: 0, row: 0 })).toThrow(/strictly between 0 and 1/);
  });
});

describe("the block evaluated by a calculation engine on the built functions", () => {
  test("its cells equal the pane's numbers for the demo data (bitwise), report included", async () => {
    addSizeRule("FITREPORT", { kind: "fixed", rows: ROW_LABELS.length, cols: 2 }); // its documented 32×2 table
    const engine = await askewEngine();
    if (!engine.bundle.ids.includes("FIT")) throw new Error("the built bundle registers no FIT: run the build after the fitting functions land");
    const data = scenarioData(DEMO);
    const sheet: unknown[][] = [["return"], ...Array.from(data, (x) => [x])];
    const block = buildFormulaBlock({ dataRef: `$A$2:$A$${data.length + 1}`, level: 0.99, method: "mle", reportRows: ROW_LABELS.length }, { column: 2, row: 1 });
    block.cells.forEach((row, r) => {
      row.forEach((c, k) => {
        while (sheet[1 + r].length < 2 + k) sheet[1 + r].push(null);
        sheet[1 + r][2 + k] = c === "" ? null : c;
      });
    });
    const hf = engine.build(sheet);
    await engine.settle(hf); // FIT and FITREPORT are asynchronous: the engine shows them busy until settled
    const at = (row: number, col: number): unknown => hf.getCellValue({ sheet: 0, row, col });
    const fit = fitGnoCached(data, "mle");
    const want = [
      ["location", fit.params.location],
      ["scale", fit.params.scale],
      ["shape", fit.params.shape],
      ["VaR long", valueAtRisk(0.99, fit.params, "long")],
      ["ES long", expectedShortfall(0.99, fit.params, "long")],
      ["VaR short", valueAtRisk(0.99, fit.params, "short")],
      ["ES short", expectedShortfall(0.99, fit.params, "short")],
    ] as const;
    want.forEach(([what, w], i) => {
      const got = at(2 + i, 3);
      if (got !== w) throw new Error(`block row ${what} (D${3 + i}): got ${String(got)}, want ${w} (tolerance 0: same computation)`);
    });
    const reportAt = 1 + block.cells.findIndex((r) => r[0].startsWith("=ASKEW.FITREPORT("));
    fitReportRows(fit).forEach(([label, v], i) => {
      expect([at(reportAt + i, 2), at(reportAt + i, 3)]).toEqual([label, v === null ? null : v]);
    });
    expect(engine.sizeMismatches).toEqual([]);
  });
});

describe("the block with a volatility model (the pane's volatility and backtest view)", () => {
  const volSpec = (dataRows: number) => ({
    model: "ewma" as const,
    window: 250,
    level: 0.975,
    side: "long" as const,
    dataRows,
    backtestRows: BACKTEST_LABELS.length,
    esBacktestRows: ES_BACKTEST_LABELS.length + ES_BACKTEST_PIT_LABELS.length,
    volReportRows: VOL_ROW_LABELS.length,
  });

  test("rolling columns sit right of the two block columns, one formula each in the data's first row", () => {
    const block = buildFormulaBlock({ dataRef: "$A$2:$A$401", level: 0.99, method: "mle", reportRows: 20, vol: volSpec(400) }, { column: 2, row: 1 });
    expect(block.columns).toBe(8);
    expect(block.rows).toBeGreaterThanOrEqual(400);
    expect(block.cells[0].slice(2)).toEqual([
      '=ASKEW.ROLLVAR($A$2:$A$401,250,0.975,"long","mle","ewma")',
      '=ASKEW.ROLLES($A$2:$A$401,250,0.975,"long","mle","ewma")',
      '=ASKEW.ROLLPIT($A$2:$A$401,250,0.975,"long","mle","ewma")',
      '=ASKEW.ROLLVAR($A$2:$A$401,250,0.975,"long","auto","iid")',
      '=ASKEW.ROLLES($A$2:$A$401,250,0.975,"long","auto","iid")',
      '=ASKEW.ROLLPIT($A$2:$A$401,250,0.975,"long","auto","iid")',
    ]);
    for (let r = 1; r < block.rows; r++) expect(block.cells[r].slice(2).every((c) => c === "")).toBe(true);
    const flat = block.cells.flat();
    expect(flat).toContain('=ASKEW.BACKTEST($A$2:$A$401,$E$2:$E$401,0.975,"long")');
    expect(flat).toContain('=ASKEW.ESBACKTEST($A$2:$A$401,$H$2:$H$401,$I$2:$I$401,0.975,"long",$J$2:$J$401)');
    expect(flat).toContain('=ASKEW.VOLFIT($A$2:$A$401,"ewma")');
    expect(flat).toContain('=ASKEW.NEXTDAY($A$2:$A$401,"ewma")');
    expect(block.cells.every((r) => r.length === block.columns)).toBe(true);
  });

  test("evaluated by a calculation engine on the built functions, every cell equals the pane's view (bitwise)", async () => {
    addSizeRule("FITREPORT", { kind: "fixed", rows: ROW_LABELS.length, cols: 2 });
    const engine = await askewEngine();
    for (const id of ["ROLLVAR", "ROLLES", "ROLLPIT", "ESBACKTEST", "VOLFIT", "NEXTDAY"]) {
      if (!engine.bundle.ids.includes(id)) throw new Error(`the built bundle registers no ${id}: rebuild`);
    }
    // The first 400 days of the simulated volatility-cluster demo: 150 forecast rows keep the run short.
    const data = Float64Array.from(scenarioData(CLUSTER_DEMO).subarray(0, 400));
    const vs = volSpec(data.length);
    const block = buildFormulaBlock({ dataRef: `$A$2:$A$${data.length + 1}`, level: 0.99, method: "mle", reportRows: ROW_LABELS.length, vol: vs }, { column: 2, row: 1 });
    const sheet: unknown[][] = [["return"], ...Array.from(data, (x) => [x])];
    block.cells.forEach((row, r) => {
      while (sheet.length < 2 + r) sheet.push([null]);
      row.forEach((c, k) => {
        while (sheet[1 + r].length < 2 + k) sheet[1 + r].push(null);
        sheet[1 + r][2 + k] = c === "" ? null : c;
      });
    });
    const hf = engine.build(sheet);
    await engine.settle(hf);
    const at = (row: number, col: number): unknown => hf.getCellValue({ sheet: 0, row, col });
    const view = runToEnd(volBacktestWork(data, { model: vs.model, window: vs.window, level: vs.level, side: vs.side }));
    const num = (v: unknown): number => (typeof v === "number" ? v : NaN);
    view.lines.forEach((line, j) => {
      (["valueAtRisk", "expectedShortfall", "pit"] as const).forEach((what, k) => {
        for (let r = 0; r < data.length; r++) {
          const got = num(at(1 + r, 4 + 3 * j + k));
          if (!Object.is(got, line[what][r])) throw new Error(`${line.model} ${what} row ${r + 1}: sheet ${String(at(1 + r, 4 + 3 * j + k))}, pane ${line[what][r]} (tolerance 0)`);
        }
      });
    });
    const tableAt = (formulaStart: string, nth: number, length: number): Array<[unknown, unknown]> => {
      const rows = block.cells.map((r, i) => [r, i] as const).filter(([r]) => r[0].startsWith(formulaStart));
      const r0 = 1 + rows[nth][1];
      const out: Array<[unknown, unknown]> = [];
      for (let i = 0; i < length; i++) out.push([at(r0 + i, 2), at(r0 + i, 3)]);
      return out;
    };
    const norm = (rows: ReadonlyArray<readonly [string, unknown]>): Array<[unknown, unknown]> => rows.map(([l, v]) => [l, v === null ? "" : v]);
    const cellNorm = (rows: Array<[unknown, unknown]>): Array<[unknown, unknown]> => rows.map(([l, v]) => [l, v === null ? "" : v]);
    view.lines.forEach((line, j) => {
      expect(cellNorm(tableAt("=ASKEW.BACKTEST(", j, BACKTEST_LABELS.length))).toEqual(norm(line.backtestRows!));
      expect(cellNorm(tableAt("=ASKEW.ESBACKTEST(", j, vs.esBacktestRows))).toEqual(norm(line.esRows!));
    });
    expect(cellNorm(tableAt("=ASKEW.VOLFIT(", 0, VOL_ROW_LABELS.length))).toEqual(norm(view.report!));
    const nd = 1 + block.cells.findIndex((r) => r[1].startsWith("=ASKEW.NEXTDAY("));
    const report = new Map(view.report!);
    expect([at(nd, 3), at(nd + 1, 3), at(nd + 2, 3)]).toEqual([report.get("next-day location"), report.get("next-day scale"), report.get("next-day shape")]);
    expect(engine.sizeMismatches).toEqual([]);
  });
});
