/**
 * Normal and Cornish–Fisher VaR/ES: the expansion written out in the test (Zangari 1996, from memory), check values
 * published with an open-source statistics library, the normal law at S = K = 0, the modified ES (Boudt, Peterson
 * & Croux 2008) against quadrature of the Edgeworth density (scipy 1.17, runner.py) and against the tail average
 * of the Cornish–Fisher quantile, and the domain of validity (Maillard 2012) against the slope on a grid.
 */
import {
  cornishFisherCdf,
  cornishFisherDomainProblem,
  cornishFisherLawShortfallFactor,
  cornishFisherSlope,
  cornishFisherTail,
  cornishFisherZ,
  modifiedShortfallFactor,
  normalTail,
} from "../../../src/core/methods";
import { gaussLegendre } from "../../../src/core/risk/measures/gaussLegendre";
import { normalPdf, normalQuantile } from "../../../src/core/normal";
import cf from "../../fixtures/methods/cf.json";
import normal from "../../fixtures/methods/normal.json";
import { expectClose } from "../risk/check";

/** The expansion as published, written out term by term here (not the core's grouping). */
function zangari(z: number, S: number, K: number): number {
  return z + (1 / 6) * (z ** 2 - 1) * S + (1 / 24) * (z ** 3 - 3 * z) * K - (1 / 36) * (2 * z ** 3 - 5 * z) * S ** 2;
}

describe("Cornish–Fisher quantile", () => {
  test("equals the expansion written out, on a grid of z, S, K", () => {
    for (const z of [-3.7, -2.326, -1.645, -0.5, 0, 1.2, 2.9]) {
      for (const S of [-1, -0.3, 0, 0.4]) for (const K of [-0.5, 0, 1, 3.5]) {
        expectClose(`g(${z}; ${S}, ${K})`, cornishFisherZ(z, S, K), zangari(z, S, K), { abs: 1e-14, rel: 1e-14 });
      }
    }
  });

  test("matches the check values printed with mir.stat's cornishFisherInvCDF (D library documentation, 7 digits)", () => {
    // (probability, skewness, excess kurtosis) → standardised quantile, as published.
    const published: Array<[number, number, number, number]> = [
      [0.5, 1, 0, -0.1666667],
      [0.9, 0.1, 1, 1.220374],
      [0.99, 0.1, 1, 2.629904],
      [0.99, 0.1, -1, 2.162328],
      [0.01, 0.1, 1, -2.482841],
    ];
    for (const [p, S, K, want] of published) expectClose(`g at p=${p} S=${S} K=${K}`, cornishFisherZ(normalQuantile(p), S, K), want, { abs: 6e-7 });
  });

  test("VaR and ES reduce to the normal law at zero skewness and excess kurtosis", () => {
    const m = { mean: 0.0004, sd: 0.012, skewness: 0, excessKurtosis: 0 };
    for (const c of [0.9, 0.95, 0.975, 0.99, 0.999]) for (const side of ["long", "short"] as const) {
      const a = cornishFisherTail(m, c, side);
      const b = normalTail(m, c, side);
      expectClose(`VaR c=${c} ${side}`, a.valueAtRisk, b.valueAtRisk, { rel: 1e-15 });
      expectClose(`ES c=${c} ${side}`, a.expectedShortfall, b.expectedShortfall, { rel: 1e-15 });
    }
  });

  test("short side is the long side of −X (mean and skewness change sign)", () => {
    const m = { mean: 0.001, sd: 0.02, skewness: -0.4, excessKurtosis: 2 };
    const mirror = { mean: -0.001, sd: 0.02, skewness: 0.4, excessKurtosis: 2 };
    for (const c of [0.95, 0.99]) {
      expect(cornishFisherTail(m, c, "short")).toEqual(cornishFisherTail(mirror, c, "long"));
    }
  });

  test("CDF inverts the expansion: F(μ + σ g(z)) = Φ(z)", () => {
    const m = { mean: 0.001, sd: 0.02, skewness: -0.5, excessKurtosis: 2 };
    for (const z of [-4, -2.326, -1, 0, 0.7, 3]) {
      const x = m.mean + m.sd * cornishFisherZ(z, m.skewness, m.excessKurtosis);
      const want = 0.5 * (1 + erfApprox(z / Math.SQRT2));
      expectClose(`F at z=${z}`, cornishFisherCdf(x, m), want, { abs: 1e-7 });
    }
  });
});

/** erf for the CDF check, Abramowitz & Stegun 7.1.26 (|error| ≤ 1.5e-7), an independent route to Φ. */
function erfApprox(x: number): number {
  const s = Math.sign(x);
  const a = Math.abs(x);
  const t = 1 / (1 + 0.3275911 * a);
  const y = 1 - ((((1.061405429 * t - 1.453152027) * t + 1.421413741) * t - 0.284496736) * t + 0.254829592) * t * Math.exp(-a * a);
  return s * y;
}

describe("normal VaR and ES against scipy 1.17 (norm.ppf; ES by quad of x·pdf)", () => {
  test.each(normal.cases.map((c) => [`μ=${c.mean} σ=${c.sd} tail=${c.tail}`, c] as const))("%s", (_n, c) => {
    const t = normalTail({ mean: c.mean, sd: c.sd, skewness: 0, excessKurtosis: 0 }, 1 - c.tail, "long");
    // 1 − c carries one rounding of the tail (≤ 1.1e-16 absolute): VaR moves by σ·1e-16/φ(z), well inside 1e-12.
    expectClose("VaR", t.valueAtRisk, c.var, { rel: 1e-12 });
    expectClose("ES", t.expectedShortfall, c.es, { rel: 1e-10 });
  });
});

describe("modified ES", () => {
  test.each(cf.cases.map((c) => [`S=${c.skewness} K=${c.excessKurtosis} tail=${c.tail}`, c] as const))(
    "equals the tail mean of the Edgeworth density by quad (scipy 1.17): %s",
    (_n, c) => {
      const g = cornishFisherZ(normalQuantile(c.tail), c.skewness, c.excessKurtosis);
      expectClose("g", g, c.g, { rel: 1e-13 });
      expectClose("ES factor", modifiedShortfallFactor(g, c.tail, c.skewness, c.excessKurtosis), c.modifiedEs, { rel: 1e-10 });
    },
  );

  /** (1/p) ∫_{−∞}^{z_p} g(z)φ(z) dz: the tail average of the CF quantile, by 64-point Gauss–Legendre on [z_p − 14, z_p]. */
  function quantileTailMean(p: number, S: number, K: number): number {
    const rule = gaussLegendre(64);
    const hi = normalQuantile(p);
    const lo = hi - 14;
    let s = 0;
    for (let i = 0; i < rule.nodes.length; i++) {
      const z = lo + ((hi - lo) * (1 + rule.nodes[i])) / 2;
      s += rule.weights[i] * zangari(z, S, K) * normalPdf(z);
    }
    return (-s * (hi - lo)) / 2 / p;
  }

  test("the closed-form ES of the CF law equals scipy's quad of the CF quantile over the tail (runner.py)", () => {
    for (const c of cf.cases) {
      expectClose(`S=${c.skewness} K=${c.excessKurtosis} p=${c.tail}`, cornishFisherLawShortfallFactor(c.tail, c.skewness, c.excessKurtosis), c.quantileTailMean, { rel: 1e-10 });
    }
  });

  test("our quadrature of the CF quantile's tail average agrees with scipy's (runner.py)", () => {
    for (const c of cf.cases) {
      expectClose(`S=${c.skewness} K=${c.excessKurtosis} p=${c.tail}`, quantileTailMean(c.tail, c.skewness, c.excessKurtosis), c.quantileTailMean, { rel: 1e-9 });
    }
  });

  test("approximates the CF quantile's tail average to first order: the gap shrinks like ε² as (S, K) = ε(S0, K0) → 0", () => {
    for (const [S0, K0] of [[-0.5, 2], [0.3, 1], [-0.8, 3]]) for (const p of [0.05, 0.01]) {
      const gap = (e: number) => {
        const S = e * S0;
        const K = e * K0;
        const g = cornishFisherZ(normalQuantile(p), S, K);
        return modifiedShortfallFactor(g, p, S, K) - quantileTailMean(p, S, K);
      };
      // Second order: halving ε quarters the gap (a first-order gap would halve: ratio 2).
      const ratio = gap(0.01) / gap(0.005);
      expectClose(`gap ratio S0=${S0} K0=${K0} p=${p}`, ratio, 4, { abs: 0.25 });
    }
  });

  test("where it falls below the VaR (S = −0.8, K = 3 at 99%), the ES is NaN with the reason and the VaR stands", () => {
    const t = cornishFisherTail({ mean: 0, sd: 1, skewness: -0.8, excessKurtosis: 3 }, 0.99, "long");
    expectClose("VaR", t.valueAtRisk, -zangari(normalQuantile(0.01), -0.8, 3), { rel: 1e-14 });
    expect(t.expectedShortfall).toBeNaN();
    expect(t.shortfallProblem).toMatch(/below the VaR/);
    expect(t.problem).toBeNull();
  });
});

describe("domain of validity (Maillard 2012)", () => {
  /** Points where the slope is probed: a fine grid on [−12, 12] and a log-spaced grid out to |z| = 1e7. */
  const PROBES: number[] = [];
  for (let i = -1200; i <= 1200; i++) PROBES.push(i / 100);
  for (let k = 0; k <= 600; k++) {
    const z = Math.pow(10, 1 + k / 100);
    PROBES.push(z, -z);
  }
  function minSlope(S: number, K: number): number {
    let m = Infinity;
    for (const z of PROBES) m = Math.min(m, cornishFisherSlope(z, S, K));
    return m;
  }

  test("the slope in core is the derivative of the expansion (central differences)", () => {
    for (const [z, S, K] of [[-2, -0.5, 2], [0.3, 0.2, 0.1], [3, -1, 6]]) {
      const h = 1e-5;
      const fd = (zangari(z + h, S, K) - zangari(z - h, S, K)) / (2 * h);
      expectClose(`g'(${z}; ${S}, ${K})`, cornishFisherSlope(z, S, K), fd, { abs: 1e-8 });
    }
  });

  test("the closed-form domain agrees with the sign of the slope on a grid of (S, K)", () => {
    const disagreements: string[] = [];
    for (let i = -12; i <= 12; i++) for (let j = -4; j <= 36; j++) {
      const S = i / 10;
      const K = j / 4;
      const inside = cornishFisherDomainProblem(S, K) === null;
      const slope = minSlope(S, K);
      // Away from the boundary only (|min slope| > 1e-6): on it a grid cannot decide.
      if (Math.abs(slope) > 1e-6 && inside !== slope > 0) disagreements.push(`S=${S.toFixed(2)} K=${K.toFixed(2)} min slope ${slope}`);
    }
    expect(disagreements).toEqual([]);
  });

  test("a known non-monotone case is refused with the reason: skewness without kurtosis (S = −0.5, K = 0)", () => {
    // g′(z) = −z²/24 − z/6 + 1.035 is negative for large |z|: at z = −8, g′ = −0.55.
    expect(cornishFisherSlope(-8, -0.5, 0)).toBeLessThan(0);
    const t = cornishFisherTail({ mean: 0, sd: 0.01, skewness: -0.5, excessKurtosis: 0 }, 0.99, "long");
    expect(t.valueAtRisk).toBeNaN();
    expect(t.problem).toMatch(/excess kurtosis/);
    expect(cornishFisherCdf(0, { mean: 0, sd: 0.01, skewness: -0.5, excessKurtosis: 0 })).toBeNaN();
  });

  test("excess kurtosis too large (S = 0, K = 9: slope 1 − K/8 < 0 at z = 0) is refused", () => {
    expect(cornishFisherSlope(0, 0, 9)).toBeLessThan(0);
    expect(cornishFisherDomainProblem(0, 9)).not.toBeNull();
    expect(cornishFisherDomainProblem(0, 0)).toBeNull();
    expect(cornishFisherDomainProblem(-0.5, 2)).toBeNull();
  });
});
