/**
 * Comparison families against outside references: textbook densities; log-likelihoods recomputed with scipy 1.17 outside the repo check values (scipy-based [chk]), jstat
 * (Student t pdf/cdf, normal pdf in the body), closed-form quantiles, fmin's independent Nelder–Mead on the full
 * likelihood, and recovery of known parameters from seeded simulations built from other representations.
 */
import { jStat } from "../../refs/jstat";
import { nelderMead } from "../../refs/fmin";
import { xoroshiro128plus } from "pure-rand/generator/xoroshiro128plus";
import { uniformFloat64 } from "pure-rand/distribution/uniformFloat64";
import { normalQuantile } from "../../../src/core/normal";
import {
  asymmetricLaplaceLogLikelihood,
  asymmetricLaplaceQuantile,
  fitAsymmetricLaplace,
} from "../../../src/core/compare/asymmetricLaplace";
import {
  fitStudentT,
  studentTLogLikelihood,
  studentTStandardCdf,
  studentTStandardQuantile,
} from "../../../src/core/compare/studentT";
import { fitJohnsonSu, johnsonSuLogLikelihood, johnsonSuQuantile } from "../../../src/core/compare/johnsonSu";

function expectClose(label: string, got: number, want: number, tol: number): void {
  const diff = Math.abs(got - want);
  if (!(diff <= tol)) throw new Error(`${label}: got ${got}, want ${want}, |diff| ${diff} > tol ${tol}`);
}

function uniforms(seed: number): () => number {
  const g = xoroshiro128plus(seed);
  return () => {
    let u = 0;
    while (u === 0) u = uniformFloat64(g);
    return u;
  };
}
const XS = [-0.021, 0.004, 0.013, -0.007, 0.002];

describe("Student t family", () => {
  test("textbook densities; log-likelihoods recomputed with scipy 1.17 outside the repo: lnL(xs; μ=0.001, s=0.01, ν=4) = 14.937592891058568", () => {
    expectClose("lnL", studentTLogLikelihood(XS, { location: 0.001, scale: 0.01, dof: 4 }), 14.937592891058568, 1e-12);
  });
  test("log-likelihood agrees with jStat.studentt.pdf (jstat's betafn is ~4e-8 relative off at non-integer ν)", () => {
    const u = uniforms(7);
    const data = Array.from({ length: 50 }, () => 0.02 * normalQuantile(u()));
    for (const dof of [2.5, 4, 11, 150]) {
      const p = { location: 0.002, scale: 0.013, dof };
      let want = 0;
      for (const x of data) want += Math.log(jStat.studentt.pdf((x - p.location) / p.scale, dof) / p.scale);
      // Per-point tolerance 5e-8 (jstat's Beta function error, measured against Python math.lgamma below).
      expectClose(`lnL ν=${dof}`, studentTLogLikelihood(data, p), want, 5e-8 * data.length);
    }
    // Normalising constant at ν = 2.5: lnΓ(1.75) − lnΓ(1.25) = 0.013870715401327116 (Python 3 math.lgamma).
    const p = { location: 0, scale: 1, dof: 2.5 };
    const want = 0.013870715401327116 - 0.5 * Math.log(2.5 * Math.PI);
    expectClose("ln f(0; ν=2.5)", studentTLogLikelihood([0], p), want, 1e-14);
  });
  test("CDF agrees with jStat.studentt.cdf; quantile has closed forms at ν = 1, 2 and inverts the CDF", () => {
    for (const nu of [2.2, 5, 30]) for (const t of [-8, -2.3, -0.4, 0.7, 3]) {
      expectClose(`F(${t};${nu})`, studentTStandardCdf(t, nu), jStat.studentt.cdf(t, nu), 1e-8);
    }
    for (const p of [1e-6, 0.01, 0.3, 0.8]) {
      // ν = 1 (Cauchy): tan(π(p − ½)); ν = 2: (2p − 1)/√(2p(1 − p)) — textbook closed forms (from memory).
      expectClose(`q1(${p})`, studentTStandardQuantile(p, 1), Math.tan(Math.PI * (p - 0.5)), 1e-9 * Math.max(1, Math.abs(Math.tan(Math.PI * (p - 0.5)))));
      expectClose(`q2(${p})`, studentTStandardQuantile(p, 2), (2 * p - 1) / Math.sqrt(2 * p * (1 - p)), 1e-10 * Math.max(1, 1 / Math.sqrt(p)));
      const q = studentTStandardQuantile(p, 4.5);
      expectClose(`F(q(${p}))`, studentTStandardCdf(q, 4.5), p, 1e-13 * Math.max(p, 1e-3));
    }
  });
  test("fit recovers (μ, s, ν) = (0.0005, 0.01, 5) from 4,000 simulated points (Z/√(χ²₅/5))", () => {
    const u = uniforms(11);
    const data = Array.from({ length: 4000 }, () => {
      let chi = 0;
      for (let i = 0; i < 5; i++) chi += normalQuantile(u()) ** 2;
      return 0.0005 + 0.01 * (normalQuantile(u()) / Math.sqrt(chi / 5));
    });
    const f = fitStudentT(data);
    // Bands ≈ 4 asymptotic standard errors at n = 4000 (rough, common practice).
    expectClose("location", f.params.location, 0.0005, 0.0007);
    expectClose("scale", f.params.scale, 0.01, 0.0008);
    expectClose("dof", f.params.dof, 5, 2);
    // fmin's Nelder–Mead on (μ, ln s, ln ν) from the truth must not find a higher likelihood.
    const r = nelderMead((v: number[]) => -studentTLogLikelihood(data, { location: v[0], scale: Math.exp(v[1]), dof: Math.exp(v[2]) }), [0.0005, Math.log(0.01), Math.log(5)]);
    expect(f.logLikelihood).toBeGreaterThanOrEqual(-r.fx - 1e-6);
  });
});

describe("asymmetric Laplace family (Kozubowski–Podgórski form)", () => {
  test("textbook densities; log-likelihoods recomputed with scipy 1.17 outside the repo: lnL(xs; m=0.0005, s=0.008, κ=1.3) = 14.873472502318686", () => {
    expectClose("lnL", asymmetricLaplaceLogLikelihood(XS, { location: 0.0005, scale: 0.008, kappa: 1.3 }), 14.873472502318686, 1e-12);
  });
  test("quantile inverts the numerically integrated density (trapezium, 2e5 steps)", () => {
    const p = { location: 0.001, scale: 0.01, kappa: 1.4 };
    for (const prob of [0.01, 0.3, 0.8]) {
      const q = asymmetricLaplaceQuantile(prob, p);
      const lo = p.location - 0.6;
      const steps = 200000;
      const h = (q - lo) / steps;
      let s = 0;
      for (let i = 0; i <= steps; i++) {
        const w = i === 0 || i === steps ? 0.5 : 1;
        s += w * Math.exp(asymmetricLaplaceLogLikelihood([lo + i * h], p));
      }
      expectClose(`∫ f up to q(${prob})`, s * h, prob, 2e-6);
    }
  });
  test("exact fit: no better point found by fmin from several starts; recovers (0, 0.01, 1.3) from E1/κ − κE2 draws", () => {
    const u = uniforms(23);
    const truth = { location: 0, scale: 0.01, kappa: 1.3 };
    // Representation X = m + s(E1/κ − κE2), E1, E2 ~ Exp(1) (checked here against the density's two tails).
    const data = Array.from({ length: 4000 }, () => truth.location + truth.scale * (-Math.log(u()) / truth.kappa + truth.kappa * Math.log(u())));
    const f = fitAsymmetricLaplace(data);
    expectClose("location", f.params.location, 0, 0.001);
    expectClose("scale", f.params.scale, 0.01, 0.0006);
    expectClose("kappa", f.params.kappa, 1.3, 0.08);
    for (const start of [[0, -4.6, 0], [0.002, -4, 0.5], [-0.003, -5, -0.3]]) {
      const r = nelderMead((v: number[]) => -asymmetricLaplaceLogLikelihood(data, { location: v[0], scale: Math.exp(v[1]), kappa: Math.exp(v[2]) }), start);
      expect(f.logLikelihood).toBeGreaterThanOrEqual(-r.fx - 1e-9);
    }
  });
});

describe("Johnson SU family", () => {
  test("log-likelihood agrees with the change-of-variable density built on jStat.normal.pdf", () => {
    const p = { location: 0.001, scale: 0.012, gamma: 0.4, delta: 1.7 };
    let want = 0;
    for (const x of XS) {
      const u = (x - p.location) / p.scale;
      want += Math.log((jStat.normal.pdf(p.gamma + p.delta * Math.asinh(u), 0, 1) * p.delta) / (p.scale * Math.sqrt(1 + u * u)));
    }
    expectClose("lnL", johnsonSuLogLikelihood(XS, p), want, 1e-12 * Math.abs(want));
  });
  test("quantile maps back to the normal quantile through γ + δ asinh((x − ξ)/λ) (jStat.normal.inv in the body)", () => {
    const p = { location: 0.001, scale: 0.012, gamma: 0.4, delta: 1.7 };
    for (const prob of [0.01, 0.5, 0.9]) {
      const x = johnsonSuQuantile(prob, p);
      expectClose(`z(${prob})`, p.gamma + p.delta * Math.asinh((x - p.location) / p.scale), jStat.normal.inv(prob, 0, 1), 1e-7);
    }
  });
  test("fit recovers a skewed SU law and no better point is found by fmin on all four parameters", () => {
    const u = uniforms(31);
    const t = { location: 0.001, scale: 0.01, gamma: 0.5, delta: 1.5 };
    const data = Array.from({ length: 4000 }, () => t.location + t.scale * Math.sinh((normalQuantile(u()) - t.gamma) / t.delta));
    const f = fitJohnsonSu(data);
    // Compare quantiles rather than raw parameters (SU parameters are strongly correlated).
    for (const prob of [0.01, 0.1, 0.5, 0.9, 0.99]) {
      const want = johnsonSuQuantile(prob, t);
      expectClose(`q(${prob})`, johnsonSuQuantile(prob, f.params), want, 0.15 * Math.abs(want) + 0.001);
    }
    const r = nelderMead(
      (v: number[]) => -johnsonSuLogLikelihood(data, { location: v[0], scale: Math.exp(v[1]), gamma: v[2], delta: Math.exp(v[3]) }),
      [t.location, Math.log(t.scale), t.gamma, Math.log(t.delta)],
    );
    expect(f.logLikelihood).toBeGreaterThanOrEqual(-r.fx - 1e-6);
  });
});
