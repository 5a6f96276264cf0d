/**
 * Runs the BUILT ASKEW functions inside a real spreadsheet calculation engine (HyperFormula 3, used here under
 * its GPL v3 licence key, in tests only).
 *
 * The adapter is driven by dist/functions.json: every declared function is registered as ASKEW.<ID> in one
 * FunctionPlugin. Each call evaluates its arguments in the engine and hands them over the way the host does —
 * a matrix parameter gets a 2-D array (a single value becomes [[v]]), a scalar parameter gets the value (a range
 * stays a 2-D array so the function can complain about it), an omitted argument and an empty cell are null, an
 * error cell is a HostError with its code. The call itself goes through test/host/harness.ts (the bundle in a
 * bare vm context). A host error result becomes an engine CellError carrying the message.
 *
 * Spilled results need their size before evaluation (the engine plans spill ranges when it parses a formula),
 * so every id has a size rule computed from the argument sizes (SIZE_RULES). Ids without a rule are reported by
 * `missingSizeRules()` and the adapter refuses them; a result whose real size differs from the planned one is
 * recorded in `sizeMismatches` (tests assert it stays empty) and turned into an error, never silently cut.
 *
 * Asynchronous (cancelable) functions: the engine computes synchronously, so, as the host shows #BUSY! while an
 * async function runs, a call that returns a Promise shows #N/A "busy" and is recorded as pending with its cell;
 * `settle(hf)` awaits every pending call, keeps each result by (id, arguments), and re-enters those cells'
 * formulas so the engine picks the settled result up (repeating until nothing is pending).
 */
import {
  ArraySize,
  CellError,
  EmptyValue,
  ErrorType,
  FunctionArgumentType,
  FunctionPlugin,
  HyperFormula,
  SimpleRangeValue,
} from "hyperformula";
import type { ImplementedFunctions } from "hyperformula";
import { Bundle, HostError, loadBundle } from "../host/harness";

/** How big a function's spilled result is, from its arguments' sizes. */
export type SizeRule =
  | { readonly kind: "scalar" }
  | { readonly kind: "fixed"; readonly rows: number; readonly cols: number }
  | { readonly kind: "likeArg"; readonly arg: number }
  /** A series result following a column (or row) argument, `shorter` cells shorter. */
  | { readonly kind: "series"; readonly arg: number; readonly shorter: number }
  /** n×1 where n is a literal number argument. */
  | { readonly kind: "countArg"; readonly arg: number };

/** The size rules, one per id, written from each function's documented result (its @returns help). */
export const SIZE_RULES: Readonly<Record<string, SizeRule>> = {
  PARAMS: { kind: "fixed", rows: 3, cols: 1 },
  PDF: { kind: "likeArg", arg: 0 },
  CDF: { kind: "likeArg", arg: 0 },
  QUANTILE: { kind: "likeArg", arg: 0 },
  MOMENTS: { kind: "fixed", rows: 4, cols: 1 },
  LMOMENTS: { kind: "fixed", rows: 4, cols: 1 },
  BOUND: { kind: "scalar" },
  RANDOM: { kind: "countArg", arg: 1 },
  VAR: { kind: "likeArg", arg: 0 },
  SHORTFALL: { kind: "likeArg", arg: 0 },
  VARCI: { kind: "fixed", rows: 3, cols: 1 },
  ROLLVAR: { kind: "series", arg: 0, shorter: 0 },
  ROLLES: { kind: "series", arg: 0, shorter: 0 },
  ROLLPIT: { kind: "series", arg: 0, shorter: 0 },
  VOLFIT: { kind: "fixed", rows: 41, cols: 2 },
  VOLATILITY: { kind: "series", arg: 0, shorter: 0 },
  NEXTDAY: { kind: "fixed", rows: 3, cols: 1 }, // 9×1 with innovations "gno-gpd": not expressible here (a real host spills either)
  TAILFIT: { kind: "fixed", rows: 9, cols: 1 },
  TAILREPORT: { kind: "fixed", rows: 37, cols: 2 },
  BACKTEST: { kind: "fixed", rows: 20, cols: 2 },
  HORIZON: { kind: "fixed", rows: 17, cols: 2 },
  LIQES: { kind: "fixed", rows: 1, cols: 1 },
  RETURNS: { kind: "series", arg: 0, shorter: 1 },
  FIT: { kind: "fixed", rows: 3, cols: 1 },
  FITREPORT: { kind: "fixed", rows: 32, cols: 2 },
  LOGLIK: { kind: "scalar" },
  GOF: { kind: "fixed", rows: 7, cols: 2 },
  COMPARE: { kind: "fixed", rows: 6, cols: 7 },
  ESBACKTEST: { kind: "fixed", rows: 21, cols: 2 },
  DESKTEST: { kind: "fixed", rows: 13, cols: 2 },
  PLATEST: { kind: "fixed", rows: 7, cols: 2 },
  HISTVAR: { kind: "fixed", rows: 2, cols: 1 },
  CFVAR: { kind: "fixed", rows: 2, cols: 1 },
  SCORE: { kind: "fixed", rows: 3, cols: 2 },
  DMTEST: { kind: "fixed", rows: 14, cols: 2 },
};

/** Extra rules for functions whose table size is only known once their file lands (filled in by tests). */
const extraRules = new Map<string, SizeRule>();
export function addSizeRule(id: string, rule: SizeRule): void {
  extraRules.set(id.toUpperCase(), rule);
}
export function sizeRuleOf(id: string, bundle: Bundle): SizeRule | undefined {
  const key = id.toUpperCase();
  const meta = bundle.metadata.functions.find((f) => f.id.toUpperCase() === key);
  if (meta && meta.result.dimensionality !== "matrix") return { kind: "scalar" };
  return extraRules.get(key) ?? SIZE_RULES[key];
}

/*
 * The engine's AST, state and value types are internal (not in its package exports); these are the parts the
 * adapter touches, typed from the engine's own signatures.
 */
interface EngineAst {
  readonly type: string;
  readonly value?: unknown;
}
interface ProcedureAst {
  readonly args: readonly EngineAst[];
}
type InterpreterState = unknown;
type InternalScalarValue = number | string | boolean | CellError | typeof EmptyValue | { readonly val: number };
type InterpreterValue = InternalScalarValue | SimpleRangeValue;

function getRawValue(v: InternalScalarValue): number | string | boolean | CellError | typeof EmptyValue {
  return typeof v === "object" && v !== null && !(v instanceof CellError) ? v.val : v;
}

/** Host error code ↔ engine error type. */
const TO_ENGINE: Record<string, ErrorType> = {
  "#VALUE!": ErrorType.VALUE,
  "#N/A": ErrorType.NA,
  "#DIV/0!": ErrorType.DIV_BY_ZERO,
  "#NUM!": ErrorType.NUM,
  "#REF!": ErrorType.REF,
  "#NAME?": ErrorType.NAME,
};
const TO_HOST: Record<string, string> = {
  VALUE: "#VALUE!",
  NA: "#N/A",
  DIV_BY_ZERO: "#DIV/0!",
  NUM: "#NUM!",
  REF: "#REF!",
  NAME: "#NAME?",
  CYCLE: "#CYCLE!",
  SPILL: "#SPILL!",
  ERROR: "#ERROR!",
  LIC: "#LIC!",
};

export interface SizeMismatch {
  readonly id: string;
  readonly planned: readonly [number, number];
  readonly got: readonly [number, number];
}

export interface AskewEngine {
  readonly bundle: Bundle;
  /** Every ASKEW call the engine made (id), in order; lets a test see what recalculated. */
  readonly calls: string[];
  readonly sizeMismatches: SizeMismatch[];
  /** A fresh HyperFormula workbook with the ASKEW functions available. */
  build(sheet: unknown[][]): HyperFormula;
  /** Awaits asynchronous calls and recomputes their cells until none is pending (see the header). */
  settle(hf: HyperFormula): Promise<void>;
}

interface CellAddress {
  readonly sheet: number;
  readonly col: number;
  readonly row: number;
}

function toHostScalar(v: InternalScalarValue): unknown {
  if (v === EmptyValue) return null;
  if (v instanceof CellError) return new HostError(TO_HOST[v.type] ?? "#VALUE!", v.message);
  return getRawValue(v);
}

function toHostGrid(v: InterpreterValue): unknown[][] {
  if (v instanceof SimpleRangeValue) return v.data.map((row) => row.map(toHostScalar));
  return [[toHostScalar(v)]];
}

function toHostValue(v: InterpreterValue): unknown {
  return v instanceof SimpleRangeValue ? toHostGrid(v) : toHostScalar(v);
}

function toEngineCell(v: unknown): InternalScalarValue {
  if (v instanceof HostError) return new CellError(TO_ENGINE[v.code] ?? ErrorType.ERROR, v.message);
  if (typeof v === "number" || typeof v === "string" || typeof v === "boolean") return v;
  if (v === null || v === undefined) return EmptyValue;
  return new CellError(ErrorType.VALUE, `the bundle returned a ${typeof v} the engine cannot hold`);
}

let registered: Promise<AskewEngine> | null = null;

/** Loads the built bundle and registers every function it declares with HyperFormula (once per test file). */
export function askewEngine(): Promise<AskewEngine> {
  if (!registered) registered = register();
  return registered;
}

async function register(): Promise<AskewEngine> {
  const bundle = await loadBundle();
  const calls: string[] = [];
  const sizeMismatches: SizeMismatch[] = [];
  const implemented: ImplementedFunctions = {};
  const translations: Record<string, string> = {};
  const methods: Record<string, (ast: ProcedureAst, state: InterpreterState) => unknown> = {};
  const settled = new Map<string, unknown>();
  const pending: { key: string; cell: CellAddress; promise: Promise<unknown> }[] = [];

  for (const f of bundle.metadata.functions) {
    const id = f.id.toUpperCase();
    const name = `ASKEW.${id}`;
    const matrixParams = f.parameters.map((p) => p.dimensionality === "matrix");
    const rule = sizeRuleOf(id, bundle);
    const method = `call_${id}`;
    const sizeMethod = `size_${id}`;
    implemented[name] = {
      method,
      ...(rule && rule.kind !== "scalar" ? { sizeOfResultArrayMethod: sizeMethod } : {}),
      parameters: f.parameters.map((p) => ({ argumentType: FunctionArgumentType.ANY, optionalArg: p.optional === true })),
      vectorizationForbidden: true,
    };
    translations[name] = name;

    methods[method] = function (this: AskewPlugin, ast: ProcedureAst, state: InterpreterState): InterpreterValue {
      if (!rule) return new CellError(ErrorType.VALUE, `the workbook adapter has no size rule for ${id}`);
      if (ast.args.length > f.parameters.length) return new CellError(ErrorType.NA, `${name} takes at most ${f.parameters.length} arguments`);
      const args = f.parameters.map((_, i) => {
        const a = ast.args[i];
        if (a === undefined || a.type === "EMPTY") return null;
        const v = this.evaluate(a, state);
        if (matrixParams[i]) return toHostGrid(v);
        return toHostValue(v);
      });
      calls.push(id);
      const key = `${id} ${JSON.stringify(args)}`;
      let out: unknown;
      if (settled.has(key)) {
        out = settled.get(key);
        settled.delete(key);
      } else out = bundle.call(id, ...args);
      if (out instanceof Promise || (typeof out === "object" && out !== null && typeof (out as { then?: unknown }).then === "function")) {
        const cell = (state as { formulaAddress: CellAddress }).formulaAddress;
        pending.push({ key, cell: { sheet: cell.sheet, col: cell.col, row: cell.row }, promise: Promise.resolve(out) });
        const busy = new CellError(ErrorType.NA, `${name} is busy (asynchronous): call settle()`);
        if (!rule || rule.kind === "scalar") return busy;
        // a spilling formula must fill its planned range, even while busy (the host fills it with #BUSY!)
        const planned = this.sizeOf(rule, ast, state);
        return SimpleRangeValue.onlyValues(Array.from({ length: planned.height }, () => Array.from({ length: planned.width }, () => busy)) as never);
      }
      const err = bundle.errorOf(out);
      if (err) return new CellError(TO_ENGINE[err.code] ?? ErrorType.ERROR, err.message);
      if (rule.kind === "scalar") {
        if (Array.isArray(out)) return new CellError(ErrorType.VALUE, `${id} returned a range where one value was expected`);
        return toEngineCell(out);
      }
      const grid = (Array.isArray(out) ? out : [[out]]) as unknown[][];
      const planned = this.sizeOf(rule, ast, state);
      const got: [number, number] = [grid.length, grid.length ? grid[0].length : 0];
      if (planned.height !== got[0] || planned.width !== got[1]) {
        sizeMismatches.push({ id, planned: [planned.height, planned.width], got });
        return new CellError(ErrorType.VALUE, `${id}: planned ${planned.height}×${planned.width}, got ${got[0]}×${got[1]}`);
      }
      return SimpleRangeValue.onlyValues(grid.map((row) => row.map(toEngineCell)) as never);
    };
    methods[sizeMethod] = function (this: AskewPlugin, ast: ProcedureAst, state: InterpreterState): ArraySize {
      return rule ? this.sizeOf(rule, ast, state) : ArraySize.error();
    };
  }

  class AskewPlugin extends FunctionPlugin {
    static implementedFunctions = implemented;
    evaluate(ast: EngineAst, state: InterpreterState): InterpreterValue {
      return this.evaluateAst(ast as never, state as never) as InterpreterValue;
    }
    sizeOf(rule: SizeRule, ast: ProcedureAst, state: InterpreterState): ArraySize {
      const argSize = (i: number): ArraySize | null => {
        const a = ast.args[i];
        if (a === undefined || a.type === "EMPTY") return null;
        return this.arraySizeForAst(a as never, state as never);
      };
      switch (rule.kind) {
        case "scalar":
          return ArraySize.scalar();
        case "fixed":
          return new ArraySize(rule.cols, rule.rows);
        case "likeArg": {
          const s = argSize(rule.arg);
          return s ? new ArraySize(s.width, s.height) : ArraySize.error();
        }
        case "series": {
          const s = argSize(rule.arg);
          if (!s) return ArraySize.error();
          if (s.width === 1) return new ArraySize(1, Math.max(1, s.height - rule.shorter));
          if (s.height === 1) return new ArraySize(Math.max(1, s.width - rule.shorter), 1);
          return new ArraySize(1, 1);
        }
        case "countArg": {
          const a = ast.args[rule.arg];
          if (a && a.type === "NUMBER" && typeof a.value === "number" && Number.isInteger(a.value) && a.value >= 1) {
            return new ArraySize(1, a.value);
          }
          return new ArraySize(1, 1);
        }
      }
    }
  }
  Object.assign(AskewPlugin.prototype, methods);

  HyperFormula.registerFunctionPlugin(AskewPlugin, { enGB: translations, enUS: translations });

  return {
    bundle,
    calls,
    sizeMismatches,
    build(sheet: unknown[][]) {
      return HyperFormula.buildFromArray(sheet as never, { licenseKey: "gpl-v3", maxRows: 1_048_576, smartRounding: false });
    },
    async settle(hf: HyperFormula) {
      for (let round = 0; pending.length > 0; round++) {
        if (round > 20) throw new Error("asynchronous calls keep coming back busy");
        const batch = pending.splice(0, pending.length);
        for (const p of batch) settled.set(p.key, await p.promise);
        for (const p of batch) {
          const formula = hf.getCellFormula(p.cell);
          if (formula !== undefined) hf.setCellContents(p.cell, [[formula]]);
        }
      }
    },
  };
}

/** The ids the bundle declares that have no size rule (the adapter cannot plan their spill). */
export function missingSizeRules(bundle: Bundle): string[] {
  return bundle.metadata.functions.map((f) => f.id.toUpperCase()).filter((id) => !sizeRuleOf(id, bundle));
}
