/**
 * The stepped text reader against the one-shot reader and against the reader as it was before (parseBefore.ts):
 * on random pasted text (fast-check, fixed seed so a failure replays) all three give the same numbers, label and
 * column, or the same message. Then the slice driver: it pauses, reports progress and stops on Cancel.
 */
import fc from "fast-check";
import { InputProblem, LINES_PER_STEP, parseColumn, parseColumnWork } from "../../src/taskpane/parse";
import { readColumnInSlices, ReadCancelled } from "../../src/taskpane/reading";
import { parseColumnBefore } from "./parseBefore";

type Outcome = { values: number[]; label: string; column: number } | { problem: string };

function outcome(read: () => { values: Float64Array; label: string; column: number }): Outcome {
  try {
    const r = read();
    return { values: Array.from(r.values), label: r.label, column: r.column };
  } catch (e) {
    if (e instanceof InputProblem) return { problem: e.message };
    throw e;
  }
}

/** Drives the stepped reader one step at a time, checking that every yield is a progress fraction. */
function stepwise(text: string, linesPerStep: number): { values: Float64Array; label: string; column: number } {
  const w = parseColumnWork(text, linesPerStep);
  for (;;) {
    const r = w.next();
    if (r.done) return r.value;
    if (!(r.value >= 0 && r.value <= 1)) throw new Error(`progress ${r.value} is not a fraction`);
  }
}

async function sliced(text: string, linesPerStep: number): Promise<Outcome> {
  try {
    const r = await readColumnInSlices(text, { isCancelled: () => false, sliceMs: 0, pause: () => Promise.resolve(), linesPerStep });
    return { values: Array.from(r.column.values), label: r.column.label, column: r.column.column };
  } catch (e) {
    if (e instanceof InputProblem) return { problem: e.message };
    throw e;
  }
}

// Cells an analyst's paste may hold: plain and signed numbers, exponents, percents, decimal commas, thousands
// groups (comma, point, space, no-break space, apostrophe), quoted fields with delimiters and escaped quotes,
// words, blanks and whitespace.
const token = fc.oneof(
  fc.double({ noNaN: true, noDefaultInfinity: true }).map(String),
  fc.integer({ min: -99999, max: 99999 }).map(String),
  fc.integer({ min: -99999, max: 99999 }).map((i) => `${Math.trunc(i / 100)},${String(Math.abs(i) % 100).padStart(2, "0")}`),
  fc.constantFrom(
    "0.01", "-0.02", "1,25", "-0,5", "1.234,5", "1,234.5", "1 234,5", "1\u00a0234.5", "1'234", "1.234.567", "1,234,567",
    "12%", " 3.5 % ", "1e10", "-2.5E-3", ".5", "5.", "+7", "1.2.3", "12abc", "n/a", "date", "ret", "", " ", "\u00a0",
    '"1,5"', '"1,234.5"', '"a ""b"", c"', '""', '" "', '"x', "0x10", "Infinity", "1e999",
  ),
);
const separator = fc.constantFrom(",", ";", "\t", ", ", " ; ");
const lineBreak = fc.constantFrom("\n", "\r\n", "\r", "\n\n", "\n \n");
const row = fc.tuple(fc.array(token, { minLength: 1, maxLength: 4 }), separator).map(([cells, sep]) => cells.join(sep));
const pasted = fc
  .tuple(fc.array(row, { minLength: 0, maxLength: 40 }), fc.array(lineBreak, { minLength: 40, maxLength: 40 }), fc.boolean())
  .map(([rows, breaks, trailing]) => rows.map((r, i) => r + (i < rows.length - 1 || trailing ? breaks[i] : "")).join(""));
// Mostly-clean columns, so that many cases get past the first line and read a whole column.
const column = fc
  .tuple(
    fc.option(fc.constantFrom("ret", "date;ret", "date,ret", "a\tb"), { nil: undefined }),
    fc.array(fc.tuple(fc.constantFrom("", "2024-01-02;", "d,", "x\t"), fc.double({ min: -1, max: 1, noNaN: true })), { minLength: 5, maxLength: 60 }),
    fc.constantFrom("\n", "\r\n"),
    fc.boolean(),
  )
  .map(([head, cells, br, commas]) => {
    const lines = cells.map(([pre, x]) => pre + (commas && pre !== "d," ? String(x).replace(".", ",") : String(x)));
    return (head ? [head, ...lines] : lines).join(br);
  });
// Random text over the reader's alphabet: anything goes.
const noise = fc
  .array(fc.constantFrom(..."0123456789.,;\t\"% -+eE\n\r\u00a0'ab".split("")), { maxLength: 120 })
  .map((cs) => cs.join(""));

describe("the stepped reader gives what the one-shot reader and the reader before it give", () => {
  test.each([
    ["pasted rows of mixed cells", pasted],
    ["clean columns, with or without header and decimal commas", column],
    ["random characters", noise],
  ])("%s (fast-check, seed 42)", (_name, input) => {
    fc.assert(
      fc.property(input, fc.integer({ min: 1, max: 6 }), (text, linesPerStep) => {
        const before = outcome(() => parseColumnBefore(text));
        expect(outcome(() => parseColumn(text))).toEqual(before);
        expect(outcome(() => stepwise(text, linesPerStep))).toEqual(before);
      }),
      { seed: 42, numRuns: 1500 },
    );
  });

  test("the slice driver gives the same outcome when it pauses after every step (fast-check, seed 42)", async () => {
    await fc.assert(
      fc.asyncProperty(fc.oneof(pasted, column), fc.integer({ min: 1, max: 4 }), async (text, linesPerStep) => {
        expect(await sliced(text, linesPerStep)).toEqual(outcome(() => parseColumn(text)));
      }),
      { seed: 42, numRuns: 300 },
    );
  });

  test("200,000 lines of simulated returns: the same numbers, read in about one step per LINES_PER_STEP lines", () => {
    // simulated data (a fixed sine sequence, not market data), with a header and Windows line breaks
    const lines = ["return"];
    for (let i = 0; i < 200_000; i++) lines.push(String(Math.sin(i * 1.7) * 0.03));
    const text = lines.join("\r\n");
    const w = parseColumnWork(text);
    let yields = 0;
    let r = w.next();
    for (; !r.done; r = w.next()) yields++;
    const before = parseColumnBefore(text);
    expect(r.value.label).toBe("return");
    expect(Array.from(r.value.values)).toEqual(Array.from(before.values));
    // one pass over the lines and one over the column: at least two steps per LINES_PER_STEP lines
    expect(yields).toBeGreaterThanOrEqual(2 * Math.floor(200_000 / LINES_PER_STEP));
  });
});

describe("readColumnInSlices pauses, reports progress and stops on Cancel", () => {
  const text = Array.from({ length: 50_000 }, (_, i) => String(((i * 7919) % 1000) / 1e4 - 0.05)).join("\n"); // invented values

  test("every pause is reported with a growing fraction, and the outcome is the one-shot reader's", async () => {
    const seen: number[] = [];
    const r = await readColumnInSlices(text, {
      isCancelled: () => false,
      sliceMs: 0,
      pause: () => Promise.resolve(),
      onProgress: (p) => {
        if (!p.done) seen.push(p.fraction);
      },
    });
    expect(r.slices).toBe(seen.length);
    expect(r.slices).toBe(r.yields); // a zero-length slice pauses after every step
    expect(r.slices).toBeGreaterThanOrEqual(2 * Math.floor(50_000 / LINES_PER_STEP));
    for (let i = 1; i < seen.length; i++) expect(seen[i]).toBeGreaterThanOrEqual(seen[i - 1]);
    expect(Array.from(r.column.values)).toEqual(Array.from(parseColumn(text).values));
  });

  test("Cancel during the reading stops it at the next pause", async () => {
    let pauses = 0;
    let lastProgress = -1;
    const reading = readColumnInSlices(text, {
      isCancelled: () => pauses >= 3,
      sliceMs: 0,
      pause: () => {
        pauses++;
        return Promise.resolve();
      },
      onProgress: (p) => (lastProgress = p.slices),
    });
    await expect(reading).rejects.toBeInstanceOf(ReadCancelled);
    expect(pauses).toBe(3);
    expect(lastProgress).toBe(3);
  });

  test("bad input rejects with the reader's message, not a cancellation", async () => {
    await expect(readColumnInSlices("0.1\n0.2\nabc", { isCancelled: () => false })).rejects.toThrow(/Line 3 holds "abc"/);
  });
});
