/**
 * The built function metadata (dist/functions.json) against the platform's rules, for every function, so a new
 * function that breaks one fails here. Each rule names the documentation page it comes from.
 */
import * as fs from "node:fs";
import * as path from "node:path";
import { loadBundle, type Bundle } from "./host/harness";

const root = path.resolve(__dirname, "..");
const meta = JSON.parse(fs.readFileSync(path.join(root, "dist/functions.json"), "utf8")) as Bundle["metadata"];
const fns = meta.functions;

describe("function ids and names (https://learn.microsoft.com/en-us/office/dev/add-ins/excel/custom-functions-naming)", () => {
  // "Function names must start with a letter, be at least three characters long, and contain only letters A-Z,
  // numbers 0-9, periods and underscores"; ids follow the same characters (custom-functions-json, "id").
  const RULE = /^[A-Z][A-Z0-9._]{2,}$/;

  test.each(fns.map((f) => [f.id, f.name]))("%s: id and name follow the naming rules", (id, name) => {
    expect(RULE.test(id) ? id : `bad id ${id}`).toBe(id);
    expect(RULE.test(name) ? name : `bad name ${name}`).toBe(name);
  });

  test("ids are unique and names are unique (case-insensitive)", () => {
    const ids = fns.map((f) => f.id.toUpperCase());
    const names = fns.map((f) => f.name.toUpperCase());
    expect(ids.filter((x, i) => ids.indexOf(x) !== i)).toEqual([]);
    expect(names.filter((x, i) => names.indexOf(x) !== i)).toEqual([]);
  });

  test("the rule itself rejects the names it must reject", () => {
    for (const bad of ["ES", "1FIT", "FIT-2", "FIT SE", "_FIT"]) expect(RULE.test(bad)).toBe(false);
  });
});

describe("descriptions fit the host's formula help (https://learn.microsoft.com/en-us/office/dev/add-ins/excel/custom-functions-json)", () => {
  // The host shows the description in its formula help and cuts long text; our limit is 255 characters and one or
  // two sentences for a function, 255 characters for a parameter. Long row lists live on the help page.
  const LIMIT = 255;
  const sentences = (s: string) => s.split(/(?<=[.!?])\s+(?=[A-Z"])/).filter((x) => x.trim() !== "").length;

  test.each(fns.map((f) => [f.name, f]))("%s: description ≤ 255 characters, at most two sentences; parameter help ≤ 255", (_n, f) => {
    const d = f.description ?? "";
    expect(d.length > 0 ? "described" : "no description").toBe("described");
    expect({ name: f.name, length: d.length, ok: d.length <= LIMIT }).toEqual({ name: f.name, length: d.length, ok: true });
    expect({ name: f.name, sentences: sentences(d) <= 2 }).toEqual({ name: f.name, sentences: true });
    for (const p of f.parameters) {
      const pd = p.description ?? "";
      expect({ param: `${f.name}.${p.name}`, length: pd.length, ok: pd.length > 0 && pd.length <= LIMIT }).toEqual({ param: `${f.name}.${p.name}`, length: pd.length, ok: true });
    }
  });
});

describe("help pages (helpUrl, https://learn.microsoft.com/en-us/office/dev/add-ins/excel/custom-functions-json)", () => {
  const html = fs.readFileSync(path.join(root, "dist/help.html"), "utf8");

  test.each(fns.map((f) => [f.name, f]))("%s: helpUrl points at its own section of the served help page", (_n, f) => {
    expect(f.helpUrl).toBe(`https://localhost:3000/help.html#ASKEW.${f.name}`);
    expect(html).toContain(`<section id="ASKEW.${f.name}">`);
  });

  test("the built page is what the generator writes from the metadata and the table builders' labels", () => {
    // eslint-disable-next-line @typescript-eslint/no-require-imports
    const { helpPage } = require(path.join(root, "scripts/help-page.cjs"));
    // eslint-disable-next-line @typescript-eslint/no-require-imports
    const { ROW_LABELS } = require("../src/functions/tables/fitReport") as { ROW_LABELS: readonly string[] };
    const { BACKTEST_LABELS } = require("../src/functions/tables/backtest") as { BACKTEST_LABELS: readonly string[] };
    const { GOF_LABELS } = require("../src/functions/tables/gof") as { GOF_LABELS: readonly string[] };
    const { COMPARE_HEADER } = require("../src/functions/tables/compare") as { COMPARE_HEADER: readonly string[] };
    const tables = {
      FITREPORT: { kind: "rows", labels: [...ROW_LABELS] },
      BACKTEST: { kind: "rows", labels: [...BACKTEST_LABELS] },
      GOF: { kind: "rows", labels: [...GOF_LABELS] },
      COMPARE: { kind: "columns", labels: [...COMPARE_HEADER] },
    };
    expect(html).toBe(helpPage(meta, tables));
    for (const label of ROW_LABELS) expect(html).toContain(`<li>${label.replace(/&/g, "&amp;")}</li>`);
  });

  test("the page loads no script and nothing remote", () => {
    expect(html).not.toMatch(/<script/i);
    expect(html.match(/https?:\/\/[^\s"'<>]+/g) ?? []).toEqual([]);
  });
});

describe("a parameter that takes a range is a matrix parameter (https://learn.microsoft.com/en-us/office/dev/add-ins/excel/custom-functions-parameter-options)", () => {
  // A scalar parameter given a range is lifted cell by cell by the host; so any parameter whose name or help says it
  // takes a range, a column, a row of cells or the 3 parameters must be declared any[][] (dimensionality "matrix").
  const RANGE_NAMES = /^(data|params|returns|prices|VaR|x|p)$/;
  const RANGE_WORDS = /\b(range|column|3 cells|cells in a row)\b/i;
  const rangeParams = fns.flatMap((f) => f.parameters.filter((p) => RANGE_NAMES.test(p.name) || RANGE_WORDS.test(p.description ?? "")).map((p) => [`${f.name}.${p.name}`, p.dimensionality ?? "scalar"]));

  test("the walk finds the range parameters (GOF.params among them)", () => {
    expect(rangeParams.map((r) => r[0])).toEqual(expect.arrayContaining(["GOF.params", "GOF.data", "FIT.data", "LOGLIK.params", "ROLLVAR.returns"]));
  });

  test.each(rangeParams)("%s is declared matrix", (_name, dim) => {
    expect(dim).toBe("matrix");
  });
});

describe("the harness lifts scalar parameters as the host does", () => {
  let b: Bundle;
  beforeAll(async () => {
    b = await loadBundle();
  });

  test("a 2×1 range given to RANDOM's scalar n gives one answer per cell (the first draw of each call)", () => {
    const p = [[0], [1], [0]];
    const lifted = b.call("RANDOM", p, [[1], [2]], 5) as unknown[][];
    const one = b.call("RANDOM", p, 1, 5) as unknown[][];
    const two = b.call("RANDOM", p, 2, 5) as unknown[][];
    expect(lifted).toEqual([[one[0][0]], [two[0][0]]]);
  });

  test("a 1×1 range given to a scalar parameter arrives as its value", () => {
    const p = [[0], [1], [0]];
    expect(b.call("RANDOM", p, [[3]], 5)).toEqual(b.call("RANDOM", p, 3, 5));
  });
});
