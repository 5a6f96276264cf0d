/**
 * The generalized Pareto law against 50-digit decimal.js evaluations of its defining formulas
 * (S(y) = (1 + ξy/β)^(−1/ξ), g(y) = (1/β)(1 + ξy/β)^(−1/ξ−1), y(q) = β(q^(−ξ) − 1)/ξ; Pickands 1975,
 * Hosking & Wallis 1987), against the exponential limit (ξ = 0) for |ξ| down to 1e-12, and the bounded case ξ < 0.
 */
import Decimal from "decimal.js";
import {
  gpdCdf,
  gpdLimitedMean,
  gpdMeanExcess,
  gpdPdf,
  gpdQuantile,
  gpdQuantileUpper,
  gpdRawMoment,
  gpdSf,
  gpdUpperEnd,
} from "../../../src/core/pareto";
import { expectClose } from "./check";

const D = Decimal.clone({ precision: 50 });

function refSf(y: number, xi: number, beta: number): number {
  const t = new D(y).div(beta);
  if (xi === 0) return t.neg().exp().toNumber();
  return new D(1).plus(t.times(xi)).ln().div(-xi).exp().toNumber();
}
function refPdf(y: number, xi: number, beta: number): number {
  const t = new D(y).div(beta);
  if (xi === 0) return t.neg().exp().div(beta).toNumber();
  const w = new D(1).plus(t.times(xi));
  return w.ln().times(new D(-1).div(xi).minus(1)).exp().div(beta).toNumber();
}
function refQuantileUpper(q: number, xi: number, beta: number): number {
  const lq = new D(q).ln();
  if (xi === 0) return lq.neg().times(beta).toNumber();
  return lq.times(-xi).exp().minus(1).times(beta).div(xi).toNumber();
}

describe("generalized Pareto law against 50-digit references", () => {
  // Relative tolerance: a few ulp times the size of the exponent H = −ln S (error of exp grows with its argument).
  const shapes = [0.7, 0.3, 1e-3, 1e-6, 1e-9, 1e-12, 0, -1e-12, -1e-6, -0.2, -0.6];
  const beta = 1.7;
  for (const xi of shapes) {
    test(`S, G, g and the quantile hold for ξ = ${xi}`, () => {
      const end = xi < 0 ? -beta / xi : Infinity;
      for (const y of [1e-10, 0.01, 0.5, 1.7, 4, 12, 40]) {
        if (!(y < end * 0.999)) continue;
        const s = refSf(y, xi, beta);
        const h = -Math.log(s);
        const tol = 8e-16 * (1 + h);
        expectClose(`sf(${y}; ξ=${xi})`, gpdSf(y, { shape: xi, scale: beta }), s, { rel: tol });
        expectClose(`cdf(${y}; ξ=${xi})`, gpdCdf(y, { shape: xi, scale: beta }), 1 - s, { rel: tol / Math.max(1e-300, 1 - s) * s + 8e-16, abs: 1e-300 });
        expectClose(`pdf(${y}; ξ=${xi})`, gpdPdf(y, { shape: xi, scale: beta }), refPdf(y, xi, beta), { rel: 2 * tol });
      }
      for (const q of [0.9, 0.5, 0.1, 1e-3, 1e-8, 1e-15]) {
        const want = refQuantileUpper(q, xi, beta);
        expectClose(`quantileUpper(${q}; ξ=${xi})`, gpdQuantileUpper(q, { shape: xi, scale: beta }), want, { rel: 4e-15 * (1 + Math.abs(Math.log(q))) });
        expectClose(`quantile(${1 - q}; ξ=${xi})`, gpdQuantile(1 - q, { shape: xi, scale: beta }), refQuantileUpper(1 - (1 - q), xi, beta), {
          rel: 4e-15 * (1 + Math.abs(Math.log(q))),
        });
      }
    });
  }

  test("|ξ| = 1e-12 agrees with the exponential limit to about |ξ|·(y/β)² relative", () => {
    // Exponential law (ξ = 0): S = e^{−y/β}, quantile −β ln q (the limit of the GPD as ξ → 0).
    const b = 0.8;
    for (const xi of [1e-12, -1e-12]) {
      for (const y of [0.001, 0.3, 2, 9]) {
        const t = y / b;
        const want = Math.exp(-t);
        expectClose(`sf(${y}) at ξ=${xi} vs exponential`, gpdSf(y, { shape: xi, scale: b }), want, { rel: 1e-15 + Math.abs(xi) * t * t });
        expectClose(`pdf(${y}) at ξ=${xi} vs exponential`, gpdPdf(y, { shape: xi, scale: b }), want / b, { rel: 1e-15 + Math.abs(xi) * (t * t + t) });
      }
      for (const q of [0.5, 1e-4, 1e-12]) {
        const l = -Math.log(q);
        expectClose(`quantileUpper(${q}) at ξ=${xi}`, gpdQuantileUpper(q, { shape: xi, scale: b }), b * l, { rel: 1e-15 + Math.abs(xi) * l });
      }
    }
  });

  test("ξ < 0 gives a bounded tail ending at −β/ξ", () => {
    const p = { shape: -0.25, scale: 2 };
    expect(gpdUpperEnd(p)).toBe(8);
    expect(gpdSf(8, p)).toBe(0);
    expect(gpdSf(9, p)).toBe(0);
    expect(gpdCdf(9, p)).toBe(1);
    expect(gpdPdf(9, p)).toBe(0);
    expectClose("quantileUpper(0) is the end", gpdQuantileUpper(0, p), 8, { rel: 0 });
    // Mean excess beyond y is (β + ξy)/(1 − ξ), which reaches 0 at the end (common knowledge of the GPD).
    expectClose("mean excess at the end", gpdMeanExcess(8, p), 0, { abs: 1e-15 });
  });

  test("mean excess, limited mean and raw moments match numerical integrals of the survival function", () => {
    // E[Y^r] = ∫ r y^{r−1} S(y) dy and E[min(Y, y)] = ∫₀^y S; composite Simpson on a mapped variable (test-side).
    const simpson = (f: (x: number) => number, a: number, b: number, n = 20000): number => {
      const h = (b - a) / n;
      let s = f(a) + f(b);
      for (let i = 1; i < n; i++) s += (i % 2 ? 4 : 2) * f(a + i * h);
      return (s * h) / 3;
    };
    for (const xi of [0.2, 0, -0.3]) {
      const p = { shape: xi, scale: 1.3 };
      // Map y = w/(1 − w) on [0, 1): integrand × dy/dw; the tail beyond w = 1 − 1e-6 is negligible here.
      const integrate = (f: (y: number) => number): number => simpson((w) => (w >= 1 ? 0 : f(w / (1 - w)) / ((1 - w) * (1 - w))), 0, 1 - 1e-7, 200000);
      for (let r = 1; r <= 3; r++) {
        const want = integrate((y) => r * Math.pow(y, r - 1) * gpdSf(y, p));
        expectClose(`E[Y^${r}] ξ=${xi}`, gpdRawMoment(r, p), want, { rel: 1e-6 });
      }
      const lev = simpson((y) => gpdSf(y, p), 0, 2.5, 2000);
      expectClose(`E[min(Y, 2.5)] ξ=${xi}`, gpdLimitedMean(2.5, p), lev, { rel: 1e-12 });
      const me = integrate((y) => gpdSf(0.7 + y, p)) / gpdSf(0.7, p);
      expectClose(`mean excess beyond 0.7, ξ=${xi}`, gpdMeanExcess(0.7, p), me, { rel: 1e-6 });
    }
    expect(gpdRawMoment(2, { shape: 0.5, scale: 1 })).toBe(Infinity);
    expect(gpdMeanExcess(1, { shape: 1, scale: 1 })).toBe(Infinity);
  });
});
