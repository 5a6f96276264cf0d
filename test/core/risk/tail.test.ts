/**
 * VaR and expected shortfall of the GNO law against outside references:
 * - 80-digit decimal.js values of the closed form (test/fixtures/risk/runner.ts): shape near 0 and general shapes;
 * - lognormal partial expectation with the Hosking & Wallis 1997 App. A.8 law; values recomputed with mpmath (40 digits) outside the repo [chk] check values (ξ = 0.001, α = 0.01; k = −0.2 and 0.3);
 * - numerical integration of the GNO quantile function (ES = mean of the quantile over the tail), in double;
 * - the GNO quantile itself (VaR), and the normal ES at shape 0 (textbook: ξ − α φ(z)/p).
 */
import { normalCdf, normalPdf, normalQuantile } from "../../../src/core/normal";
import { edge, quantile, quantileUpper, type GnoParams } from "../../../src/core/gno";
import { expectedShortfall, tailRisk, valueAtRisk } from "../../../src/core/risk/measures/tail";
import { gaussLegendre } from "../../../src/core/risk/measures/gaussLegendre";
import nearZero from "../../fixtures/risk/tail_shape_near_zero.json";
import general from "../../fixtures/risk/tail_general.json";
import { expectClose } from "./check";

interface TailCase {
  params: GnoParams;
  confidence: number;
  longVaR: string;
  longES: string;
  shortVaR: string;
  shortES: string;
}

const EPS = 2.220446049250313e-16;

function checkCases(cases: TailCase[], tol: { var: number; es: number }): void {
  for (const c of cases) {
    const tag = `(c=${c.confidence}, ξ=${c.params.location}, α=${c.params.scale}, k=${c.params.shape})`;
    // Tolerances relative to the scale α: VaR/ES may pass through 0 at low confidence.
    const abs = (k: number): number => k * EPS * c.params.scale;
    expectClose(`long VaR ${tag}`, valueAtRisk(c.confidence, c.params, "long"), Number(c.longVaR), { abs: abs(tol.var), rel: tol.var * EPS });
    expectClose(`short VaR ${tag}`, valueAtRisk(c.confidence, c.params, "short"), Number(c.shortVaR), { abs: abs(tol.var), rel: tol.var * EPS });
    expectClose(`long ES ${tag}`, expectedShortfall(c.confidence, c.params, "long"), Number(c.longES), { abs: abs(tol.es), rel: tol.es * EPS });
    expectClose(`short ES ${tag}`, expectedShortfall(c.confidence, c.params, "short"), Number(c.shortES), { abs: abs(tol.es), rel: tol.es * EPS });
  }
}

describe("VaR and ES against 80-digit references", () => {
  test("shape near 0 (|k| ≤ 1e-3, including ±1e-9): no cancellation; within 32 ε", () => {
    checkCases(nearZero.cases as TailCase[], { var: 32, es: 32 });
  });
  test("general shapes (|k| from 0.05 to 2.5, c from 0.5 to 0.9999): within 64 ε", () => {
    checkCases(general.cases as TailCase[], { var: 64, es: 64 });
  });
});

describe("lognormal partial expectation with the Hosking & Wallis 1997 App. A.8 law; values recomputed with mpmath (40 digits) outside the repo check values (ξ = 0.001, α = 0.01)", () => {
  const cases: Array<[number, number, number, number]> = [
    // [shape, tail probability p, q_p, E[X | X ≤ q_p]]  [chk]
    [-0.2, 0.01, -0.0176017100694712, -0.0196040991536847],
    [-0.2, 0.025, -0.0152145509431477, -0.0176028367464197],
    [0.3, 0.01, -0.0326512343336949, -0.0401597997067423],
    [0.3, 0.025, -0.0256788197249012, -0.0332551976133056],
  ];
  test.each(cases)("k = %d, p = %d", (k, p, q, e) => {
    const par = { location: 0.001, scale: 0.01, shape: k };
    expectClose(`VaR k=${k} c=${1 - p}`, valueAtRisk(1 - p, par), -q, { rel: 1e-13 });
    expectClose(`ES k=${k} c=${1 - p}`, expectedShortfall(1 - p, par), -e, { rel: 1e-13 });
  });
  test("upper-tail mean beyond the 99% quantile for k = −0.2 is 0.0363763259731979 (short ES at 99%)", () => {
    expectClose("short ES", expectedShortfall(0.99, { location: 0.001, scale: 0.01, shape: -0.2 }, "short"), 0.0363763259731979, { rel: 1e-13 });
  });
});

describe("ES equals the mean of the quantile function over the tail (numerical integration)", () => {
  // ES_long = −(1/p) ∫_0^p Q(u) du = −(1/p) ∫_{−∞}^{z_p} Q(Φ(t)) φ(t) dt: composite 16-point Gauss–Legendre
  // over [z_p − 14, z_p] in 280 panels (the density beyond 14 below z_p is < 1e-40 of the tail).
  const rule = gaussLegendre(16);
  function tailMeanByQuadrature(c: number, par: GnoParams, side: "long" | "short"): number {
    const p = 1 - c;
    const z = normalQuantile(p);
    const lo = z - 14;
    const panels = 280;
    const h = (z - lo) / panels;
    let s = 0;
    for (let j = 0; j < panels; j++) {
      const a = lo + j * h;
      for (let i = 0; i < rule.nodes.length; i++) {
        const t = a + (h / 2) * (1 + rule.nodes[i]);
        // Long: the lower tail of X, quantile at Φ(t). Short: the upper tail, quantile at 1 − Φ(t), formed
        // without the subtraction (quantileUpper) so the far tail keeps its digits.
        const x = side === "long" ? quantile(normalCdf(t), par) : quantileUpper(normalCdf(t), par);
        s += (h / 2) * rule.weights[i] * x * normalPdf(t);
      }
    }
    return side === "long" ? -s / p : s / p;
  }
  const shapes = [-1.2, -0.4, -0.05, 0, 1e-7, 0.05, 0.4, 1.2];
  const levels = [0.9, 0.975, 0.99, 0.9999];
  test.each(shapes)("k = %d at c = 0.9, 0.975, 0.99, 0.9999, both sides, within 1e-11 relative", (k) => {
    const par = { location: 0.0005, scale: 0.012, shape: k };
    for (const c of levels) {
      for (const side of ["long", "short"] as const) {
        expectClose(`ES ${side} k=${k} c=${c}`, expectedShortfall(c, par, side), tailMeanByQuadrature(c, par, side), { rel: 1e-11 });
      }
    }
  });
});

describe("VaR is the GNO quantile; shape 0 is the normal law", () => {
  test("long VaR = −Q(1 − c), short VaR = Q(c)", () => {
    for (const k of [-0.7, -0.1, 0, 0.2, 0.9]) {
      const par = { location: 0.001, scale: 0.02, shape: k };
      for (const c of [0.6, 0.95, 0.99, 0.999]) {
        expectClose(`long k=${k} c=${c}`, valueAtRisk(c, par, "long"), -quantile(1 - c, par), { rel: 4 * EPS, abs: 1e-18 });
        expectClose(`short k=${k} c=${c}`, valueAtRisk(c, par, "short"), quantile(c, par), { rel: 4 * EPS, abs: 1e-18 });
      }
    }
  });
  test("ES at shape 0 is the normal ES −ξ + α φ(z_p)/p (textbook closed form)", () => {
    const par = { location: 0.0003, scale: 0.015, shape: 0 };
    for (const c of [0.9, 0.99, 0.9999]) {
      const p = 1 - c;
      const want = -par.location + (par.scale * normalPdf(normalQuantile(p))) / p;
      expectClose(`normal ES c=${c}`, expectedShortfall(c, par), want, { rel: 8 * EPS });
    }
  });
  test("ES ≥ VaR on both sides, and a negative VaR (a gain) at low confidence is returned as is", () => {
    const par = { location: 0.01, scale: 0.01, shape: 0.3 };
    expect(valueAtRisk(0.3, par)).toBeLessThan(0);
    for (const c of [0.3, 0.9, 0.99]) {
      for (const side of ["long", "short"] as const) {
        expect(expectedShortfall(c, par, side)).toBeGreaterThan(valueAtRisk(c, par, side));
      }
    }
  });
});

describe("edges and guards", () => {
  test("k < 0 (long) and k > 0 (short): losses capped by the edge, VaR and ES below the cap", () => {
    const right = { location: 0, scale: 0.01, shape: -0.8 };
    const r = tailRisk(0.9999, right, "long");
    expect(r.cappedByEdge).toBe(true);
    expectClose("loss cap", r.lossCap!, -edge(right)!.value, { rel: 1e-15 });
    expect(r.valueAtRisk).toBeLessThan(r.lossCap!);
    expect(r.expectedShortfall).toBeLessThan(r.lossCap!);
    const left = { location: 0, scale: 0.01, shape: 0.8 };
    const s = tailRisk(0.9999, left, "short");
    expect(s.cappedByEdge).toBe(true);
    expectClose("loss cap (short)", s.lossCap!, edge(left)!.value, { rel: 1e-15 });
    expect(s.expectedShortfall).toBeLessThan(s.lossCap!);
    expect(tailRisk(0.99, left, "long").cappedByEdge).toBe(false);
    expect(tailRisk(0.99, { location: 0, scale: 1, shape: 0 }).lossCap).toBeNull();
  });
  test("confidence outside (0, 1) or invalid parameters give NaN", () => {
    const par = { location: 0, scale: 1, shape: 0.1 };
    for (const c of [0, 1, -0.5, 1.5, NaN]) {
      expect(valueAtRisk(c, par)).toBeNaN();
      expect(expectedShortfall(c, par)).toBeNaN();
    }
    expect(valueAtRisk(0.99, { location: 0, scale: -1, shape: 0 })).toBeNaN();
    expect(expectedShortfall(0.99, { location: 0, scale: 0, shape: 0 })).toBeNaN();
  });
});
