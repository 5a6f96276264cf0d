/**
 * The reference methods as ForecastModels: each law answers with the same numbers as the direct functions, the
 * PIT is the stated CDF, Cornish–Fisher outside its domain gives no law and the reason, and filtered historical
 * simulation rescales the filter's residuals (a hand-made filter stands in for the volatility layer).
 */
import {
  cornishFisherModel,
  filteredHistoricalModel,
  historicalModel,
  historicalTail,
  normalModel,
  normalTail,
  cornishFisherTail,
  type VolatilityFilter,
} from "../../../src/core/methods";
import { sampleMoments } from "../../../src/core/fit/sampleStats";
import { normalCdf } from "../../../src/core/normal";
import { expectClose } from "../risk/check";
import { normalDraws } from "../scores/draws";

const W = normalDraws(250, 77, 0.01);

describe("ForecastModel adapters", () => {
  test("hs (plain and age-weighted) gives historicalTail's VaR and ES on both sides", () => {
    for (const decay of [1, 0.97]) {
      const f = historicalModel(decay).forecast(W, null);
      expect(f.law).not.toBeNull();
      for (const side of ["long", "short"] as const) for (const c of [0.95, 0.99]) {
        const t = historicalTail(W, c, side, decay);
        expect(f.law!.valueAtRisk(c, side)).toBe(t.valueAtRisk);
        expect(f.law!.expectedShortfall(c, side)).toBe(t.expectedShortfall);
      }
    }
    expect(historicalModel(1.5).forecast(W, null).law).toBeNull();
  });

  test("normal: VaR/ES from the window's mean and sd; PIT = Φ((x − μ)/σ)", () => {
    const m = sampleMoments(W);
    const law = normalModel().forecast(W, null).law!;
    const t = normalTail({ mean: m.mean, sd: m.sd, skewness: 0, excessKurtosis: 0 }, 0.99, "long");
    expect(law.valueAtRisk(0.99, "long")).toBe(t.valueAtRisk);
    expectClose("PIT", law.cdf(-0.02), normalCdf((-0.02 - m.mean) / m.sd), { rel: 1e-15 });
    expect(normalModel().forecast(new Float64Array([0.01, 0.01, 0.01, 0.01]), null).note).toMatch(/all equal/);
  });

  test("cf inside its domain: VaR/ES of the window's moments; PIT at −VaR equals 1 − c", () => {
    // Invented window: a fat-tailed, mildly left-skewed sample built from the normal draws.
    const X = W.map((x, i) => (i % 25 === 0 ? -3 * Math.abs(x) : x) + (i % 40 === 0 ? 0.012 : 0));
    const m = sampleMoments(X);
    const f = cornishFisherModel().forecast(X, null);
    expect(f.note).toBeUndefined();
    const law = f.law!;
    const t = cornishFisherTail(m, 0.99, "long");
    expect(law.valueAtRisk(0.99, "long")).toBe(t.valueAtRisk);
    expectClose("PIT at −VaR", law.cdf(-law.valueAtRisk(0.99, "long")), 0.01, { rel: 1e-9 });
    expectClose("PIT at short VaR", law.cdf(law.valueAtRisk(0.975, "short")), 0.975, { rel: 1e-9 });
  });

  test("cf outside its domain: no law, the reason in the note", () => {
    // An exponential-like window (S ≈ 2, K ≈ 6): the slope A z² + B z + C has B² > 4AC, so g dips between two levels.
    const X = Float64Array.from({ length: 200 }, (_, i) => -Math.log((i + 0.5) / 200) * 0.01);
    const f = cornishFisherModel().forecast(X, null);
    expect(f.law).toBeNull();
    expect(f.note).toMatch(/domain of validity/);
  });

  test("fhs rescales the filter's residuals by the next-day σ (VaR = μ + σ·HS VaR of residuals, PIT likewise)", () => {
    const residuals = normalDraws(300, 5, 1);
    const filter: VolatilityFilter = () => ({ residuals, nextSigma: 0.02, nextMean: 0.0005 });
    const law = filteredHistoricalModel(filter).forecast(W, null).law!;
    for (const side of ["long", "short"] as const) {
      const z = historicalTail(residuals, 0.99, side);
      const shift = side === "long" ? -0.0005 : 0.0005;
      expectClose(`VaR ${side}`, law.valueAtRisk(0.99, side), shift + 0.02 * z.valueAtRisk, { rel: 1e-15 });
      expectClose(`ES ${side}`, law.expectedShortfall(0.99, side), shift + 0.02 * z.expectedShortfall, { rel: 1e-15 });
    }
    const sortedZ = Array.from(residuals).sort((a, b) => a - b);
    const x = 0.0005 + 0.02 * sortedZ[29];
    expectClose("PIT", law.cdf(x), 30 / 300, { rel: 1e-15 });
    expect(filteredHistoricalModel(() => null).forecast(W, null).note).toMatch(/could not be fitted/);
    expect(filteredHistoricalModel(() => ({ residuals, nextSigma: 0 })).forecast(W, null).law).toBeNull();
  });
});
