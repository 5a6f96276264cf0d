/**
 * Rolling out-of-sample cell functions: ROLLVAR, ROLLES, ROLLPIT. Each row t's forecast law comes from a model
 * (src/core/risk/rolling/registry.ts: "iid", "ewma", "garch", and any model registered later) fitted to the
 * `window` usable returns before row t. Asynchronous and cancelable: the core run is a Work driven in time slices
 * (async.ts). Bounds, checked before any work: at most MAX_ROLLING_ROWS rows and at most MAX_ROLLING_CELLS
 * window-observations ((rows − window) × window), one window fit per forecast row.
 *
 * Rows: "" before a full window and for blank returns only; a number where the model forecasts; #VALUE! with the
 * reason where the model cannot forecast (e.g. all-equal returns in the window); #N/A with the reason where the
 * forecast law has no value for the asked measure (e.g. a modified ES outside its domain); #N/A with the caveat where the model
 * forecasts with a caveat it must not hide (e.g. maximum likelihood without a regular maximum in that window, whose
 * L-moment fallback is only shown with method "auto" or "lmom").
 */
import type { ForecastLaw } from "../core/forecast/law";
import { cachedRolling, createModel, modelNames, RISK_SIDES, rollingCacheKey, rollingForecasts, sameContent, storeRolling, type RiskSide, type RollingForecasts } from "../core/risk";
import type { Work } from "../core/work";
import { Canceled, runWork, guardGridAsync } from "./async";
import { CellError, fail, isBlank, numberCell, readChoice, readDecay, readInteger, readProbability, toHostError, type CellValue, type Grid } from "./cells";
import { readSeries } from "./risk";

/** Most rows the rolling functions accept. */
export const MAX_ROLLING_ROWS = 20_000;
/** Most window-observations ((rows − window) × window) one call may fit. */
export const MAX_ROLLING_CELLS = 5_000_000;
/** Fewest observations a window may hold (DEVELOPERS.md: fewer than 10 usable numbers is an error). */
const MIN_WINDOW = 10;

interface RollingCall {
  readonly values: Float64Array;
  readonly isRow: boolean;
  readonly confidence: number;
  readonly side: RiskSide;
  readonly run: RollingForecasts;
}

async function rollingCall(
  name: string,
  returns: unknown,
  window: unknown,
  confidence: unknown,
  side: unknown,
  method: unknown,
  model: unknown,
  decay: unknown,
  invocation: CustomFunctions.CancelableInvocation | undefined,
): Promise<RollingCall> {
  const r = readSeries(returns, "returns");
  const n = r.values.length;
  if (n > MAX_ROLLING_ROWS) fail(`returns has ${n} rows; ${name} fits one window per row and accepts at most ${MAX_ROLLING_ROWS} rows.`);
  if (n <= MIN_WINDOW) fail(`returns has ${n} rows; ${name} needs more than ${MIN_WINDOW} (a window of at least ${MIN_WINDOW} plus rows to forecast).`);
  const w = readInteger(window, "window", MIN_WINDOW, n - 1);
  const c = readProbability(confidence, "confidence");
  const s = readChoice(side, "side", RISK_SIDES, "long");
  const names = modelNames();
  const m = readChoice(model, "model", names, names[0]);
  const meth = isBlank(method) ? undefined : typeof method === "string" ? method.trim().toLowerCase() : fail("method must be text, e.g. \"mle\".");
  const lambda = readDecay(decay);
  if (lambda !== undefined && !readsDecay(m, meth)) {
    fail(`decay applies to models "ewma", "hs" and "fhs" with method "ewma" only (model is "${m}"${meth ? `, method "${meth}"` : ""}); leave it blank.`);
  }
  let usable = 0;
  for (const x of r.values) if (Number.isFinite(x)) usable++;
  if (usable <= w) {
    fail(`No row has a full window: returns holds ${usable} numbers (blanks skipped) and window ${w} needs at least ${w + 1} (the window plus one row to forecast). Use a shorter window or more data.`);
  }
  const cellsOfWork = (usable - w) * w;
  if (cellsOfWork > MAX_ROLLING_CELLS) {
    fail(`(rows − window) × window = ${cellsOfWork} is above ${name}'s bound of ${MAX_ROLLING_CELLS.toLocaleString("en-US")} window-observations; use fewer rows or a shorter window.`);
  }
  const options = { method: meth, lambda };
  let forecastModel: ReturnType<typeof createModel>;
  try {
    forecastModel = createModel(m, options);
  } catch (e) {
    fail(e instanceof Error ? e.message + "." : String(e));
  }
  const key = rollingCacheKey(r.values, w, m, options);
  const run = await sharedRun(key, r.values, () => rollingForecasts(r.values, w, forecastModel), invocation);
  return { values: r.values, isRow: r.isRow, confidence: c, side: s, run };
}

/** Runs in progress, by cache key: a second cell over the same column and arguments waits for the first one's run. */
const inFlight = new Map<string, { readonly values: Float64Array; readonly run: Promise<RollingForecasts> }>();

/**
 * The run for these returns and arguments: from the content cache (core/risk/rolling/cache.ts), or shared with a
 * cell already computing it (ROLLVAR, ROLLES and ROLLPIT recalculate together), or computed here and stored. When
 * the run a cell waits on is canceled (its own cell was edited), the waiting cell computes the run itself.
 */
async function sharedRun(
  key: string,
  values: Float64Array,
  work: () => Work<RollingForecasts>,
  invocation: CustomFunctions.CancelableInvocation | undefined,
): Promise<RollingForecasts> {
  const done = cachedRolling(key, values);
  if (done) return done;
  const pending = inFlight.get(key);
  if (pending && sameContent(pending.values, values)) {
    try {
      return await pending.run;
    } catch (e) {
      if (!(e instanceof Canceled)) throw e;
      // the first waiter to resume starts the run again; the others wait on that one
      return sharedRun(key, values, work, invocation);
    }
  }
  const copy = Float64Array.from(values);
  const run = runWork(work(), invocation);
  const entry = { values: copy, run };
  inFlight.set(key, entry);
  try {
    const out = await run;
    storeRolling(key, copy, out);
    return out;
  } finally {
    if (inFlight.get(key) === entry) inFlight.delete(key);
  }
}

/** Models that read the decay argument: the EWMA λ ("ewma", "fhs" filtered by EWMA) or the age weight ("hs"). */
function readsDecay(model: string, method: string | undefined): boolean {
  return model === "ewma" || model === "hs" || (model === "fhs" && (method ?? "ewma") === "ewma");
}

/**
 * One cell per input row: "" without a law (warm-up and blank rows), the note as an error where there is one, the
 * value where the law gives one, else #N/A with the law's reason (e.g. a modified ES outside its domain).
 */
function shapeRows(call: RollingCall, measure: "var" | "es" | "pit", value: (law: ForecastLaw, row: number) => number, whatIfNotFinite: string): Grid {
  const cells: CellValue[] = [];
  const { run, values } = call;
  for (let i = 0; i < values.length; i++) {
    const law = run.laws[i];
    const note = run.notes[i];
    if (note !== undefined) cells.push(toHostError(new CellError(law ? "na" : "value", note)));
    else if (!law) cells.push("");
    else {
      const x = value(law, i);
      if (Number.isNaN(x)) {
        const why = law.whyNot?.(measure, call.confidence, call.side) ?? `The ${measure === "var" ? "VaR" : measure === "es" ? "expected shortfall" : "PIT"} does not exist for this row's forecast law.`;
        cells.push(toHostError(new CellError("na", why)));
      } else cells.push(numberCell(x, whatIfNotFinite));
    }
  }
  return call.isRow ? [cells] : cells.map((c) => [c]);
}

/**
 * Rolling out-of-sample VaR: row t's forecast comes from the model fitted to the window of returns before row t.
 * Runs in the background; at most 20,000 rows and (rows − window) × window ≤ 5,000,000.
 * @customfunction ROLLVAR
 * @param returns Daily returns in one column (up to 20,000 rows); blank rows are left out of every window and get "".
 * @param window How many earlier returns each fit uses: a whole number, at least 10 and fewer than the rows.
 * @param confidence VaR confidence level strictly between 0 and 1, e.g. 0.99.
 * @param [side] "long" (default) or "short".
 * @param [method] iid: "mle" (default; #N/A where ML is irregular), "auto" (L-moments there) or "lmom"; ewma/garch: "mle" (skewed innovations), "normal" or "gno-gpd" (Pareto tails); fhs: "ewma" or "garch".
 * @param [model] "iid" (default: the law fitted to the window), "ewma" (λ = decay), "garch" (window ≥ 100), or a reference method: "hs", "normal", "cf" (Cornish–Fisher), "fhs" (filtered HS; method "ewma" or "garch").
 * @param [decay] λ strictly between 0 and 1: the EWMA decay for "ewma" and "fhs" with "ewma" (default 0.94), the age-weight decay for "hs" (default: equal weights); other models refuse it.
 * @returns A column as long as returns: "" until a full window of earlier returns exists, then the forecast VaR.
 */
export async function rollingVarCell(
  returns: any[][],
  window: any,
  confidence: any,
  side: any,
  method: any,
  model: any,
  decay: any,
  invocation: CustomFunctions.CancelableInvocation,
): Promise<any[][]> {
  return guardGridAsync(async () => {
    const call = await rollingCall("ROLLVAR", returns, window, confidence, side, method, model, decay, invocation);
    return shapeRows(call, "var", (law) => law.valueAtRisk(call.confidence, call.side), "The VaR forecast overflows for this window.");
  });
}

/**
 * Rolling out-of-sample expected shortfall, row by row like ROLLVAR (same arguments and bounds).
 * @customfunction ROLLES
 * @param returns Daily returns in one column (up to 20,000 rows); blank rows are left out of every window and get "".
 * @param window How many earlier returns each fit uses: a whole number, at least 10 and fewer than the rows.
 * @param confidence ES confidence level strictly between 0 and 1, e.g. 0.975.
 * @param [side] "long" (default) or "short".
 * @param [method] As for ROLLVAR: "mle", "auto", "lmom" (iid); "mle", "normal", "gno-gpd" (ewma, garch); "ewma", "garch" (fhs).
 * @param [model] As for ROLLVAR: "iid" (default), "ewma", "garch", "hs", "normal", "cf" or "fhs".
 * @param [decay] λ strictly between 0 and 1: the EWMA decay for "ewma" and "fhs" with "ewma" (default 0.94), the age-weight decay for "hs" (default: equal weights); other models refuse it.
 * @returns A column as long as returns: "" until a full window exists, then the forecast ES (#N/A with the reason where the model's law has none, e.g. "cf").
 */
export async function rollingEsCell(
  returns: any[][],
  window: any,
  confidence: any,
  side: any,
  method: any,
  model: any,
  decay: any,
  invocation: CustomFunctions.CancelableInvocation,
): Promise<any[][]> {
  return guardGridAsync(async () => {
    const call = await rollingCall("ROLLES", returns, window, confidence, side, method, model, decay, invocation);
    return shapeRows(call, "es", (law) => law.expectedShortfall(call.confidence, call.side), "The expected shortfall forecast is infinite or overflows for this window.");
  });
}

/**
 * Rolling probability integral transform: F(r) of each realised return under the law forecast the day before (input for ES backtests).
 * @customfunction ROLLPIT
 * @param returns Daily returns in one column (up to 20,000 rows); blank rows are left out of every window and get "".
 * @param window How many earlier returns each fit uses: a whole number, at least 10 and fewer than the rows.
 * @param confidence Not used by the transform; any level strictly between 0 and 1 (kept so the arguments match ROLLVAR).
 * @param [side] "long" (default) or "short": "short" gives 1 − F(r).
 * @param [method] As for ROLLVAR.
 * @param [model] As for ROLLVAR: "iid" (default), "ewma", "garch", "hs", "normal", "cf" or "fhs".
 * @param [decay] λ strictly between 0 and 1: the EWMA decay for "ewma" and "fhs" with "ewma" (default 0.94), the age-weight decay for "hs" (default: equal weights); other models refuse it.
 * @returns A column as long as returns: "" until a full window exists, then a value in [0, 1].
 */
export async function rollingPitCell(
  returns: any[][],
  window: any,
  confidence: any,
  side: any,
  method: any,
  model: any,
  decay: any,
  invocation: CustomFunctions.CancelableInvocation,
): Promise<any[][]> {
  return guardGridAsync(async () => {
    const call = await rollingCall("ROLLPIT", returns, window, confidence, side, method, model, decay, invocation);
    return shapeRows(call, "pit", (law, row) => {
      const u = law.cdf(call.values[row]);
      return call.side === "short" ? 1 - u : u;
    }, "The PIT is not a finite number.");
  });
}
