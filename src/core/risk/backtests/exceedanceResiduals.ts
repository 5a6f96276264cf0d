/**
 * McNeil & Frey (2000), "Estimation of tail-related risk measures for heteroscedastic financial time series: an
 * extreme value approach", J. Empirical Finance 7:271–300, §5: on exception days the residual
 * r_t = (L_t − ES_t)/σ_t has mean zero when ES is right; ES that is too small shows as a positive mean. The test
 * is one-sided (H1: mean > 0), with the bootstrap of the mean's t-statistic (Efron & Tibshirani 1993, An
 * Introduction to the Bootstrap, §16.4): the residuals are centred on their mean, resampled with replacement,
 * and p = (1 + #{t* ≥ t})/(1 + B). Seeded, so the p-value is reproducible.
 *
 * Scale σ_t: McNeil & Frey divide by the forecast volatility. A spreadsheet column of VaR and ES carries no σ,
 * so σ_t = ES_t − VaR_t unless a scale column is given: for any location-scale forecast law ES − VaR is a fixed
 * multiple of σ_t, and the t-statistic does not change when every residual is multiplied by the same constant.
 * Exception rows with ES_t ≤ VaR_t (no tail width) give no residual and are counted apart.
 */
import type { RiskSide } from "../measures/side";
import { uniformStream } from "../../random";
import type { Work } from "../../work";
import { lossOf } from "./shortfallZ";

export interface ExceedanceResiduals {
  readonly residuals: Float64Array;
  /** Exception rows that gave no residual (scale not positive). */
  readonly unscaled: number;
}

/** Residuals (loss − ES)/σ on the exception rows; σ = scale[t] when given, else ES − VaR. NaN rows skipped. */
export function exceedanceResiduals(
  returns: ArrayLike<number>,
  varForecasts: ArrayLike<number>,
  esForecasts: ArrayLike<number>,
  side: RiskSide = "long",
  scale?: ArrayLike<number>,
): ExceedanceResiduals {
  const out: number[] = [];
  let unscaled = 0;
  const n = Math.min(returns.length, varForecasts.length, esForecasts.length);
  for (let i = 0; i < n; i++) {
    const x = returns[i];
    const v = varForecasts[i];
    const e = esForecasts[i];
    if (Number.isNaN(x) || Number.isNaN(v) || Number.isNaN(e)) continue;
    const loss = lossOf(x, side);
    if (!(loss > v)) continue;
    const s = scale ? scale[i] : e - v;
    if (!(s > 0)) {
      unscaled++;
      continue;
    }
    out.push((loss - e) / s);
  }
  return { residuals: Float64Array.from(out), unscaled };
}

export interface ExceedanceResidualTest {
  readonly count: number;
  readonly mean: number;
  /** t = mean/(sd/√n); NaN with fewer than 2 residuals. */
  readonly tStatistic: number;
  /** One-sided bootstrap p-value; NaN with fewer than 2 residuals. */
  readonly pValue: number;
  readonly replicates: number;
  readonly seed: number;
}

function meanAndT(x: ArrayLike<number>, n: number): [number, number] {
  let m = 0;
  for (let i = 0; i < n; i++) m += x[i];
  m /= n;
  let ss = 0;
  for (let i = 0; i < n; i++) ss += (x[i] - m) * (x[i] - m);
  const sd = Math.sqrt(ss / (n - 1));
  if (sd > 0) return [m, m / (sd / Math.sqrt(n))];
  return [m, m === 0 ? 0 : m > 0 ? Infinity : -Infinity];
}

/** Bootstrap test of mean zero against mean > 0. Yields after every 50 replicates. */
export function* exceedanceResidualTest(residuals: ArrayLike<number>, replicates: number, seed: number): Work<ExceedanceResidualTest> {
  const n = residuals.length;
  if (n < 2) {
    const mean = n === 1 ? residuals[0] : NaN;
    return Object.freeze({ count: n, mean, tStatistic: NaN, pValue: NaN, replicates: 0, seed });
  }
  const [mean, t] = meanAndT(residuals, n);
  const centred = Float64Array.from(residuals, (r) => r - mean);
  const sample = new Float64Array(n);
  const next = uniformStream(seed);
  let atOrAbove = 0;
  for (let b = 0; b < replicates; b++) {
    for (let i = 0; i < n; i++) sample[i] = centred[Math.floor(next() * n)];
    if (meanAndT(sample, n)[1] >= t) atOrAbove++;
    if ((b + 1) % 50 === 0) yield (b + 1) / replicates;
  }
  return Object.freeze({ count: n, mean, tStatistic: t, pValue: (1 + atOrAbove) / (1 + replicates), replicates, seed });
}
