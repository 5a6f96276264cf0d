/**
 * The bad-input corpus: one table of hostile argument values, each run against EVERY parameter of EVERY
 * function the built bundle declares (corpus.test.ts). Values are shaped as the host passes them: ranges as
 * 2-D arrays, blanks as null or "", error cells as HostError objects.
 *
 * Each entry says what it applies to (any parameter, range parameters, or the params triple) and what the
 * answer must be for each parameter role:
 *   "error"  — some cell of the result must be #VALUE!/#N/A with a message (a bad element may error only its cell);
 *   "same"   — the result must equal the baseline call's result (blanks are skipped, defaults apply);
 *   "any"    — a correct value or a messaged error; only the cell checker applies.
 * The checker (checker.ts) applies to all: finite numbers, text, booleans, or #VALUE!/#N/A with a message;
 * never a thrown exception, a NaN, an Infinity, null/undefined, or another error code.
 *
 * Baseline data are an invented, simulated scenario (seeded draws, not market data).
 */
import { xoroshiro128plus } from "pure-rand/generator/xoroshiro128plus";
import { uniformFloat64 } from "pure-rand/distribution/uniformFloat64";
import { HostError } from "../host/harness";

/** What a parameter means, read from its name in functions.json. */
export type Role =
  | "series" // a data column: data, returns, prices, var_
  | "points" // observations where any count ≥ 1 is valid (the log-likelihood of given params)
  | "elements" // element-wise input x (any finite number is valid)
  | "probElements" // element-wise probabilities: p, confidence when it is a range (a blank element gives "")
  | "params" // location, scale, shape
  | "probability" // a scalar strictly inside (0, 1)
  | "count" // a whole number with a lower bound: n
  | "window" // a window length: like count, and must be shorter than the data
  | "seed"
  | "choice" // keyword: side, method, kind
  | "number" // a plain scalar number: location, scale, shape of PARAMS
  | "other";

export type Expect = "error" | "same" | "any";

export interface CorpusCase {
  readonly name: string;
  /** Which parameters the case replaces. */
  readonly target: "any" | "range" | "params";
  /** The value put in place of the parameter (given the baseline value of that parameter). */
  readonly value: (baseline: unknown) => unknown;
  /** Expectation per role; missing roles mean "any". */
  readonly expect: Partial<Record<Role | "optional", Expect>>;
}

/** Seeded standard normal draws (Box–Muller on pure-rand uniforms): the invented scenario behind the baselines. */
export function simulatedReturns(n: number, seed: number, mean = 0.0004, sd = 0.011): number[] {
  const g = xoroshiro128plus(seed);
  const u = (): number => uniformFloat64(g);
  const out: number[] = [];
  while (out.length < n) {
    const a = 1 - u();
    const b = u();
    const r = Math.sqrt(-2 * Math.log(a));
    // A mild left skew from squaring part of the shock, so fits land away from shape 0.
    const z = r * Math.cos(2 * Math.PI * b);
    out.push(mean + sd * (z - 0.25 * (z * z - 1) * (z < 0 ? 1 : 0.4)));
  }
  return out;
}

const col = (xs: ReadonlyArray<unknown>): unknown[][] => xs.map((x) => [x]);
const asColumn = (v: unknown): unknown[][] => (Array.isArray(v) ? (v as unknown[][]).map((r) => [...r]) : [[v]]);
const withCell = (v: unknown, i: number, cell: unknown): unknown[][] => {
  const g = asColumn(v);
  const k = Math.min(i < 0 ? g.length + i : i, g.length - 1);
  g[k] = [cell];
  return g;
};
const insertBlank = (v: unknown, where: "first" | "middle" | "last" | "every", blank: null | ""): unknown[][] => {
  const g = asColumn(v);
  if (where === "first") return [[blank], ...g];
  if (where === "last") return [...g, [blank]];
  if (where === "middle") return [...g.slice(0, g.length >> 1), [blank], ...g.slice(g.length >> 1)];
  return g.flatMap((r) => [r, [blank]]);
};

/** Bad values for a single-value parameter: what each role must answer. */
const PROB_BAD: Partial<Record<Role, Expect>> = { probability: "error", elements: "error", count: "error", params: "error", series: "error", choice: "error" };
const NOT_A_NUMBER: Partial<Record<Role | "optional", Expect>> = {
  ...PROB_BAD,
  points: "error",
  number: "error",
  seed: "error",
  optional: "error",
};

const TABLE: readonly CorpusCase[] = [
  // ── text, booleans, error cells ────────────────────────────────────────────────────────────────
  { name: 'text "abc"', target: "any", value: () => "abc", expect: NOT_A_NUMBER },
  { name: 'number as text "0.99"', target: "any", value: () => "0.99", expect: NOT_A_NUMBER },
  { name: "whitespace text", target: "any", value: () => "   ", expect: { ...NOT_A_NUMBER, optional: "any" } },
  { name: "very long text (10,000 chars)", target: "any", value: () => "x".repeat(10_000), expect: NOT_A_NUMBER },
  { name: "TRUE", target: "any", value: () => true, expect: NOT_A_NUMBER },
  { name: "FALSE", target: "any", value: () => false, expect: NOT_A_NUMBER },
  { name: "error cell #DIV/0!", target: "any", value: () => new HostError("#DIV/0!"), expect: NOT_A_NUMBER },
  { name: "error cell #N/A", target: "any", value: () => new HostError("#N/A"), expect: NOT_A_NUMBER },
  { name: "error cell #VALUE! with message", target: "any", value: () => new HostError("#VALUE!", "upstream"), expect: NOT_A_NUMBER },
  // ── blanks ─────────────────────────────────────────────────────────────────────────────────────
  { name: "omitted (null)", target: "any", value: () => null, expect: { probability: "error", count: "error", params: "error", series: "error", points: "error", number: "error", optional: "same" } },
  { name: 'blank ""', target: "any", value: () => "", expect: { probability: "error", count: "error", params: "error", series: "error", points: "error", number: "error", optional: "same" } },
  { name: "blank as 1×1 range [[null]]", target: "range", value: () => [[null]], expect: { probability: "error", count: "error", params: "error", series: "error", points: "error", number: "error", optional: "same" } },
  // ── numeric extremes ───────────────────────────────────────────────────────────────────────────
  { name: "NaN", target: "any", value: () => NaN, expect: NOT_A_NUMBER },
  { name: "+Infinity", target: "any", value: () => Infinity, expect: NOT_A_NUMBER },
  { name: "-Infinity", target: "any", value: () => -Infinity, expect: NOT_A_NUMBER },
  { name: "1e308", target: "any", value: () => 1e308, expect: { probability: "error", count: "error", params: "error", series: "error", choice: "error" } },
  { name: "-1e308", target: "any", value: () => -1e308, expect: { probability: "error", count: "error", params: "error", series: "error", choice: "error" } },
  { name: "1e-300", target: "any", value: () => 1e-300, expect: { count: "error", params: "error", series: "error", choice: "error" } },
  { name: "smallest subnormal 5e-324", target: "any", value: () => Number.MIN_VALUE, expect: { count: "error", params: "error", series: "error", choice: "error" } },
  { name: "probability 0", target: "any", value: () => 0, expect: { probability: "error", count: "error", params: "error", series: "error", choice: "error" } },
  { name: "-0", target: "any", value: () => -0, expect: { probability: "error", count: "error", params: "error", series: "error", choice: "error" } },
  { name: "probability 1", target: "any", value: () => 1, expect: { probability: "error", params: "error", series: "error", choice: "error" } },
  { name: "probability -0.1", target: "any", value: () => -0.1, expect: { probability: "error", count: "error", params: "error", series: "error", choice: "error" } },
  { name: "probability 1.5", target: "any", value: () => 1.5, expect: { probability: "error", count: "error", params: "error", series: "error", choice: "error" } },
  { name: "whole number 1,000,000", target: "any", value: () => 1e6, expect: { window: "error", probability: "error", params: "error", series: "error", choice: "error" } },
  { name: "1e9 (beyond any row count)", target: "any", value: () => 1e9, expect: { probability: "error", count: "error", params: "error", series: "error", choice: "error" } },
  { name: "fraction 2.5 where a whole number is due", target: "any", value: () => 2.5, expect: { probability: "error", count: "error", params: "error", series: "error", choice: "error" } },
  { name: "2×2 range where one value is due", target: "any", value: () => [[0.9, 0.95], [0.97, 0.99]], expect: { probability: "error", count: "error", choice: "error", seed: "error", number: "error", params: "error" } },
  { name: "single value range [[0.01]]", target: "range", value: () => [[0.01]], expect: { series: "error" } },
  // ── data ranges ────────────────────────────────────────────────────────────────────────────────
  { name: "constant data", target: "range", value: (b) => asColumn(b).map(() => [0.01]), expect: {} },
  { name: "nine numbers (below the minimum of ten)", target: "range", value: (b) => asColumn(b).slice(0, 9), expect: {} },
  { name: "NaN inside the data", target: "range", value: (b) => withCell(b, 3, NaN), expect: { series: "error", points: "error", elements: "error", probability: "error" } },
  { name: "Infinity inside the data", target: "range", value: (b) => withCell(b, -2, Infinity), expect: { series: "error", points: "error", elements: "error", probability: "error" } },
  { name: "text inside the data", target: "range", value: (b) => withCell(b, 5, "n/a"), expect: { series: "error", points: "error", elements: "error", probability: "error" } },
  { name: 'numeric text "0.01" inside the data', target: "range", value: (b) => withCell(b, 2, "0.01"), expect: { series: "error", points: "error", elements: "error", probability: "error" } },
  { name: "TRUE inside the data", target: "range", value: (b) => withCell(b, 1, true), expect: { series: "error", points: "error", elements: "error", probability: "error" } },
  { name: "error cell #DIV/0! inside the data", target: "range", value: (b) => withCell(b, 4, new HostError("#DIV/0!")), expect: { series: "error", points: "error", elements: "error", probability: "error" } },
  { name: "blank (null) first", target: "range", value: (b) => insertBlank(b, "first", null), expect: {} },
  { name: 'blank ("") in the middle', target: "range", value: (b) => insertBlank(b, "middle", ""), expect: {} },
  { name: "blank (null) last", target: "range", value: (b) => insertBlank(b, "last", null), expect: {} },
  { name: 'a blank ("") after every number', target: "range", value: (b) => insertBlank(b, "every", ""), expect: {} },
  {
    name: "1,048,576-row range, mostly blank",
    target: "range",
    value: (b) => {
      const g = asColumn(b);
      const out: unknown[][] = new Array(1_048_576);
      for (let i = 0; i < out.length; i++) out[i] = i < g.length ? g[i] : [null];
      return out;
    },
    expect: {},
  },
  { name: "±1e308 inside the data", target: "range", value: (b) => withCell(withCell(b, 0, 1e308), 1, -1e308), expect: {} },
  { name: "data scaled to 1e-300", target: "range", value: (b) => asColumn(b).map((r) => [typeof r[0] === "number" ? r[0] * 1e-298 : r[0]]), expect: {} },
  { name: "data scaled to 1e300", target: "range", value: (b) => asColumn(b).map((r) => [typeof r[0] === "number" ? r[0] * 1e302 : r[0]]), expect: {} },
  { name: "one huge outlier (1e10)", target: "range", value: (b) => withCell(b, 7, 1e10), expect: {} },
  { name: "data as a row", target: "range", value: (b) => [asColumn(b).map((r) => r[0])], expect: {} },
  { name: "data in two columns", target: "range", value: (b) => asColumn(b).map((r, i) => [r[0], i % 2 ? r[0] : null]), expect: {} },
  { name: "negative numbers only (prices that are not prices)", target: "range", value: (b) => asColumn(b).map((r) => [typeof r[0] === "number" ? -Math.abs(r[0]) - 1e-4 : r[0]]), expect: {} },
  // ── params ─────────────────────────────────────────────────────────────────────────────────────
  { name: "shape +5", target: "params", value: () => col([0, 0.01, 5]), expect: {} },
  { name: "shape -5", target: "params", value: () => col([0, 0.01, -5]), expect: {} },
  { name: "scale 1e-300", target: "params", value: () => col([0, 1e-300, -0.1]), expect: {} },
  { name: "scale 1e308, shape 0.5", target: "params", value: () => col([0, 1e308, 0.5]), expect: {} },
  { name: "location 1e308", target: "params", value: () => col([1e308, 0.01, -0.1]), expect: {} },
  { name: "scale 0", target: "params", value: () => col([0, 0, 0.1]), expect: { params: "error" } },
  { name: "scale negative", target: "params", value: () => col([0, -0.01, 0.1]), expect: { params: "error" } },
  { name: "params with a blank", target: "params", value: () => col([0, null, 0.1]), expect: { params: "error" } },
  { name: 'params with text "0.01"', target: "params", value: () => col([0, "0.01", 0.1]), expect: { params: "error" } },
  { name: "params with an error cell", target: "params", value: () => col([0, 0.01, new HostError("#NUM!")]), expect: { params: "error" } },
  { name: "two params cells", target: "params", value: () => col([0, 0.01]), expect: { params: "error" } },
  { name: "four params cells", target: "params", value: () => col([0, 0.01, 0.1, 0]), expect: { params: "error" } },
  { name: "params as a row", target: "params", value: () => [[0.0004, 0.011, -0.1]], expect: {} },
  // upper edge at 0 + 0.001/0.9 ≈ 0.0011: most baseline returns lie outside the support.
  { name: "data outside the support (upper edge 0.0011)", target: "params", value: () => col([0, 0.001, 0.9]), expect: {} },
  // lower edge at 0.05 − 0.001/0.9: every baseline return lies below it.
  { name: "data outside the support (lower edge 0.049)", target: "params", value: () => col([0.05, 0.001, -0.9]), expect: {} },
];

/** Cases where an element-wise probability range may legitimately answer with values ("" for a blank element). */
const ELEMENTWISE_OK = /blank|omitted|2×2/;

/**
 * The corpus. A window length must fail wherever a count must (and also when longer than the data); an
 * element-wise probability must fail wherever a scalar probability must, except for blanks and ranges.
 */
export const CORPUS: readonly CorpusCase[] = TABLE.map((c) => {
  const e = { ...c.expect };
  if (e.count !== undefined && e.window === undefined) e.window = e.count;
  if (e.probability !== undefined && e.probElements === undefined && !ELEMENTWISE_OK.test(c.name)) e.probElements = e.probability;
  return { ...c, expect: e };
});
