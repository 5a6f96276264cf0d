/**
 * The likelihood kernel (src/core/fit/likelihood.ts) against derivatives computed without its formulas: the
 * log-likelihood Σ [k y − y²/2 − a − ½ ln 2π], y = −ln(1 − k t)/k, t = (x − ξ)/e^a, evaluated in 60-digit decimal
 * arithmetic (decimal.js 10) and differentiated by central differences with step 1e-18 (truncation ~1e-36).
 * The data put z = k y on both sides of the kernel's switch between power series and closed forms (|z| = 0.02),
 * near 0 and far from it, so the check covers both branches and the seam.
 */
import Decimal from "decimal.js";
import { likelihoodDerivatives } from "../../../src/core/fit";

const D = Decimal.clone({ precision: 60 });
const HALF_LOG_2PI = new D(2).times(D.acos(-1)).ln().div(2);

function loglik(x: number[], xi: Decimal, a: Decimal, k: Decimal): Decimal {
  const alpha = a.exp();
  let s = new D(0);
  for (const v of x) {
    const t = new D(v).minus(xi).div(alpha);
    const y = k.isZero() ? t : new D(1).minus(k.times(t)).ln().neg().div(k);
    s = s.plus(k.times(y)).minus(y.times(y).div(2)).minus(a).minus(HALF_LOG_2PI);
  }
  return s;
}

/** Gradient and Hessian by central differences in 60 digits. */
function reference(x: number[], th: number[]): { value: number; grad: number[]; hess: number[] } {
  const h = new D("1e-18");
  const base = th.map((v) => new D(v));
  const f = (d: Decimal[]) => loglik(x, d[0], d[1], d[2]);
  const shifted = (i: number, si: number, j = -1, sj = 0) =>
    base.map((v, q) => v.plus(h.times((q === i ? si : 0) + (q === j ? sj : 0))));
  const f0 = f(base);
  const grad = [0, 1, 2].map((i) => f(shifted(i, 1)).minus(f(shifted(i, -1))).div(h.times(2)).toNumber());
  const hess: number[] = [];
  for (let i = 0; i < 3; i++) {
    for (let j = 0; j < 3; j++) {
      const v =
        i === j
          ? f(shifted(i, 1)).minus(f0.times(2)).plus(f(shifted(i, -1))).div(h.times(h))
          : f(shifted(i, 1, j, 1)).minus(f(shifted(i, 1, j, -1))).minus(f(shifted(i, -1, j, 1))).plus(f(shifted(i, -1, j, -1))).div(h.times(h).times(4));
      hess.push(v.toNumber());
    }
  }
  return { value: f0.toNumber(), grad, hess };
}

describe("likelihood kernel against 60-digit central differences (decimal.js 10)", () => {
  // standardized points t from −4 to 4 and their z = k y for each shape: with k = −0.12, |z| runs from 0 to ~0.6
  const ts = [-4, -2.5, -1.2, -0.83, -0.8, -0.5, -0.17, -0.165, -0.1, -0.098, 0, 0.05, 0.1, 0.102, 0.165, 0.17, 0.4, 0.79, 0.84, 1.3, 2.2, 3.9];
  const cases = [
    { xi: 0.0004, alpha: 0.011, k: -0.12 },
    { xi: -0.001, alpha: 0.02, k: 0.2 },
    { xi: 0, alpha: 1, k: 1e-9 },
    { xi: 0.3, alpha: 2, k: -0.7 },
  ];
  test.each(cases)("ξ = $xi, α = $alpha, k = $k: value, score and Hessian to 1e-12 relative", ({ xi, alpha, k }) => {
    const x = ts.filter((t) => 1 - k * t > 0.05).map((t) => xi + alpha * t);
    const th = [xi, Math.log(alpha), k];
    const got = likelihoodDerivatives(x, th[0], th[1], th[2])!;
    const want = reference(x, th);
    const scale = [1 / alpha, 1, 1]; // compare ξ-derivatives in units of the scale
    const close = (g: number, w: number, tol: number, what: string) => {
      if (!(Math.abs(g - w) <= tol * Math.max(1, Math.abs(w)))) throw new Error(`${what}: got ${g}, want ${w} (k = ${k})`);
    };
    close(got.value, want.value, 1e-14, "value");
    for (let i = 0; i < 3; i++) close(got.gradient[i] / scale[i], want.grad[i] / scale[i], 1e-13, `score[${i}]`);
    for (let i = 0; i < 9; i++) {
      const s = scale[Math.floor(i / 3)] * scale[i % 3];
      close(got.hessian[i] / s, want.hess[i] / s, 1e-12, `Hessian[${i}]`);
    }
  });
});
