/**
 * The rolling engine with a model (iid, ewma, garch):
 *  - "iid" equals the original rolling loop bit for bit (written out below as it stood: fitGnoQuick warm-started
 *    from the previous converged solution moved by the sliding update, one-step finish at gain 1e-5), including gaps and irregular windows;
 *    irregular maximum-likelihood windows are flagged with a note, never mixed in silently;
 *  - out-of-sample identity: row t unchanged when later rows change;
 *  - PIT uniformity of a correct model (seeded GARCH simulation, KS test, Marsaglia–Tsang–Wang law in
 *    src/core/gof) — and the same test rejects a mis-scaled law, so it can fail;
 *  - backtest of a seeded GARCH-with-skewed-innovations simulation: the "garch" column's exceptions lie in the
 *    central 95% binomial band and Christoffersen's (1998) independence and conditional-coverage tests pass,
 *    while "iid" has too many exceptions and fails conditional coverage.
 * Data: invented, simulated scenarios (seeded).
 */
import { fitGno, fitGnoQuick, type QuickFit } from "../../../src/core/fit";
import { sample, type GnoParams } from "../../../src/core/gno";
import { ksProbability, ksStatistic } from "../../../src/core/gof";
import { backtestVar, binomialQuantile, createModel, rollingForecasts, rollingVar, valueAtRisk } from "../../../src/core/risk";
import { runToEnd } from "../../../src/core/work";
import { simulateGarch } from "../vol/simulate";

/** The original rolling loop (before the engine), as the reference for "iid". */
function originalRollingVar(returns: Float64Array, window: number, confidence: number, method: "mle" | "lmom"): Float64Array {
  const values = new Float64Array(returns.length).fill(NaN);
  const usable: number[] = [];
  const rowOf: number[] = [];
  returns.forEach((x, i) => {
    if (Number.isFinite(x)) {
      usable.push(x);
      rowOf.push(i);
    }
  });
  const data = Float64Array.from(usable);
  let start: GnoParams | undefined;
  let hessian: Float64Array | undefined;
  for (let j = window; j < data.length; j++) {
    let fit: QuickFit;
    // since the sliding start (src/core/fit/slideStart.ts): a converged previous fit is moved by one Newton step for
    // the value dropped (data[j − window − 1]) and the value added (data[j − 1]) before the search starts
    const slide = start && hessian ? { params: start, hessian, removed: data[j - window - 1], added: data[j - 1] } : undefined;
    try {
      fit = fitGnoQuick(data.subarray(j - window, j), start ? { method, start, slide, oneStepGain: 1e-5 } : { method });
    } catch {
      start = undefined;
      continue;
    }
    start = fit.converged ? fit.params : undefined;
    hessian = fit.converged ? fit.hessian : undefined;
    values[rowOf[j]] = valueAtRisk(confidence, fit.params, "long");
  }
  return values;
}

describe('model "iid" is the original ROLLVAR', () => {
  test.each([
    [1, 12, 300, 0.6],
    [2, 40, 300, -0.3],
    [3, 120, 400, 0.1],
  ])("seed %p, window %p: every row identical (Object.is), gaps included", (seed, window, n, k) => {
    const r = sample({ location: 0, scale: 0.01, shape: k }, n, seed);
    r[window + 3] = NaN;
    for (const method of ["mle", "lmom"] as const) {
      const want = originalRollingVar(r, window, 0.99, method);
      const got = rollingVar(r, window, 0.99, { method }).values;
      for (let i = 0; i < n; i++) if (!Object.is(got[i], want[i])) throw new Error(`${method} row ${i}: got ${got[i]}, want ${want[i]}`);
    }
  });
  test("mle rows equal a cold, fully converged fit of each window (fitGno from the L-moment start) to 2e-6 relative", () => {
    // the warm start, its sliding update and the one-step finish may move a row only by far less than a standard error
    const r = sample({ location: 0.0004, scale: 0.011, shape: -0.12 }, 700, 21);
    const window = 250;
    const got = rollingVar(r, window, 0.99, { method: "mle" }).values;
    let worst = 0;
    for (let j = window; j < r.length; j++) {
      const cold = fitGno(r.subarray(j - window, j));
      if (!cold.regular) continue;
      const want = valueAtRisk(0.99, cold.params, "long");
      worst = Math.max(worst, Math.abs(got[j] - want) / Math.abs(want));
      if (!(Math.abs(got[j] - want) <= 2e-6 * Math.abs(want))) throw new Error(`row ${j}: got ${got[j]}, cold fit ${want}`);
    }
    expect(worst).toBeLessThanOrEqual(2e-6);
  });
  test("windows where maximum likelihood is irregular carry a note (method mle) and none with method auto", () => {
    const r = sample({ location: 0, scale: 0.01, shape: 1.0 }, 400, 4);
    const mle = runToEnd(rollingForecasts(r, 12, createModel("iid", { method: "mle" })));
    expect(mle.flaggedRows.length).toBeGreaterThan(0);
    for (const row of mle.flaggedRows) expect(mle.notes[row]).toMatch(/no regular maximum/);
    const auto = runToEnd(rollingForecasts(r, 12, createModel("iid", { method: "auto" })));
    expect(auto.flaggedRows).toEqual([]);
    for (const row of mle.flaggedRows) expect(auto.laws[row]!.valueAtRisk(0.99, "long")).toBe(mle.laws[row]!.valueAtRisk(0.99, "long"));
  });
});

describe("out-of-sample identity", () => {
  const r = simulateGarch({ mu: 0.0002, omega: 2e-6, alpha: 0.09, beta: 0.89, k: 0.2 }, 520, 21).returns;
  test.each(["ewma", "garch"])("%s: rows up to t are unchanged when row t and later change", (name) => {
    const a = runToEnd(rollingForecasts(r, 250, createModel(name)));
    const changed = Float64Array.from(r);
    changed[400] = -0.08;
    changed[450] = 0.05;
    const b = runToEnd(rollingForecasts(changed, 250, createModel(name)));
    for (let t = 250; t <= 400; t++) expect(b.laws[t]!.valueAtRisk(0.99, "long")).toBe(a.laws[t]!.valueAtRisk(0.99, "long"));
    expect(b.laws[401]!.valueAtRisk(0.99, "long")).not.toBe(a.laws[401]!.valueAtRisk(0.99, "long"));
  });
  test("a window that never fills gives no forecast and says nothing was attempted", () => {
    const out = runToEnd(rollingForecasts(r.subarray(0, 100), 150, createModel("garch")));
    expect(out.forecasts).toBe(0);
    expect(out.attempted).toBe(0);
  });
});

describe("PIT and backtest on a seeded GARCH with skewed innovations", () => {
  const p = { mu: 0.0003, omega: 3e-6, alpha: 0.12, beta: 0.86, k: 0.3 };
  const window = 500;
  const r = simulateGarch(p, window + 1500, 31).returns;
  const garch = runToEnd(rollingForecasts(r, window, createModel("garch")));
  const iid = runToEnd(rollingForecasts(r, window, createModel("iid", { method: "auto" })));
  const pits = (laws: typeof garch.laws, scale = 1): Float64Array => {
    const u: number[] = [];
    for (let t = window; t < r.length; t++) u.push(laws[t]!.cdf(r[t] * scale));
    return Float64Array.from(u).sort();
  };
  test("ROLLPIT of the garch model is uniform (KS p > 0.01)", () => {
    const u = pits(garch.laws);
    const d = ksStatistic(u).d;
    expect(ksProbability(u.length, d).pValue).toBeGreaterThan(0.01);
  });
  test("the same KS test rejects the PIT of a law 40% too wide (the check can fail)", () => {
    const u = pits(garch.laws, 1 / 1.4);
    expect(ksProbability(u.length, ksStatistic(u).d).pValue).toBeLessThan(0.01);
  });
  test("garch exceptions within the binomial band and independent; iid exceptions exceed the band and fail conditional coverage", () => {
    const c = 0.99;
    const v = (laws: typeof garch.laws) => Float64Array.from(laws.map((l) => (l ? l.valueAtRisk(c, "long") : NaN)));
    const g = backtestVar(r, v(garch.laws), c, "long")!;
    const i = backtestVar(r, v(iid.laws), c, "long")!;
    const lo = binomialQuantile(0.025, g.observations, 1 - c);
    const hi = binomialQuantile(0.975, g.observations, 1 - c);
    expect({ exceptions: g.exceptions, inBand: g.exceptions >= lo && g.exceptions <= hi }).toEqual({ exceptions: g.exceptions, inBand: true });
    expect(g.independence.pValue).toBeGreaterThan(0.05);
    expect(g.conditionalCoverage.pValue).toBeGreaterThan(0.05);
    // the unconditional fit lags the volatility: too many exceptions, bunched in the turbulent stretches
    expect(i.exceptions).toBeGreaterThan(hi);
    expect(i.conditionalCoverage.pValue).toBeLessThan(0.05);
  });
});
