/**
 * Normal kernels: Φ(Φ⁻¹(p)) = p from p = 1e-300 to ½ and ln Φ against ln of Φ, over seeded log-uniform draws.
 * Φ(z(1 + δ)) ≈ p(1 + z²δ) in the tail, so the tolerance is (8 + 4z²)ε relative: the inverse's own relative error δ
 * is amplified by z², and Φ adds a few ulp. (Tight values against 50-digit references: test/core/gno/precise.test.ts.)
 */
import fc from "fast-check";
import { logNormalCdf, normalCdf, normalQuantile, normalQuantileUpper, normalSf } from "../../../src/core/normal";

const EPS = 2 ** -52;

describe("normal round trips (fast-check, seed 7)", () => {
  test("Φ(Φ⁻¹(p)) = p and 1 − Φ(Φ⁻¹(1 − p)) = p for log10 p uniform on [−300, log10 ½]", () => {
    fc.assert(
      fc.property(fc.double({ min: -300, max: Math.log10(0.5), noNaN: true }), (e) => {
        const p = 10 ** e;
        const z = normalQuantile(p);
        const tol = (8 + 4 * z * z) * EPS;
        const back = normalCdf(z);
        const upper = normalSf(normalQuantileUpper(p));
        if (!(Math.abs(back - p) <= tol * p && Math.abs(upper - p) <= tol * p)) {
          throw new Error(`p=${p}: z=${z}, Φ(z)=${back}, 1−Φ(−z)=${upper}, tol ${tol}`);
        }
        return true;
      }),
      { seed: 7, numRuns: 2000 },
    );
  });
  test("ln Φ(x) = ln(Φ(x)) wherever Φ(x) is a normal double, and ln Φ(x) ~ −x²/2 − ln(−x√(2π)) far below", () => {
    for (let x = -37; x <= 8; x += 0.0625) {
      const want = Math.log(normalCdf(x));
      const got = logNormalCdf(x);
      if (!(Math.abs(got - want) <= 4 * EPS * Math.max(1, Math.abs(want)))) throw new Error(`ln Φ(${x}): got ${got}, want ${want}`);
    }
    // Asymptotic series ln Φ(x) = −x²/2 − ln(−x) − ½ln(2π) + ln(1 − 1/x² + 3/x⁴ − …) (Abramowitz & Stegun 26.2.12).
    for (const x of [-1e3, -1e4, -1e6, -1e8]) {
      const want = (-x * x) / 2 - Math.log(-x) - 0.5 * Math.log(2 * Math.PI) + Math.log1p(-1 / (x * x) + 3 / x ** 4);
      const got = logNormalCdf(x);
      if (!(Math.abs(got - want) <= 2 * EPS * Math.abs(want))) throw new Error(`ln Φ(${x}): got ${got}, want ${want}`);
    }
  });
});
