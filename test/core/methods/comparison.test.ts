/**
 * Method comparison: every model is backtested and scored on the same rows (those where all forecast), the order
 * is by mean FZ0 loss, and each figure equals the core function applied to the common rows directly. Simulated,
 * invented returns.
 */
import { backtestVar, createModel, rollingForecasts } from "../../../src/core/risk";
import { compareMethods } from "../../../src/core/risk/comparison/methodComparison";
import { dieboldMariano, scoreForecasts } from "../../../src/core/scores";
import { runToEnd } from "../../../src/core/work";
import { COMPARISON_HEADER, methodComparisonRows } from "../../../src/functions/tables/methodComparison";
import { normalDraws } from "../scores/draws";

const R = Array.from(normalDraws(400, 99, 0.01), (x, i) => (i % 20 === 0 ? 2 * x : x));
const W = 150;
const C = 0.975;
const MODELS = ["hs", "normal", "cf", "fhs"];

describe("compareMethods", () => {
  const progress: number[] = [];
  const out = runToEnd(compareMethods(R, W, C, "long", MODELS), (f) => progress.push(f));

  test("reports progress in [0, 1] and one entry per model", () => {
    expect(progress.length).toBeGreaterThan(MODELS.length);
    expect(progress.every((f) => f >= 0 && f <= 1)).toBe(true);
    expect(out.methods.map((m) => m.model).sort()).toEqual(MODELS.slice().sort());
  });

  test("common rows are those where every model forecasts; backtests and scores equal the core functions on them", () => {
    const runs = MODELS.map((m) => runToEnd(rollingForecasts(R, W, createModel(m))));
    const common = R.map((r, t) => (runs.every((run) => run.laws[t] && run.notes[t] === undefined) ? r : NaN));
    expect(out.commonRows).toBe(common.filter((x) => !Number.isNaN(x)).length);
    for (const m of out.methods) {
      const run = runs[MODELS.indexOf(m.model)];
      const v = R.map((_, t) => (run.laws[t] ? run.laws[t]!.valueAtRisk(C, "long") : NaN));
      const e = R.map((_, t) => (run.laws[t] ? run.laws[t]!.expectedShortfall(C, "long") : NaN));
      const bt = backtestVar(common, v, C, "long")!;
      expect([m.model, m.backtest!.exceptions, m.backtest!.observations]).toEqual([m.model, bt.exceptions, bt.observations]);
      const s = scoreForecasts(common, v, e, C, "long");
      expect([m.model, m.meanFz0Loss]).toEqual([m.model, s.meanFz0Loss]);
    }
  });

  test("best first by mean FZ0 loss; the others carry their DM p-value against the best", () => {
    const losses = out.methods.map((m) => m.meanFz0Loss);
    expect(losses).toEqual(losses.slice().sort((a, b) => a - b));
    expect(out.methods[0].pValueAgainstBest).toBeNaN();
    for (const m of out.methods.slice(1)) expect(m.pValueAgainstBest >= 0 && m.pValueAgainstBest <= 1).toBe(true);
    // The second's p-value recomputed from scratch.
    const runs = [out.methods[0].model, out.methods[1].model].map((m) => runToEnd(rollingForecasts(R, W, createModel(m))));
    const all = MODELS.map((m) => runToEnd(rollingForecasts(R, W, createModel(m))));
    const common = R.map((r, t) => (all.every((run) => run.laws[t] && run.notes[t] === undefined) ? r : NaN));
    const fz = runs.map((run) => scoreForecasts(common, R.map((_, t) => (run.laws[t] ? run.laws[t]!.valueAtRisk(C, "long") : NaN)), R.map((_, t) => (run.laws[t] ? run.laws[t]!.expectedShortfall(C, "long") : NaN)), C).fz0);
    expect(out.methods[1].pValueAgainstBest).toBe(dieboldMariano(fz[1], fz[0]).smallSamplePValue);
  });

  test("the table: a header and one row per model, no NaN, best first", () => {
    const rows = methodComparisonRows(out);
    expect(rows[0]).toEqual(COMPARISON_HEADER);
    expect(rows.length).toBe(MODELS.length + 1);
    for (const row of rows) for (const v of row) expect(typeof v === "string" || Number.isFinite(v)).toBe(true);
    expect(rows[1][10]).toBe("");
  });
});
