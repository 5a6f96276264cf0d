/**
 * The full fit report in the pane: the very rows ASKEW.FITREPORT spills (src/functions/tables/fitReport.ts),
 * and their count, which the live-formula block keeps clear below the FITREPORT formula.
 */
import { fitReportRows, ROW_LABELS, type ReportRow } from "../functions/tables/fitReport";
import type { GnoFit } from "../core/fit";

export function reportRowCount(): number {
  return ROW_LABELS.length;
}

export function reportRows(fit: GnoFit): ReportRow[] {
  return fitReportRows(fit);
}
