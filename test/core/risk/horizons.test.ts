/**
 * h-day VaR / ES of the sum of h i.i.d. GNO draws (src/core/risk/horizons/sumLaw.ts) against references built
 * here, independently of the lattice method:
 * - h = 1: the one-day closed form, bit for bit;
 * - shape 0: the normal law of the sum, VaR = √h·α·z_c − h·ξ (textbook; z_c from scipy 1.17 ndtri, printed
 *   to 17 digits);
 * - cumulants: mean h·m, variance h·v, skewness γ/√h, excess kurtosis κ/h (cumulants of independent sums add;
 *   common practice), from the GNO moments in src/core/gno, against moments of the h-day density integrated here;
 * - h = 2: the convolution integral P(X₁ + X₂ ≤ x) = ∫ φ(z) F₁(x − X(z)) dz written out in this file with its own
 *   reduced variate and lognormal partial expectation (E[e^{−kZ}·1{Z ≤ y}] = e^{k²/2}Φ(y + k)), composite
 *   Gauss–Legendre in z, converged by panel doubling;
 * - seeded Monte Carlo at h = 10 for several shapes, within 4 standard errors. 4·10⁴ paths per shape here (jest
 *   runs in a slow sandbox); the bench (bench/horizon.ts) uses the full 10⁶.
 */
import { moments, sample, type GnoParams } from "../../../src/core/gno";
import { normalCdf, normalSf } from "../../../src/core/normal";
import { gaussLegendre } from "../../../src/core/risk/measures/gaussLegendre";
import { expectedShortfall, valueAtRisk } from "../../../src/core/risk/measures/tail";
import { horizonLaw, horizonExpectedShortfall, horizonValueAtRisk, MAX_HORIZON_SHAPE } from "../../../src/core/risk/horizons";
import { expectClose } from "./check";

const P = (location: number, scale: number, shape: number): GnoParams => ({ location, scale, shape });

describe("horizon 1 and shape 0 are exact", () => {
  test("horizon 1 gives the one-day VaR and ES bit for bit (both sides, several shapes)", () => {
    for (const k of [-0.7, -0.2, 0, 1e-9, 0.3, 1.5])
      for (const c of [0.9, 0.99, 0.999])
        for (const side of ["long", "short"] as const) {
          const p = P(0.0005, 0.012, k);
          expect(horizonValueAtRisk(c, p, side, 1)).toBe(valueAtRisk(c, p, side));
          expect(horizonExpectedShortfall(c, p, side, 1)).toBe(expectedShortfall(c, p, side));
        }
  });
  test("shape 0: h-day long VaR = √h·α·z_c − h·ξ and ES = √h·α·φ(z_c)/(1 − c) − h·ξ within 1e-12", () => {
    // z at p = 0.01 and 0.025: scipy 1.17 special.ndtri.
    const zc = { 0.99: 2.3263478740408408, 0.975: 1.9599639845400545 };
    const phi = (z: number) => Math.exp(-z * z / 2) / Math.sqrt(2 * Math.PI);
    for (const h of [1, 2, 10, 60, 250]) {
      const xi = 0.0004;
      const a = 0.011;
      const p = P(xi, a, 0);
      for (const c of [0.99, 0.975] as const) {
        const z = zc[c];
        expectClose(`VaR h=${h} c=${c}`, horizonValueAtRisk(c, p, "long", h), Math.sqrt(h) * a * z - h * xi, { rel: 1e-12 });
        expectClose(`short VaR h=${h} c=${c}`, horizonValueAtRisk(c, p, "short", h), Math.sqrt(h) * a * z + h * xi, { rel: 1e-12 });
        const es = (Math.sqrt(h) * a * phi(z)) / (1 - c);
        expectClose(`ES h=${h} c=${c}`, horizonExpectedShortfall(c, p, "long", h), es - h * xi, { rel: 1e-12 });
        expectClose(`short ES h=${h} c=${c}`, horizonExpectedShortfall(c, p, "short", h), es + h * xi, { rel: 1e-12 });
      }
    }
  });
  test("invalid horizon, confidence or params give NaN; so does a shape beyond MAX_HORIZON_SHAPE at h ≥ 2", () => {
    expect(horizonValueAtRisk(0.99, P(0, 1, MAX_HORIZON_SHAPE + 0.01), "long", 2)).toBeNaN();
    expect(horizonValueAtRisk(0.99, P(0, 1, -MAX_HORIZON_SHAPE), "long", 2)).not.toBeNaN();
    expect(horizonValueAtRisk(0.99, P(0, 1, 0.2), "long", 0)).toBeNaN();
    expect(horizonValueAtRisk(0.99, P(0, 1, 0.2), "long", 2.5)).toBeNaN();
    expect(horizonValueAtRisk(0.99, P(0, 1, 0.2), "long", 251)).toBeNaN();
    expect(horizonValueAtRisk(1, P(0, 1, 0.2), "long", 5)).toBeNaN();
    expect(horizonExpectedShortfall(0.99, P(0, -1, 0.2), "long", 5)).toBeNaN();
  });
});

describe("the two tails of one law agree", () => {
  test.each([-0.75, 0.3, 0.75])("k = %d, h = 250: CDF + survival = 1, long VaR at c = −(short VaR at 1 − c)", (k) => {
    const law = horizonLaw(P(0.0004, 0.011, k), 250);
    for (const x of [-1, 0, 0.5, 1.5]) expectClose(`cdf + sf at ${x}`, law.cdf(x) + law.sf(x), 1, { abs: 1e-12 });
    for (const c of [1e-6, 0.01, 0.3]) {
      expectClose(`mirror c=${c}`, law.valueAtRisk(c, "long"), -law.valueAtRisk(1 - c, "short"), { rel: 1e-9 });
    }
  });
});

// ---------- independent h = 2 reference ----------

const { exp, log1p, expm1, abs } = Math;
/** Reduced variate of the one-day law (own implementation): −log1p(−k(w − ξ)/α)/k; ±∞ beyond the edge. */
function yOf(w: number, p: GnoParams): number {
  const t = (w - p.location) / p.scale;
  const u = -p.shape * t;
  if (u <= -1) return p.shape > 0 ? Infinity : -Infinity;
  return abs(u) < 1e-10 ? t : -log1p(u) / p.shape;
}
/** One-day return at normal score z: ξ − α·expm1(−kz)/k. */
const xOf = (z: number, p: GnoParams) => p.location - (p.scale * expm1(-p.shape * z)) / p.shape;
/** E[X·1{X ≤ w}] for one day (lognormal partial expectation; Johnson, Kotz & Balakrishnan 1994 ch. 14). */
function partialMean(w: number, p: GnoParams): number {
  const y = yOf(w, p);
  const k = p.shape;
  const F = normalCdf(y);
  return p.location * F + (p.scale / k) * (F - exp((k * k) / 2) * normalCdf(y + k));
}

const RULE = gaussLegendre(10);
/** ∫_{−9}^{9} φ(z)·g(z) dz by `panels` Gauss–Legendre panels. */
function integrateZ(g: (z: number) => number, panels: number): number {
  const lo = -9;
  const width = 18 / panels;
  let s = 0;
  for (let i = 0; i < panels; i++) {
    const mid = lo + (i + 0.5) * width;
    for (let j = 0; j < RULE.nodes.length; j++) {
      const z = mid + (width / 2) * RULE.nodes[j];
      s += RULE.weights[j] * exp(-z * z / 2) * g(z);
    }
  }
  return (s * width) / 2 / Math.sqrt(2 * Math.PI);
}
/** Converged reference: n and 2n panels must agree to 1e-11 relative (else the reference itself is off). */
function reference(g: (z: number) => number, panels: number): number {
  const a = integrateZ(g, panels);
  const b = integrateZ(g, 2 * panels);
  expectClose("reference convergence", a, b, { rel: 1e-11, abs: 1e-300 });
  return b;
}

describe("horizon 2 against direct integration of the convolution", () => {
  const shapes = [-0.75, -0.4, -0.1, 0.05, 0.2, 0.5, 0.75];
  test.each(shapes)("k = %d: CDF, survival, VaR and ES on both sides within 1e-8 relative", (k) => {
    const p = P(0.0003, 0.01, k);
    const law = horizonLaw(p, 2);
    // The integrand sharpens with |k| (the edge spike): more panels there.
    const panels = Math.abs(k) > 0.6 ? 1600 : 600;
    const ref = (g: (z: number) => number) => reference(g, panels);
    for (const c of [0.95, 0.99, 0.999]) {
      const tail = 1 - c;
      const tag = `k=${k} c=${c}`;
      const vLong = law.valueAtRisk(c, "long");
      const q = -vLong;
      // The reference CDF at the computed quantile must be the tail probability: a VaR check without a root search.
      const cdfRef = ref((z) => normalCdf(yOf(q - xOf(z, p), p)));
      expectClose(`F2(−VaR) ${tag}`, cdfRef, tail, { rel: 1e-8 });
      expectClose(`cdf ${tag}`, law.cdf(q), cdfRef, { rel: 1e-8 });
      const esRef = -ref((z) => xOf(z, p) * normalCdf(yOf(q - xOf(z, p), p)) + partialMean(q - xOf(z, p), p)) / tail;
      expectClose(`long ES ${tag}`, law.expectedShortfall(c, "long"), esRef, { rel: 1e-8 });

      const vShort = law.valueAtRisk(c, "short");
      const sfRef = ref((z) => normalSf(yOf(vShort - xOf(z, p), p)));
      expectClose(`S2(VaR short) ${tag}`, sfRef, tail, { rel: 1e-8 });
      expectClose(`sf ${tag}`, law.sf(vShort), sfRef, { rel: 1e-8 });
      const mean2 = 2 * moments(p).mean;
      const below = ref((z) => xOf(z, p) * normalCdf(yOf(vShort - xOf(z, p), p)) + partialMean(vShort - xOf(z, p), p));
      expectClose(`short ES ${tag}`, law.expectedShortfall(c, "short"), (mean2 - below) / tail, { rel: 1e-8 });
    }
  });
});

// ---------- cumulants of the h-day density ----------

/** Moments of the h-day law from its density, Gauss–Legendre panels between its 1e-14 and 1 − 1e-14 quantiles. */
function densityMoments(law: ReturnType<typeof horizonLaw>, panels: number): number[] {
  const lo = law.quantile(1e-14);
  const hi = law.quantile(1 - 1e-14);
  const width = (hi - lo) / panels;
  const xs: number[] = [];
  const ws: number[] = [];
  for (let i = 0; i < panels; i++) {
    const mid = lo + (i + 0.5) * width;
    for (let j = 0; j < RULE.nodes.length; j++) {
      const x = mid + (width / 2) * RULE.nodes[j];
      xs.push(x);
      ws.push(((RULE.weights[j] * width) / 2) * law.pdf(x));
    }
  }
  const m0 = ws.reduce((s, w) => s + w, 0);
  const mean = xs.reduce((s, x, i) => s + ws[i] * x, 0) / m0;
  const c = [2, 3, 4].map((r) => xs.reduce((s, x, i) => s + ws[i] * (x - mean) ** r, 0) / m0);
  return [m0, mean, c[0], c[1] / c[0] ** 1.5, c[2] / c[0] ** 2 - 3];
}

describe("cumulants of the h-day sum", () => {
  test.each([
    [-0.3, 5],
    [0.2, 10],
    [0.4, 20],
  ])("k = %d, h = %d: mean h·m, variance h·v, skewness γ/√h, excess kurtosis κ/h", (k, h) => {
    const p = P(0.001, 0.01, k);
    const one = moments(p);
    const [mass, mean, variance, skew, kurt] = densityMoments(horizonLaw(p, h), 200);
    const tag = `k=${k} h=${h}`;
    expectClose(`mass ${tag}`, mass, 1, { abs: 1e-10 });
    expectClose(`mean ${tag}`, mean, h * one.mean, { abs: 1e-10 * one.sd * Math.sqrt(h) });
    expectClose(`variance ${tag}`, variance, h * one.sd * one.sd, { rel: 1e-9 });
    expectClose(`skewness ${tag}`, skew, one.skewness / Math.sqrt(h), { rel: 1e-7 });
    expectClose(`excess kurtosis ${tag}`, kurt, one.excessKurtosis / h, { rel: 1e-6 });
  });
});

// ---------- seeded Monte Carlo ----------

describe("seeded Monte Carlo at horizon 10 (4·10⁴ paths per shape here; 10⁶ in the bench)", () => {
  test.each([-0.5, -0.15, 0.25, 0.6])("k = %d: exceedance rate at the exact VaR and the ES agree within 4 standard errors", (k) => {
    const h = 10;
    const n = 40_000;
    const p = P(0.0002, 0.01, k);
    const draws = sample(p, n * h, 4242 + Math.round(k * 100));
    const sums = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      let s = 0;
      for (let j = 0; j < h; j++) s += draws[i * h + j];
      sums[i] = s;
    }
    const law = horizonLaw(p, h);
    for (const [c, side] of [
      [0.99, "long"],
      [0.975, "short"],
    ] as const) {
      const tail = 1 - c;
      const v = law.valueAtRisk(c, side);
      const loss = (s: number) => (side === "long" ? -s : s);
      let hits = 0;
      let sumLoss = 0;
      let sumLoss2 = 0;
      for (let i = 0; i < n; i++) {
        const l = loss(sums[i]);
        if (l > v) {
          hits++;
          sumLoss += l;
          sumLoss2 += l * l;
        }
      }
      const rateSe = Math.sqrt((tail * (1 - tail)) / n);
      const tag = `k=${k} c=${c} ${side}`;
      expectClose(`exceedance rate ${tag}`, hits / n, tail, { abs: 4 * rateSe });
      // Tail mean beyond the exact VaR: its sampling error from the conditional variance (common practice).
      const tailMean = sumLoss / hits;
      const tailVar = sumLoss2 / hits - tailMean * tailMean;
      const es = law.expectedShortfall(c, side);
      // ES = VaR + E[(L − VaR)⁺]/tail; estimate E[(L − VaR)⁺] by its sample mean.
      const excess = (sumLoss - hits * v) / n;
      const excessSe = Math.sqrt(((tailVar + (tailMean - v) ** 2) * (hits / n)) / n) / tail;
      expectClose(`ES ${tag}`, v + excess / tail, es, { abs: 4 * excessSe });
    }
  });
});
