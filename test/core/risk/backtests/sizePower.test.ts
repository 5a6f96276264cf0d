/**
 * Size and power by seeded simulation (tests that can fail). T = 250 rows at 97.5%, R = 400 replications each.
 *
 * Simulated truth, in PIT terms: the return's PIT u is uniform; in the loss tail (u < α) the loss is Pareto,
 * L = VaR·(α/u)^ξ with ξ = 1/3 (a Student-t(3)-like tail), so ES = VaR/(1 − ξ) = 1.5·VaR. Outside the tail only
 * the PIT matters to every test here, so no body law is needed. VaR varies by row (a volatility cycle).
 * - Correct forecasts: VaR and ES as above, PIT = u.
 * - ES understated by 20%, VaR correct: the forecast tail is Pareto with ξ_f = 1/6 (ES_f = 1.2·VaR = 0.8·ES); the
 *   forecast PIT of a tail loss is α(VaR/L)^{1/ξ_f} = α(u/α)².
 * Acceptance band for a rejection rate at nominal 5%: the binomial(400, 0.05) central 99.8% range [9, 33] / 400
 * (common practice: a band wide enough that a correct test fails it about once in 500 runs).
 */
import { backtestVar } from "../../../../src/core/risk/backtests/backtest";
import { shortfallZ, z2PValueMatchedTails, z2SimulatedPValue } from "../../../../src/core/risk/backtests/shortfallZ";
import { multinomialTest } from "../../../../src/core/risk/backtests/multinomial";
import { tailLikelihoodTest } from "../../../../src/core/risk/backtests/tailLikelihood";
import { shortfallTrafficLight } from "../../../../src/core/risk/backtests/shortfallLight";
import { exceedanceResiduals, exceedanceResidualTest } from "../../../../src/core/risk/backtests/exceedanceResiduals";
import { binomialQuantile } from "../../../../src/core/risk/backtests/binomial";
import { uniformStream } from "../../../../src/core/random";
import { runToEnd } from "../../../../src/core/work";

const R = 400;
const T = 250;
const ALPHA = 0.025;
const XI = 1 / 3;
const VAR = Float64Array.from({ length: T }, (_, t) => 0.01 * (1 + 0.4 * Math.sin(t / 25)));
const LOW = binomialQuantile(0.001, R, 0.05);
const HIGH = binomialQuantile(0.999, R, 0.05);

interface Sample {
  returns: Float64Array;
  pit: Float64Array;
  es: Float64Array;
}

function sample(next: () => number, understated: boolean): Sample {
  const returns = new Float64Array(T);
  const pit = new Float64Array(T);
  const es = new Float64Array(T);
  for (let t = 0; t < T; t++) {
    const u = next();
    const loss = u < ALPHA ? VAR[t] * Math.pow(ALPHA / u, XI) : VAR[t] * (1 - (u - ALPHA) / (1 - ALPHA)) * 0.9;
    returns[t] = -loss;
    pit[t] = understated && u < ALPHA ? ALPHA * (u / ALPHA) ** 2 : u;
    es[t] = (understated ? 1.2 : 1.5) * VAR[t];
  }
  return { returns, pit, es };
}

interface Rates {
  kupiec: number;
  z2: number;
  multinomial: number;
  berkowitz: number;
  light: number;
}

function rejectionRates(seed: number, understated: boolean, replications: number): Rates {
  const next = uniformStream(seed);
  const n = { kupiec: 0, z2: 0, multinomial: 0, berkowitz: 0, light: 0 };
  for (let r = 0; r < replications; r++) {
    const s = sample(next, understated);
    if (backtestVar(s.returns, VAR, 1 - ALPHA)!.kupiec.pValue < 0.05) n.kupiec++;
    if (shortfallZ(s.returns, VAR, s.es, 1 - ALPHA)!.z2Reject5) n.z2++;
    if (multinomialTest(s.pit, 1 - ALPHA)!.nassPValue < 0.05) n.multinomial++;
    const b = tailLikelihoodTest(s.pit, 1 - ALPHA)!;
    if (b.informative && b.pValue < 0.05) n.berkowitz++;
    // One-sided at 5%: Φ(Z) ≥ 0.95 is the yellow-or-red signal.
    if (shortfallTrafficLight(s.pit, 1 - ALPHA)!.zone !== "green") n.light++;
  }
  return n;
}

/** Replications of the power scenario (more than R: the power differences at T = 250 are modest). */
const POWER_R = 800;

function expectMoreOften(label: string, a: number, b: number): void {
  const pa = a / POWER_R;
  const pb = b / POWER_R;
  const pool = (a + b) / (2 * POWER_R);
  const z = (pa - pb) / Math.sqrt((pool * (1 - pool) * 2) / POWER_R);
  if (!(z > 2.33)) throw new Error(`${label}: ${a}/${POWER_R} rejections vs Kupiec ${b}/${POWER_R}, z = ${z.toFixed(2)} ≤ 2.33`);
}

function expectInBand(label: string, count: number): void {
  if (!(count >= LOW && count <= HIGH)) throw new Error(`${label}: ${count}/${R} rejections, band [${LOW}, ${HIGH}]`);
}

describe("size and power, T = 250 at 97.5%, 400 replications", () => {
  const correct = rejectionRates(101, false, R);
  const wrong = rejectionRates(202, true, POWER_R);
  // eslint-disable-next-line no-console
  console.log(`rejections /${R} correct`, correct, `/${POWER_R} ES understated 20%`, wrong, "band", [LOW, HIGH]);

  test("with correct forecasts the multinomial (Nass), Berkowitz and ES traffic-light tests reject near 5%", () => {
    expectInBand("multinomial", correct.multinomial);
    expectInBand("Berkowitz", correct.berkowitz);
    expectInBand("ES traffic light", correct.light);
  });
  test("Kupiec at 5% under correct forecasts stays in the band (the reference the ES tests are compared with)", () => {
    expectInBand("Kupiec", correct.kupiec);
  });
  test("Z2 with the paper's −0.70 critical value: size near 5% for a t(3)-like tail", () => {
    expectInBand("Z2", correct.z2);
  });
  test("ES understated by 20%, VaR correct: Z2 and the multinomial test reject clearly more often than Kupiec", () => {
    // Kupiec sees only the count, whose law is unchanged: it stays at its size.
    expect(wrong.kupiec / POWER_R).toBeLessThan(0.1);
    // "Clearly": the two-proportion z statistic exceeds 2.33 (one-sided 1%; common practice).
    expectMoreOften("Z2", wrong.z2, wrong.kupiec);
    expectMoreOften("multinomial", wrong.multinomial, wrong.kupiec);
    expectMoreOften("Berkowitz", wrong.berkowitz, wrong.kupiec);
    expectMoreOften("ES traffic light", wrong.light, wrong.kupiec);
  });
});

describe("simulated p-values hold their size exactly (Monte Carlo test with B = 19)", () => {
  test("Z2 simulated p-value ≤ 0.05 in 5% ± band of 400 replications under the true laws", () => {
    const next = uniformStream(303);
    const tail = (t: number, u: number) => VAR[t] * Math.pow(ALPHA / u, XI);
    let rejections = 0;
    for (let r = 0; r < R; r++) {
      const s = sample(next, false);
      const z = shortfallZ(s.returns, VAR, s.es, 1 - ALPHA)!.z2;
      if (runToEnd(z2SimulatedPValue(z, s.es, tail, 1 - ALPHA, 19, 1000 + r)).pValue <= 0.05) rejections++;
    }
    expectInBand("Z2 simulated", rejections);
  });
  test("matched exponential tails (the cells' approximation) keep the size under a heavier Pareto truth", () => {
    const next = uniformStream(404);
    let rejections = 0;
    for (let r = 0; r < R; r++) {
      const s = sample(next, false);
      const z = shortfallZ(s.returns, VAR, s.es, 1 - ALPHA)!.z2;
      if (runToEnd(z2PValueMatchedTails(z, VAR, s.es, 1 - ALPHA, 19, 2000 + r)).pValue <= 0.05) rejections++;
    }
    // eslint-disable-next-line no-console
    console.log("matched-tail Z2 size (Pareto truth):", rejections, "/", R);
    expectInBand("Z2 matched tails", rejections);
  });
  test("McNeil–Frey bootstrap under correct forecasts (T = 1000, 99 resamples) rejects near 5%", () => {
    const next = uniformStream(505);
    let rejections = 0;
    const big = 1000;
    const v = Float64Array.from({ length: big }, (_, t) => VAR[t % T]);
    for (let r = 0; r < R; r++) {
      const x = new Float64Array(big);
      const e = new Float64Array(big);
      for (let t = 0; t < big; t++) {
        const u = next();
        // Exponential tail beyond VaR with mean excess 0.5·VaR (ES = 1.5·VaR): residuals (L − ES)/(ES − VaR) ~ Exp(1) − 1.
        x[t] = u < ALPHA ? -(v[t] + 0.5 * v[t] * Math.log(ALPHA / u)) : 0;
        e[t] = 1.5 * v[t];
      }
      const res = exceedanceResiduals(x, v, e).residuals;
      const p = runToEnd(exceedanceResidualTest(res, 99, 3000 + r)).pValue;
      if (p <= 0.05) rejections++;
    }
    // eslint-disable-next-line no-console
    console.log("McNeil–Frey size:", rejections, "/", R);
    expectInBand("McNeil-Frey", rejections);
  });
});
