/**
 * Label/value rows of a goodness-of-fit result, built from the core result object so the cell function
 * (ASKEW.GOF) and the task pane show the very same rows.
 *
 * Row order (fixed; documented for users of the spilled table):
 *  1 KS D               4 AD p-value              7 Note (empty when there is nothing to flag)
 *  2 KS p-value         5 p-values from (text: exact laws or the bootstrap's size, estimator and seed)
 *  3 AD A²              6 Observations
 * A² is infinite when some observation lies outside the support of the law; the cell then reads "infinite"
 * (never an Infinity) and the note says how many observations are outside.
 */
import type { GnoGofResult } from "../../core/gof";

export type GofRow = readonly [string, number | string];

export const GOF_LABELS: readonly string[] = ["KS D", "KS p-value", "AD A²", "AD p-value", "p-values from", "Observations", "Note"];

function methodText(r: GnoGofResult): string {
  if (r.method === "exact") {
    const ks = r.ksRoute === "exact" ? "exact KS law" : r.ksRoute === "one-sided-tail" ? "exact one-sided KS tail, doubled" : "KS limit law";
    return `given parameters: ${ks}, AD law (Marsaglia & Marsaglia); resamples ignored`;
  }
  const est = r.fitMethod === "lmom" ? "L-moment" : "maximum-likelihood";
  return `parametric bootstrap: ${r.usedResamples} resample${r.usedResamples === 1 ? "" : "s"}, ${est} refit of each, seed ${r.seed}`;
}

function noteText(r: GnoGofResult): string {
  const notes: string[] = [];
  if (r.outsideSupport > 0) {
    notes.push(`${r.outsideSupport} observation${r.outsideSupport === 1 ? " lies" : "s lie"} outside the support of the law: A² is infinite, AD p = 0`);
  }
  if (r.refused) notes.push("no bootstrap: the fit of these data is not a regular maximum of the likelihood (see ASKEW.FITREPORT), so refits of resamples would meet the same degenerate likelihood; test given parameters instead");
  else if (r.irregularFit) notes.push("the fit is not a regular interior maximum: read the p-values with care");
  if (r.stoppedEarly) notes.push(`stopped after ${r.failedRefits} failed refits`);
  else if (r.failedRefits > 0) notes.push(`${r.failedRefits} resample refit${r.failedRefits === 1 ? "" : "s"} failed and were left out`);
  if (r.method === "bootstrap" && !r.refused && !Number.isFinite(r.ksPValue)) notes.push("too few successful refits for bootstrap p-values; test given parameters instead");
  return notes.join("; ");
}

/** The result as (label, value) rows in the documented order; no NaN or Infinity in values. */
export function gofRows(r: GnoGofResult): GofRow[] {
  const num = (x: number): number | string => (Number.isFinite(x) ? x : x === Infinity ? "infinite" : "");
  return [
    [GOF_LABELS[0], num(r.ksStatistic)],
    [GOF_LABELS[1], num(r.ksPValue)],
    [GOF_LABELS[2], num(r.adStatistic)],
    [GOF_LABELS[3], num(r.adPValue)],
    [GOF_LABELS[4], methodText(r)],
    [GOF_LABELS[5], r.n],
    [GOF_LABELS[6], noteText(r)],
  ];
}
