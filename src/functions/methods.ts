/**
 * Cell functions for the reference VaR methods and forecast scores: historical simulation (plain or age-weighted),
 * Cornish–Fisher VaR with modified ES, tick/FZ0 scores of a VaR/ES column, and the Diebold–Mariano comparison of
 * two columns. Thin adapters: parse (cells.ts; series as in risk.ts: one column or row, blanks are gaps) →
 * src/core/methods, src/core/scores → shape (tables/scores.ts).
 *
 * Bounds: CFVAR, SCORE and DMTEST are single passes over at most a full column (1,048,576 rows). HISTVAR sorts the
 * returns and accepts at most MAX_HISTORY usable returns: measured in plain node, 50 ms for 100,000 returns with
 * equal weights and about 300 ms with age weights (a comparator sort); a full column would block for 1–3 s.
 */
import { sampleMoments } from "../core/fit/sampleStats";
import { cornishFisherTail, historicalTail } from "../core/methods";
import { RISK_SIDES, type RiskSide } from "../core/risk";
import { dieboldMariano, scoreForecasts } from "../core/scores";
import { CellError, fail, guardGrid, isBlank, labelTable, numberCell, readChoice, readProbability, toHostError, type Grid } from "./cells";
import { readSeries } from "./risk";
import { dieboldMarianoRows, scoreRows } from "./tables/scores";

/** Fewest usable returns (DEVELOPERS.md convention). */
const MIN_RETURNS = 10;
/** Most usable returns HISTVAR sorts (about 400 years of daily data). */
export const MAX_HISTORY = 100_000;

/** The usable numbers of a series (gaps dropped), with the count checked. */
function usableReturns(v: unknown, name: string): Float64Array {
  const all = readSeries(v, name).values.filter((x) => !Number.isNaN(x));
  if (all.length < MIN_RETURNS) fail(`${name} has ${all.length} usable number${all.length === 1 ? "" : "s"}; at least ${MIN_RETURNS} are needed.`);
  return all;
}

function naCell(message: string): CustomFunctions.Error {
  return toHostError(new CellError("na", message));
}

function readSide(v: unknown): RiskSide {
  return readChoice(v, "side", RISK_SIDES, "long");
}

/**
 * VaR and ES by historical simulation: the ⌈n(1 − c)⌉-th worst loss and the mean of the worst n(1 − c) losses (a fractional last one counts in part). Statistical estimates.
 * @customfunction HISTVAR
 * @param returns Daily returns in one column or row; blanks are skipped. From 10 to 100,000 numbers.
 * @param confidence Confidence level strictly between 0 and 1, e.g. 0.99.
 * @param [side] "long" (default: losses when returns fall) or "short".
 * @param [decay] Age-weight decay strictly between 0 and 1 (e.g. 0.98; the latest return weighs most); omit for equal weights.
 * @returns A 2×1 column: VaR, then ES, as positive losses.
 */
export function historicalVar(returns: any[][], confidence: any, side?: any, decay?: any): any[][] {
  return guardGrid(() => {
    const x = usableReturns(returns, "returns");
    if (x.length > MAX_HISTORY) fail(`returns has ${x.length} numbers; HISTVAR sorts them and accepts at most ${MAX_HISTORY.toLocaleString("en-US")}. Use the most recent ones.`);
    const c = readProbability(confidence, "confidence");
    const s = readSide(side);
    const lambda = isBlank(decay) ? 1 : readProbability(decay, "decay");
    const t = historicalTail(x, c, s, lambda);
    return [[numberCell(t.valueAtRisk, "The VaR is not finite.")], [numberCell(t.expectedShortfall, "The ES is not finite.")]];
  });
}

/**
 * Cornish–Fisher VaR and modified ES from the mean, standard deviation, skewness and excess kurtosis of the returns; #N/A with the reason outside the expansion's valid domain. Statistical estimates.
 * @customfunction CFVAR
 * @param returns Daily returns in one column or row; blanks are skipped. At least 10 numbers, not all equal.
 * @param confidence Confidence level strictly between 0 and 1, e.g. 0.99.
 * @param [side] "long" (default: losses when returns fall) or "short".
 * @returns A 2×1 column: VaR, then modified ES, as positive losses.
 */
export function cornishFisherVar(returns: any[][], confidence: any, side?: any): any[][] {
  return guardGrid(() => {
    const x = usableReturns(returns, "returns");
    const c = readProbability(confidence, "confidence");
    const s = readSide(side);
    const m = sampleMoments(x);
    if (!(m.sd > 0)) fail(`returns: all ${x.length} numbers are equal; skewness and kurtosis are undefined.`);
    const t = cornishFisherTail(m, c, s);
    if (t.problem !== null) {
      return [[naCell(`No Cornish–Fisher VaR: ${t.problem} (Maillard 2012). Use historical simulation or a fitted law.`)]];
    }
    const es = t.shortfallProblem === null ? numberCell(t.expectedShortfall, "The ES is not finite.") : naCell(`No modified ES: ${t.shortfallProblem}.`);
    return [[numberCell(t.valueAtRisk, "The VaR is not finite.")], [es]];
  });
}

interface Columns {
  readonly values: Float64Array[];
  readonly length: number;
}

/** Reads paired series of one length (the row order lines them up); blanks stay gaps. */
function readColumns(args: ReadonlyArray<readonly [unknown, string]>): Columns {
  const values = args.map(([v, name]) => readSeries(v, name).values);
  const n = values[0].length;
  args.forEach(([, name], i) => {
    if (values[i].length !== n) fail(`${args[0][1]} (${n} cells) and ${name} (${values[i].length} cells) must be the same length.`);
  });
  return { values, length: n };
}

function requirePositiveEs(es: Float64Array, others: Float64Array[], name: string): void {
  for (let i = 0; i < es.length; i++) {
    if (others.some((o) => Number.isNaN(o[i])) || Number.isNaN(es[i])) continue;
    if (!(es[i] > 0)) fail(`${name}: the ES at row ${i + 1} is ${es[i]}; the FZ0 score needs ES > 0 (a loss).`);
  }
}

/**
 * Scores of a VaR and ES forecast column against realised returns: mean tick loss of the VaR and mean FZ0 loss of the pair (lower is better; compare columns on the same rows).
 * @customfunction SCORE
 * @param returns Realised returns in one column; rows where returns, VaR or ES is blank are skipped.
 * @param VaR VaR forecasts for the same rows, as positive losses.
 * @param ES ES forecasts for the same rows, as positive losses (greater than 0).
 * @param confidence The confidence level of the forecasts, strictly between 0 and 1, e.g. 0.975.
 * @param [side] "long" (default) or "short".
 * @returns A 3×2 table (label, value): observations scored, mean tick loss, mean FZ0 loss.
 */
export function score(returns: any[][], VaR: any[][], ES: any[][], confidence: any, side?: any): any[][] {
  return guardGrid(() => {
    const cols = readColumns([
      [returns, "returns"],
      [VaR, "VaR"],
      [ES, "ES"],
    ]);
    const c = readProbability(confidence, "confidence");
    const s = readSide(side);
    const [r, v, e] = cols.values;
    requirePositiveEs(e, [r, v], "ES");
    const out = scoreForecasts(r, v, e, c, s);
    if (out.observations === 0) fail("No row has a return, a VaR and an ES: nothing to score.");
    return labelTable(scoreRows(out));
  });
}

/**
 * Diebold–Mariano test of equal mean loss between forecast columns A and B (FZ0 loss of VaR and ES, and tick loss of VaR), Newey–West variance; which has the lower loss at 5%.
 * @customfunction DMTEST
 * @param returns Realised returns in one column; rows where any of the five columns is blank are skipped.
 * @param VaR_a VaR forecasts of method A, positive losses.
 * @param ES_a ES forecasts of method A, positive losses.
 * @param VaR_b VaR forecasts of method B, positive losses.
 * @param ES_b ES forecasts of method B, positive losses.
 * @param confidence The confidence level of both methods' forecasts, strictly between 0 and 1.
 * @param [side] "long" (default) or "short".
 * @returns A 14×2 table (label, value): observations, lag, mean losses, DM statistics, p-values and verdicts.
 */
export function dieboldMarianoTest(returns: any[][], VaR_a: any[][], ES_a: any[][], VaR_b: any[][], ES_b: any[][], confidence: any, side?: any): any[][] {
  return guardGrid((): Grid => {
    const cols = readColumns([
      [returns, "returns"],
      [VaR_a, "VaR_a"],
      [ES_a, "ES_a"],
      [VaR_b, "VaR_b"],
      [ES_b, "ES_b"],
    ]);
    const c = readProbability(confidence, "confidence");
    const s = readSide(side);
    const [r, va, ea, vb, eb] = cols.values;
    // Rows with a gap in any column are dropped from both methods alike.
    const keep = (i: number) => [r, va, ea, vb, eb].every((col) => !Number.isNaN(col[i]));
    const rows: number[] = [];
    for (let i = 0; i < cols.length; i++) if (keep(i)) rows.push(i);
    if (rows.length < MIN_RETURNS) fail(`Only ${rows.length} rows have all five values; the comparison needs at least ${MIN_RETURNS}.`);
    const pick = (col: Float64Array) => Float64Array.from(rows, (i) => col[i]);
    const R = pick(r);
    const A = scoreForecasts(R, pick(va), pick(ea), c, s);
    const B = scoreForecasts(R, pick(vb), pick(eb), c, s);
    if (A.firstNonPositiveEs >= 0) fail(`ES_a: the ES at row ${rows[A.firstNonPositiveEs] + 1} is not greater than 0; the FZ0 score needs ES > 0.`);
    if (B.firstNonPositiveEs >= 0) fail(`ES_b: the ES at row ${rows[B.firstNonPositiveEs] + 1} is not greater than 0; the FZ0 score needs ES > 0.`);
    return labelTable(dieboldMarianoRows(dieboldMariano(A.fz0, B.fz0), dieboldMariano(A.tick, B.tick)));
  });
}
