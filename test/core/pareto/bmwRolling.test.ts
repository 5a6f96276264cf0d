/**
 * Real returns: BMW daily log returns 1973–1996 (R fExtremes `bmwRet`, Debian r-cran-fextremes; fixture from
 * test/fixtures/fextremes/runner.R). Rolling EWMA (λ = 0.94, RiskMetrics 1996) with a 500-day window, one-day
 * VaR at 99% and 97.5% for long and short positions, innovations "mle" (the law alone) against "gno-gpd" (Pareto
 * tails spliced onto it, McNeil & Frey 2000). Green zone: the binomial probability of at most the observed
 * exceptions below 95% (the Basel 1996 traffic-light cut-off, applied to the number of days tested).
 * Jest cost: the last 1000 forecast days only (1992-09-23 to 1996-07-23; windows from 1990-10-24), the same subsample for
 * both models; the full sample (5646 forecasts) is measured in docs/notes/tails.md.
 */
import bmw from "../../fixtures/fextremes/bmw_returns.json";
import { binomialCdf, createModel, rollingForecasts, type RiskSide } from "../../../src/core/risk";
import { runToEnd } from "../../../src/core/work";

const WINDOW = 500;
const FORECASTS = 1000;
const all = Float64Array.from(bmw.returns as number[]);
const r = all.subarray(all.length - FORECASTS - WINDOW);

function exceptions(method: string): Map<string, { n: number; x: number }> {
  const out = runToEnd(rollingForecasts(r, WINDOW, createModel("ewma", { method })));
  const counts = new Map<string, { n: number; x: number }>();
  for (const c of [0.99, 0.975]) {
    for (const side of ["long", "short"] as RiskSide[]) {
      let n = 0;
      let x = 0;
      for (let i = 0; i < r.length; i++) {
        const law = out.laws[i];
        if (!law) continue;
        n++;
        const v = law.valueAtRisk(c, side);
        if (side === "long" ? r[i] < -v : r[i] > v) x++;
      }
      counts.set(`${c} ${side}`, { n, x });
    }
  }
  return counts;
}

describe("BMW daily returns, rolling EWMA: Pareto tails on the residuals", () => {
  test("gno-gpd stays in the green zone at 99% and 97.5% and is closer to the expected count than the law alone", () => {
    const plain = exceptions("mle");
    const tails = exceptions("gno-gpd");
    for (const [key, t] of tails) {
      const c = Number(key.split(" ")[0]);
      const p = plain.get(key)!;
      expect(t.n).toBe(FORECASTS);
      const expected = t.n * (1 - c);
      const green = binomialCdf(t.x, t.n, 1 - c);
      const msg = `${key}: gno-gpd ${t.x} (P(X ≤ x) = ${green.toFixed(4)}), law alone ${p.x}, expected ${expected}`;
      if (!(green < 0.95)) throw new Error(`not green: ${msg}`);
      if (!(Math.abs(t.x - expected) < Math.abs(p.x - expected))) throw new Error(`not closer to expected: ${msg}`);
    }
  });
});
