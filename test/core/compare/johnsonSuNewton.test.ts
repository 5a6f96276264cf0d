/**
 * Johnson SU maximum likelihood by Newton: the analytic score and Hessian against central differences of the
 * log-likelihood (which is itself checked against jStat's normal density in families.test.ts), and the fit against
 * the profile Nelder–Mead route it replaced: fmin's Nelder–Mead (fmin 0.0.4) on all four parameters finds no better
 * point. Data: seeded SU draws (invented parameters) and seeded draws of the generalized normal law (a shifted
 * lognormal, whose SU fit sits at the lognormal limit).
 */
import { fitJohnsonSu, johnsonSuDerivatives, johnsonSuLogLikelihood } from "../../../src/core/compare/johnsonSu";
import { sample } from "../../../src/core/gno";
import { normalQuantile } from "../../../src/core/normal";
import { nelderMead } from "../../refs/fmin";

function suDraws(n: number, seed: number): number[] {
  let s = seed;
  const u = () => ((s = (s * 1103515245 + 12345) % 2147483648) + 0.5) / 2147483648;
  const t = { location: 0.001, scale: 0.01, gamma: 0.5, delta: 1.5 };
  return Array.from({ length: n }, () => t.location + t.scale * Math.sinh((normalQuantile(u()) - t.gamma) / t.delta));
}

describe("Johnson SU Newton", () => {
  test("score and Hessian agree with central differences (1e-6 relative, step 1e-6·scale / 1e-5)", () => {
    const data = suDraws(2000, 12345);
    const th = [0.0012, Math.log(0.011), 0.4, Math.log(1.4)];
    const f = (v: number[]) => johnsonSuLogLikelihood(data, { location: v[0], scale: Math.exp(v[1]), gamma: v[2], delta: Math.exp(v[3]) });
    const d = johnsonSuDerivatives(data, th[0], th[1], th[2], th[3])!;
    expect(Math.abs(d.value - f(th))).toBeLessThanOrEqual(1e-10 * Math.abs(f(th)));
    const h = [1e-8, 1e-5, 1e-5, 1e-5];
    for (let i = 0; i < 4; i++) {
      const p = th.slice();
      const m = th.slice();
      p[i] += h[i];
      m[i] -= h[i];
      const fd = (f(p) - f(m)) / (2 * h[i]);
      const scaleG = Math.max(...Array.from(d.gradient, Math.abs));
      if (!(Math.abs(d.gradient[i] - fd) <= 1e-6 * scaleG)) throw new Error(`score ${i}: got ${d.gradient[i]}, want ${fd}`);
      const dp = johnsonSuDerivatives(data, p[0], p[1], p[2], p[3])!;
      const dm = johnsonSuDerivatives(data, m[0], m[1], m[2], m[3])!;
      for (let j = 0; j < 4; j++) {
        const want = (dp.gradient[j] - dm.gradient[j]) / (2 * h[i]);
        const got = d.hessian[i * 4 + j];
        if (!(Math.abs(got - want) <= 1e-6 * Math.max(1, Math.abs(want)))) throw new Error(`Hessian ${i},${j}: got ${got}, want ${want}`);
      }
    }
  });

  test.each([
    ["SU draws (interior maximum)", suDraws(3000, 777)],
    ["generalized normal draws (lognormal limit)", Array.from(sample({ location: 0.0004, scale: 0.011, shape: -0.12 }, 1500, 2024))],
  ])("%s: fmin on all four parameters from the fit finds no better point", (_, data) => {
    const fit = fitJohnsonSu(data);
    const p = fit.params;
    const r = nelderMead(
      (v: number[]) => -johnsonSuLogLikelihood(data, { location: v[0], scale: Math.exp(v[1]), gamma: v[2], delta: Math.exp(v[3]) }),
      [p.location, Math.log(p.scale), p.gamma, Math.log(p.delta)],
    );
    if (!(fit.logLikelihood >= -r.fx - 1e-7)) throw new Error(`fit ${fit.logLikelihood}, Nelder–Mead ${-r.fx}`);
    expect(fit.converged).toBe(true);
  });
});
