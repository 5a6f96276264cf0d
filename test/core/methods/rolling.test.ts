/**
 * The reference methods through the rolling engine's registry (models "hs", "normal", "cf", "fhs"): row t's law is
 * the method applied to exactly the `window` usable returns before row t (gaps skipped), checked against the direct
 * functions on hand-sliced windows; the EWMA filter for "fhs" is recomputed here from its definition
 * (RiskMetrics 1996: σ²_t = λσ²_{t−1} + (1 − λ)r²_{t−1}; the seed is read from the core filter's first σ).
 */
import { historicalTail, normalTail, cornishFisherTail } from "../../../src/core/methods";
import { sampleMoments } from "../../../src/core/fit/sampleStats";
import { createModel, rollingForecasts } from "../../../src/core/risk";
import { filterReturns } from "../../../src/core/vol";
import { runToEnd } from "../../../src/core/work";
import { expectClose } from "../risk/check";
import { normalDraws } from "../scores/draws";

const R = Array.from(normalDraws(160, 11, 0.01), (x, i) => (i % 17 === 0 ? 3 * x : x)) as number[];
R[40] = NaN; // a gap: skipped by every window, no forecast on its row
const W = 60;

/** The `W` usable returns before row t (the engine's window rule, written out). */
function windowBefore(t: number): number[] {
  const out: number[] = [];
  for (let i = t - 1; i >= 0 && out.length < W; i--) if (Number.isFinite(R[i])) out.unshift(R[i]);
  return out;
}

describe("reference models in the rolling registry", () => {
  test("hs: row t's VaR, ES and PIT are historical simulation on the window before t (both sides)", () => {
    const run = runToEnd(rollingForecasts(R, W, createModel("hs")));
    expect(run.laws[40]).toBeNull();
    let rows = 0;
    for (let t = 0; t < R.length; t++) {
      const law = run.laws[t];
      if (!law) continue;
      rows++;
      const w = windowBefore(t);
      for (const side of ["long", "short"] as const) {
        const h = historicalTail(w, 0.95, side);
        expect([law.valueAtRisk(0.95, side), law.expectedShortfall(0.95, side)]).toEqual([h.valueAtRisk, h.expectedShortfall]);
      }
      expect(law.cdf(R[t])).toBe(w.filter((x) => x <= R[t]).length / W);
    }
    expect(rows).toBe(R.length - W - 1);
  });

  test("hs with an age decay passed as lambda uses age weights", () => {
    const run = runToEnd(rollingForecasts(R, W, createModel("hs", { lambda: 0.97 })));
    const t = 120;
    expect(run.laws[t]!.valueAtRisk(0.95, "long")).toBe(historicalTail(windowBefore(t), 0.95, "long", 0.97).valueAtRisk);
  });

  test("normal and cf: the window's moments through normalTail / cornishFisherTail; cf rows outside the domain carry the reason", () => {
    const normal = runToEnd(rollingForecasts(R, W, createModel("normal")));
    const cf = runToEnd(rollingForecasts(R, W, createModel("cf")));
    let inside = 0;
    let outside = 0;
    for (let t = W + 1; t < R.length; t++) {
      const m = sampleMoments(windowBefore(t));
      expect(normal.laws[t]!.valueAtRisk(0.99, "long")).toBe(normalTail(m, 0.99, "long").valueAtRisk);
      const direct = cornishFisherTail(m, 0.99, "long");
      if (direct.problem === null) {
        inside++;
        expect(cf.laws[t]!.valueAtRisk(0.99, "long")).toBe(direct.valueAtRisk);
      } else {
        outside++;
        expect(cf.laws[t]).toBeNull();
        expect(cf.notes[t]).toMatch(/domain of validity/);
      }
    }
    expect(inside).toBeGreaterThan(0);
    expect(inside + outside).toBe(R.length - W - 1);
  });

  test("fhs (ewma): VaR = σ_next × HS VaR of the EWMA residuals; residuals recomputed from the EWMA recursion", () => {
    const run = runToEnd(rollingForecasts(R, W, createModel("fhs", { lambda: 0.94 })));
    const t = 130;
    const w = windowBefore(t);
    const core = filterReturns(w, { kind: "ewma", lambda: 0.94 });
    // EWMA by its definition from the core's first variance (the seed convention is the filter's own).
    const s2 = [core.sigmas[0] ** 2];
    for (let i = 1; i <= w.length; i++) s2.push(0.94 * s2[i - 1] + 0.06 * w[i - 1] ** 2);
    const residuals = w.map((x, i) => x / Math.sqrt(s2[i]));
    const nextSigma = Math.sqrt(s2[w.length]);
    const h = historicalTail(residuals, 0.99, "long");
    expectClose("fhs VaR", run.laws[t]!.valueAtRisk(0.99, "long"), nextSigma * h.valueAtRisk, { rel: 1e-12 });
    expectClose("fhs ES", run.laws[t]!.expectedShortfall(0.99, "long"), nextSigma * h.expectedShortfall, { rel: 1e-12 });
  });

  test("fhs (garch) declines windows under 100 returns with the reason; options are checked", () => {
    const run = runToEnd(rollingForecasts(R, W, createModel("fhs", { method: "garch" })));
    expect(run.laws[100]).toBeNull();
    expect(run.notes[100]).toMatch(/at least 100/);
    expect(() => createModel("hs", { method: "mle" })).toThrow(/takes no method/);
    expect(() => createModel("fhs", { method: "lmom" })).toThrow(/"ewma"/);
  });
});
