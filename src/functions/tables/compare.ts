/**
 * The model-comparison table, built from the core result so the cell function (ASKEW.COMPARE) and the task
 * pane show the same rows. Layout: one header row, then one row per family, best (lowest AIC) first:
 *   Family | Log-likelihood | Parameters | AIC | BIC | ΔAIC | VaR 99%
 * VaR 99% is the long-side loss −quantile(0.01) of each fitted family. A family whose fit needs a caveat carries
 * a short mark in its name (e.g. "Student t (dof at bound)"); the full note is in `compareNotes`.
 */
import type { FamilyId, ModelComparison } from "../../core/compare";

export const COMPARE_HEADER: readonly string[] = ["Family", "Log-likelihood", "Parameters", "AIC", "BIC", "ΔAIC", "VaR 99%"];

export const FAMILY_LABELS: Readonly<Record<FamilyId, string>> = {
  gno: "Generalized normal",
  normal: "Normal",
  "student-t": "Student t",
  "asymmetric-laplace": "Asymmetric Laplace",
  "johnson-su": "Johnson SU",
};

const SHORT_NOTES: ReadonlyArray<readonly [RegExp, string]> = [
  [/bound/, "dof at bound"],
  [/lognormal limit/, "lognormal limit"],
  [/normal limit/, "normal limit"],
  [/regular/, "irregular fit"],
];

function shortNote(note: string): string {
  if (note === "") return "";
  for (const [re, text] of SHORT_NOTES) if (re.test(note)) return ` (${text})`;
  return " (see note)";
}

export type CompareCell = number | string;

/** Header row plus one row per family; non-finite numbers become "" (never NaN/Infinity in a cell). */
export function compareRows(c: ModelComparison): CompareCell[][] {
  const num = (x: number): CompareCell => (Number.isFinite(x) ? x : "");
  return [
    [...COMPARE_HEADER],
    ...c.rows.map((r) => [
      FAMILY_LABELS[r.family] + shortNote(r.note),
      num(r.logLikelihood),
      r.parameterCount,
      num(r.aic),
      num(r.bic),
      num(r.deltaAic),
      num(r.valueAtRisk99),
    ]),
  ];
}

/** Family label and full note for every family that has one (for the pane). */
export function compareNotes(c: ModelComparison): Array<readonly [string, string]> {
  return c.rows.filter((r) => r.note !== "").map((r) => [FAMILY_LABELS[r.family], r.note] as const);
}
