/**
 * How many rows the pane keeps clear below the ASKEW.FITREPORT formula it writes. The report's table builder
 * (the fitting area's) fixes the row count; until the pane reads it from there, it reserves a generous block.
 * Reserving too many rows is harmless (they are checked for content and left blank); too few cannot overwrite
 * anything either: the host never spills over filled cells, it shows #SPILL! instead.
 */
export const REPORT_ROWS_RESERVED = 40;

export function reportRowCount(): number {
  return REPORT_ROWS_RESERVED;
}
