/**
 * Berkowitz (2001), "Testing density forecasts, with applications to risk management", J. Business & Economic
 * Statistics 19:465–474, §3 (tail test): zₜ = Φ⁻¹(uₜ) of the PIT column is N(0, 1) under correct forecasts. Only
 * the tail below the VaR level is kept: zₜ is observed when zₜ < c = Φ⁻¹(1 − confidence) and censored (known
 * only to lie at or above c) otherwise. The censored-normal log-likelihood
 *   ℓ(μ, σ) = Σ_tail ln(φ((zₜ − μ)/σ)/σ) + m·ln(1 − Φ((c − μ)/σ))
 * is maximised and LR = 2[ℓ(μ̂, σ̂) − ℓ(0, 1)] ~ χ²₂. For a short position the tail is the upper one (zₜ → −zₜ).
 *
 * Maximisation: Olsen's (1978) parametrisation β = μ/σ, θ = 1/σ makes the censored-normal (Tobit) likelihood
 * globally concave, so Newton's method with step halving from (0, 1) converges. The likelihood depends on the
 * data only through n (tail count), Σz, Σz² and m (censored count).
 * Needs at least 2 distinct tail values and one censored row; otherwise the test is flagged not informative.
 */
import { logNormalCdf, normalQuantile } from "../../normal";
import type { RiskSide } from "../measures/side";
import { chiSquare2Sf } from "./chiSquare";

export interface TailLikelihoodTest {
  readonly confidence: number;
  readonly observations: number;
  readonly tailCount: number;
  /** MLE of the mean and standard deviation of Φ⁻¹(PIT) (1 and 0 under H0); NaN when not informative. */
  readonly mean: number;
  readonly sd: number;
  readonly statistic: number;
  readonly pValue: number;
  readonly informative: boolean;
}

/** Smallest PIT used (a PIT of exactly 0 is moved here, so Φ⁻¹ stays finite: z ≈ −37). */
const PIT_FLOOR = 1e-300;

interface TailStats {
  readonly n: number;
  readonly s1: number;
  readonly s2: number;
  readonly m: number;
  readonly c: number;
}

/** Censored-normal log-likelihood in (β, θ), constants dropped; −Infinity for θ ≤ 0. */
function logLik(t: TailStats, beta: number, theta: number): number {
  if (!(theta > 0)) return -Infinity;
  const tail = t.n * Math.log(theta) - 0.5 * (theta * theta * t.s2 - 2 * theta * beta * t.s1 + t.n * beta * beta);
  return tail + (t.m > 0 ? t.m * logNormalCdf(beta - theta * t.c) : 0);
}

function maximise(t: TailStats): [number, number, number] {
  let beta = 0;
  let theta = 1;
  let f = logLik(t, beta, theta);
  for (let iter = 0; iter < 200; iter++) {
    const w = beta - theta * t.c;
    const lambda = t.m > 0 ? Math.exp(-0.5 * w * w - 0.5 * Math.log(2 * Math.PI) - logNormalCdf(w)) : 0;
    const k = lambda * (w + lambda);
    const gb = theta * t.s1 - t.n * beta + t.m * lambda;
    const gt = t.n / theta - theta * t.s2 + beta * t.s1 - t.m * t.c * lambda;
    const hbb = -t.n - t.m * k;
    const hbt = t.s1 + t.m * t.c * k;
    const htt = -t.n / (theta * theta) - t.s2 - t.m * t.c * t.c * k;
    if (Math.abs(gb) + Math.abs(gt) < 1e-10) break;
    const det = hbb * htt - hbt * hbt;
    const db = -(htt * gb - hbt * gt) / det;
    const dt = -(-hbt * gb + hbb * gt) / det;
    if (!Number.isFinite(db) || !Number.isFinite(dt)) break;
    let step = 1;
    let accepted = false;
    for (let h = 0; h < 60; h++) {
      const fb = logLik(t, beta + step * db, theta + step * dt);
      if (fb >= f) {
        beta += step * db;
        theta += step * dt;
        const gain = fb - f;
        f = fb;
        accepted = true;
        if (gain < 1e-13 * (1 + Math.abs(f)) && Math.abs(step * db) + Math.abs(step * dt) < 1e-10) return [beta, theta, f];
        break;
      }
      step /= 2;
    }
    if (!accepted) break;
  }
  return [beta, theta, f];
}

/** Berkowitz's tail LR test on a PIT column (F(return), NaN rows skipped). Null when empty or a bad confidence. */
export function tailLikelihoodTest(pit: ArrayLike<number>, confidence: number, side: RiskSide = "long"): TailLikelihoodTest | null {
  if (!(confidence > 0 && confidence < 1)) return null;
  const c = normalQuantile(1 - confidence);
  let n = 0;
  let m = 0;
  let s1 = 0;
  let s2 = 0;
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < pit.length; i++) {
    const u = pit[i];
    if (Number.isNaN(u)) continue;
    const lower = side === "long" ? u : 1 - u;
    const z = normalQuantile(Math.min(Math.max(lower, PIT_FLOOR), 1 - 1e-16));
    if (z < c) {
      n++;
      s1 += z;
      s2 += z * z;
      lo = Math.min(lo, z);
      hi = Math.max(hi, z);
    } else m++;
  }
  const observations = n + m;
  if (observations === 0) return null;
  const informative = n >= 2 && hi > lo && m >= 1;
  if (!informative) {
    return Object.freeze({ confidence, observations, tailCount: n, mean: NaN, sd: NaN, statistic: NaN, pValue: NaN, informative });
  }
  const stats: TailStats = { n, s1, s2, m, c };
  const [beta, theta, fMax] = maximise(stats);
  const statistic = Math.max(0, 2 * (fMax - logLik(stats, 0, 1)));
  return Object.freeze({
    confidence,
    observations,
    tailCount: n,
    mean: beta / theta,
    sd: 1 / theta,
    statistic,
    pValue: chiSquare2Sf(statistic),
    informative,
  });
}
