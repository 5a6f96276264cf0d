/**
 * Gamma-type helpers against jstat (accurate for gamma/beta, DEVELOPERS.md) and exact identities.
 */
import { jStat } from "../../refs/jstat";
import { lnGamma, regularizedBeta } from "../../../src/core/special";

function expectRel(label: string, got: number, want: number, rel: number): void {
  const diff = Math.abs(got - want);
  if (!(diff <= rel * Math.max(1, Math.abs(want)))) {
    throw new Error(`${label}: got ${got}, want ${want}, |diff| ${diff} > tol ${rel}·max(1,|want|)`);
  }
}

describe("lnGamma", () => {
  test("exact values: ln Γ(n) = ln (n−1)!, ln Γ(1/2) = ln √π, reflection at −1/2", () => {
    let f = 1;
    for (let n = 1; n <= 25; n++) {
      expectRel(`lnGamma(${n})`, lnGamma(n), Math.log(f), 2e-15);
      f *= n;
    }
    expectRel("lnGamma(0.5)", lnGamma(0.5), 0.5 * Math.log(Math.PI), 2e-15);
    // Γ(−1/2) = −2√π.
    expectRel("lnGamma(-0.5)", lnGamma(-0.5), Math.log(2 * Math.sqrt(Math.PI)), 2e-15);
  });
  test("agrees with jStat.gammaln on (0.01, 500)", () => {
    for (let x = 0.01; x < 500; x *= 1.37) expectRel(`lnGamma(${x})`, lnGamma(x), jStat.gammaln(x), 1e-9);
  });
  test("poles and NaN", () => {
    expect(lnGamma(0)).toBe(Infinity);
    expect(lnGamma(-3)).toBe(Infinity);
    expect(lnGamma(NaN)).toBeNaN();
  });
});

describe("regularizedBeta", () => {
  test("agrees with jStat.ibeta over a grid (jstat itself is 1.8e-8 off at I_0.5(½,½) = ½ exactly, hence 5e-8; closed forms below carry the precision)", () => {
    for (const a of [0.5, 1, 2.5, 10, 60]) {
      for (const b of [0.5, 1, 3, 25]) {
        for (const x of [0.001, 0.1, 0.37, 0.5, 0.8, 0.999]) {
          expectRel(`I_${x}(${a},${b})`, regularizedBeta(x, a, b), jStat.ibeta(x, a, b), 5e-8);
        }
      }
    }
  });
  test("closed forms: I_x(1,1) = x, I_x(a,1) = x^a, I_x(1/2,1/2) = (2/π) asin √x", () => {
    for (const x of [0.001, 0.1, 0.5, 0.93]) {
      expectRel(`I_${x}(1/2,1/2)`, regularizedBeta(x, 0.5, 0.5), (2 / Math.PI) * Math.asin(Math.sqrt(x)), 1e-14);
    }
    expectRel("I(1,1)", regularizedBeta(0.3, 1, 1), 0.3, 1e-15);
    expectRel("I(2.5,1)", regularizedBeta(0.3, 2.5, 1), Math.pow(0.3, 2.5), 1e-14);
  });
  test("edges and domain", () => {
    expect(regularizedBeta(0, 2, 3)).toBe(0);
    expect(regularizedBeta(1, 2, 3)).toBe(1);
    expect(regularizedBeta(0.5, 0, 3)).toBeNaN();
    expect(regularizedBeta(1.5, 1, 3)).toBeNaN();
  });
});
