/**
 * Normal kernels and GNO against the 50-digit decimal.js references in test/fixtures/precise/*.json
 * (produced by test/fixtures/precise/runner.ts from the textbook definitions, exact double inputs).
 * Tolerances are per regime, written as multiples of ε = 2⁻⁵², and sit well inside the issue's contract
 * (1e-12 relative in the body, 1e-9 for tail probabilities/densities down to 1e-300, incl. |k| → 0).
 * In the far tails the tolerance grows with y² because Φ(y) amplifies the unavoidable rounding of y by |y|·|y|.
 */
import { readFileSync } from "fs";
import { join } from "path";
import * as G from "../../../src/core/gno";
import * as N from "../../../src/core/normal";
import { describeParams, expectRel } from "./helpers";

type Row = Record<string, string | number>;
interface Fixture {
  normal?: Row[];
  normalLogCdf?: Row[];
  normalQuantile?: Row[];
  erf?: Row[];
  gnoPoints?: Row[];
  gnoQuantiles?: Row[];
  gnoMoments?: Row[];
}
const EPS = 2 ** -52;
const load = (name: string): Fixture =>
  JSON.parse(readFileSync(join(__dirname, "../../fixtures/precise", `${name}.json`), "utf8")) as Fixture;
const params = (r: Row): G.GnoParams => ({ location: r.xi as number, scale: r.alpha as number, shape: r.k as number });

/** Tolerances (multiples of ε) by regime; `tailPerY2` adds that many ε per unit of y². */
interface Tol {
  normal: number;
  gno: number;
  tailPerY2: number;
  logs: number;
  quantile: number;
  moments: number;
}
const REGIMES: Record<string, Tol> = {
  body: { normal: 4, gno: 32, tailPerY2: 0, logs: 256, quantile: 16, moments: 8 },
  deep_tail: { normal: 4, gno: 32, tailPerY2: 2, logs: 1024, quantile: 128, moments: 8 },
  shape_near_zero: { normal: 4, gno: 32, tailPerY2: 2, logs: 128, quantile: 16, moments: 8 },
  near_edge: { normal: 4, gno: 32, tailPerY2: 2, logs: 1024, quantile: 16, moments: 8 },
};

describe.each(Object.keys(REGIMES))("50-digit references, regime %s", (regime) => {
  const fx = load(regime);
  const tol = REGIMES[regime];

  test("normal Φ, 1 − Φ, φ, ln Φ", () => {
    for (const r of fx.normal ?? []) {
      const x = r.x as number;
      expectRel(`Φ(${x})`, N.normalCdf(x), Number(r.cdf), tol.normal * EPS);
      expectRel(`1 − Φ(${-x})`, N.normalSf(-x), Number(r.cdf), tol.normal * EPS);
      expectRel(`φ(${x})`, N.normalPdf(x), Number(r.pdf), tol.normal * EPS);
      expectRel(`ln Φ(${x})`, N.logNormalCdf(x), Number(r.logCdf), tol.normal * EPS);
    }
    for (const r of fx.normalLogCdf ?? []) {
      expectRel(`ln Φ(${r.x})`, N.logNormalCdf(r.x as number), Number(r.logCdf), tol.normal * EPS);
    }
  });

  test("normal Φ⁻¹ and Φ⁻¹(1 − q)", () => {
    for (const r of fx.normalQuantile ?? []) {
      const p = r.p as number;
      expectRel(`Φ⁻¹(${p})`, N.normalQuantile(p), Number(r.z), tol.normal * EPS);
      expectRel(`Φ⁻¹(1 − ${p})`, N.normalQuantileUpper(p), -Number(r.z), tol.normal * EPS);
    }
  });

  test("erf and erfc", () => {
    for (const r of fx.erf ?? []) {
      expectRel(`erf(${r.x})`, N.erf(r.x as number), Number(r.erf), tol.normal * EPS);
      expectRel(`erfc(${r.x})`, N.erfc(r.x as number), Number(r.erfc), tol.normal * EPS);
    }
  });

  test("GNO reduced variate, cdf, sf, pdf, and their logs", () => {
    const points = fx.gnoPoints ?? [];
    if (regime !== "body" || points.length > 0) expect(points.length).toBeGreaterThan(10);
    for (const r of points) {
      const p = params(r);
      const x = r.x as number;
      const y = Number(r.y);
      const at = `x=${x} ${describeParams(p)}`;
      const t = (tol.gno + tol.tailPerY2 * y * y) * EPS;
      expectRel(`y ${at}`, G.reducedVariate(x, p), y, tol.gno * EPS);
      expectRel(`cdf ${at}`, G.cdf(x, p), Number(r.cdf), t);
      expectRel(`sf ${at}`, G.sf(x, p), Number(r.sf), t);
      expectRel(`pdf ${at}`, G.pdf(x, p), Number(r.pdf), t);
      expectRel(`logPdf ${at}`, G.logPdf(x, p), Number(r.logPdf), tol.logs * EPS);
      expectRel(`logCdf ${at}`, G.logCdf(x, p), Number(r.logCdf), tol.logs * EPS);
      expectRel(`logSf ${at}`, G.logSf(x, p), Number(r.logSf), tol.logs * EPS);
      expect(G.inSupport(x, p)).toBe(true);
    }
  });

  test("GNO quantile and quantile at 1 − q", () => {
    for (const r of fx.gnoQuantiles ?? []) {
      const p = params(r);
      if (r.p !== undefined) {
        expectRel(`quantile(${r.p}) ${describeParams(p)}`, G.quantile(r.p as number, p), Number(r.x), tol.quantile * EPS);
      } else {
        expectRel(`quantileUpper(${r.q}) ${describeParams(p)}`, G.quantileUpper(r.q as number, p), Number(r.x), tol.quantile * EPS);
      }
    }
  });

  test("GNO moments, λ1 and λ2", () => {
    for (const r of fx.gnoMoments ?? []) {
      const p = params(r);
      const m = G.moments(p);
      const l = G.lMoments(p);
      const at = describeParams(p);
      const t = tol.moments * EPS;
      expectRel(`mean ${at}`, m.mean, Number(r.mean), t);
      expectRel(`sd ${at}`, m.sd, Number(r.sd), t);
      expectRel(`skewness ${at}`, m.skewness, Number(r.skewness), t);
      expectRel(`excess kurtosis ${at}`, m.excessKurtosis, Number(r.excessKurtosis), t);
      expectRel(`λ1 ${at}`, l.l1, Number(r.mean), t);
      expectRel(`λ2 ${at}`, l.l2, Number(r.l2), t);
    }
  });
});
