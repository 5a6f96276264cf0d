/**
 * Standalone data input: pasted text and CSV files become one column of numbers, or a plain message that
 * names the problem. Expected values are written by hand from the input text.
 */
import { formatColumn, InputProblem, MIN_POINTS, parseColumn } from "../../src/taskpane/parse";

const ten = ["0.01", "-0.02", "0.003", "0.004", "-0.005", "0.006", "0.007", "-0.008", "0.009", "0.0105"];

function problemOf(text: string): string {
  try {
    parseColumn(text);
  } catch (e) {
    if (e instanceof InputProblem) return e.message;
    throw e;
  }
  throw new Error(`expected an input problem for ${JSON.stringify(text)}`);
}

describe("parseColumn reads what an analyst pastes", () => {
  test("one number per line, blank lines skipped, CRLF accepted", () => {
    const r = parseColumn(ten.join("\r\n") + "\r\n\r\n");
    expect(Array.from(r.values)).toEqual(ten.map(Number));
    expect(r.label).toBe("");
  });

  test("a header line is taken as the column's label", () => {
    const r = parseColumn(["return", ...ten].join("\n"));
    expect(r.label).toBe("return");
    expect(r.values.length).toBe(10);
  });

  test("in a CSV the first all-numeric column is used (a date column is skipped)", () => {
    const rows = ten.map((x, i) => `2024-01-${String(i + 1).padStart(2, "0")},${x},abc`);
    const r = parseColumn(["date,ret,comment", ...rows].join("\n"));
    expect(r.column).toBe(2);
    expect(r.label).toBe("ret");
    expect(Array.from(r.values)).toEqual(ten.map(Number));
  });

  test("tab- and semicolon-separated rows, quoted cells and percent signs", () => {
    const tab = parseColumn(ten.map((x) => `d\t"${x}"`).join("\n"));
    expect(Array.from(tab.values)).toEqual(ten.map(Number));
    const pct = parseColumn(ten.map((x) => `a;${Number(x) * 100}%`).join("\n"));
    pct.values.forEach((v, i) => expect(Math.abs(v - Number(ten[i]))).toBeLessThanOrEqual(1e-17));
  });

  test("formatColumn round-trips every double exactly", () => {
    const xs = Float64Array.from([0.1 + 0.2, -1e-300, 5e-324, 1 / 3, -2.5e10, 7, 8, 9, 10, 11]);
    expect(Array.from(parseColumn(formatColumn(xs)).values)).toEqual(Array.from(xs));
  });
});

describe("parseColumn explains bad input", () => {
  test("text in the column names its line", () => {
    const lines = [...ten];
    lines.splice(4, 0, "n/a");
    expect(problemOf(lines.join("\n"))).toMatch(/Line 5 holds "n\/a", which is not a number/);
  });

  test("a single value asks for at least the minimum count", () => {
    expect(problemOf("0.5")).toMatch(new RegExp(`Found 1 number; at least ${MIN_POINTS} are needed`));
  });

  test("empty input and a header alone", () => {
    expect(problemOf("  \n\n")).toMatch(/No data/);
    expect(problemOf("returns")).toMatch(/Only a header line/);
  });

  test("constant data has no spread to fit", () => {
    expect(problemOf(Array(12).fill("0.01").join("\n"))).toMatch(/All 12 numbers are equal/);
  });

  test("numbers glued to text are not numbers", () => {
    expect(problemOf([...ten.slice(0, 9), "1.2.3"].join("\n"))).toMatch(/Line 10/);
    expect(problemOf([...ten.slice(0, 9), "12abc"].join("\n"))).toMatch(/Line 10/);
  });
});

describe("parseColumn never truncates: decimal commas, thousands separators, quotes, outliers", () => {
  // Expected values are written by hand from the input text.
  const commaTen = ["0,01", "-0,02", "0,003", "0,004", "-0,005", "0,006", "0,007", "-0,008", "0,009", "1,25"];

  test("semicolon-separated lines read decimal commas (1,25 is 1.25, not 1)", () => {
    const r = parseColumn(["date;return", ...commaTen.map((x, i) => `2024-02-${String(i + 1).padStart(2, "0")};${x}`)].join("\n"));
    expect(Array.from(r.values)).toEqual(commaTen.map((x) => Number(x.replace(",", "."))));
    expect(r.label).toBe("return");
  });

  test("tab-separated lines with one comma per field read decimal commas", () => {
    const r = parseColumn(commaTen.map((x) => `a\t${x}`).join("\n"));
    expect(r.values[9]).toBe(1.25);
    expect(r.values[1]).toBe(-0.02);
  });

  test("a pasted column of decimal commas (comma-separated, no point anywhere) is refused naming the line and the fix", () => {
    const msg = problemOf(commaTen.join("\n"));
    expect(msg).toMatch(/Line 1 holds "0,01"/);
    expect(msg).toMatch(/semicolons or tabs/);
    expect(msg).toMatch(/point as the decimal mark/);
  });

  test("thousands separators: quoted 1,234.5 in a CSV, 1.234,5 and 1 234,5 with semicolons", () => {
    const csv = parseColumn(ten.map((x, i) => (i === 0 ? `d,"1,234.5"` : `d,${x}`)).join("\n"));
    expect(csv.values[0]).toBe(1234.5);
    const semi = parseColumn(ten.map((x, i) => (i === 0 ? "d;1.234,5" : i === 1 ? "d;1 234,5" : `d;${x}`)).join("\n"));
    expect(semi.values[0]).toBe(1234.5);
    expect(semi.values[1]).toBe(1234.5);
    expect(semi.values[2]).toBe(0.003);
  });

  test("quoted CSV fields may hold the delimiter and escaped quotes", () => {
    const r = parseColumn(['"note, with comma",ret', ...ten.map((x) => `"a ""b"", c",${x}`)].join("\n"));
    expect(r.column).toBe(2);
    expect(r.label).toBe("ret");
    expect(Array.from(r.values)).toEqual(ten.map(Number));
  });

  test("a header line, empty lines and a 1e10 outlier are kept as written", () => {
    const lines = ["ret", "", ...ten.slice(0, 5), "", "1e10", "  ", ...ten.slice(5)];
    const r = parseColumn(lines.join("\n"));
    expect(r.values.length).toBe(11);
    expect(r.values[5]).toBe(1e10);
    expect(r.label).toBe("ret");
  });
});
