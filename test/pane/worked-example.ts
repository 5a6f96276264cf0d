/**
 * Prints the README's worked example: the formulas typed, evaluated by a calculation engine (HyperFormula) on
 * the BUILT functions (dist/functions.js), on the simulated demo scenario generated in the sheet itself by
 * ASKEW.RANDOM with the demo's seed. Run after a build: npx ts-node --transpile-only test/pane/worked-example.ts
 */
import { addSizeRule, askewEngine } from "../workbook/engine";
import { ROW_LABELS } from "../../src/functions/tables/fitReport";
import { CAPPED_DEMO, DEMO, type DemoScenario } from "../../src/taskpane/demo";

async function scenario(s: DemoScenario): Promise<void> {
  addSizeRule("FITREPORT", { kind: "fixed", rows: ROW_LABELS.length, cols: 2 });
  const e = await askewEngine();
  const last = s.n + 1;
  const data = `A2:A${last}`;
  const formulas: Array<[string, string]> = [
    ["A2", `=ASKEW.RANDOM({${s.params.location};${s.params.scale};${s.params.shape}},${s.n},${s.seed})`],
    ["C2", `=ASKEW.FIT(${data})`],
    ["C6", `=ASKEW.VAR(0.99,C2:C4)`],
    ["C7", `=ASKEW.SHORTFALL(0.975,C2:C4)`],
    ["C8", `=ASKEW.VAR(0.99,C2:C4,"short")`],
    ["C9", `=ASKEW.SHORTFALL(0.975,C2:C4,"short")`],
    ["C11", `=ASKEW.VARCI(${data},0.99)`],
    ["C15", `=ASKEW.BOUND(C2:C4)`],
    ["E2", `=ASKEW.FITREPORT(${data})`],
    ["H2", `=ASKEW.GOF(${data})`],
    ["H12", `=ASKEW.COMPARE(${data})`],
  ];
  const sheet: unknown[][] = Array.from({ length: last + 1 }, () => Array(16).fill(null));
  sheet[0][0] = "return";
  const cellAt = (a1: string): { col: number; row: number } => ({ col: a1.charCodeAt(0) - 65, row: Number(a1.slice(1)) - 1 });
  for (const [a1, f] of formulas) {
    const { col, row } = cellAt(a1);
    sheet[row][col] = f;
  }
  const hf = e.build(sheet);
  const v = (a1: string): unknown => hf.getCellValue({ sheet: 0, ...cellAt(a1) });
  console.log(`\n## ${s.title}`);
  for (const [a1, f] of formulas) console.log(`${a1}: ${f}`);
  console.log("FIT:", v("C2"), v("C3"), v("C4"));
  console.log("VaR99 long", v("C6"), "ES97.5 long", v("C7"), "VaR99 short", v("C8"), "ES97.5 short", v("C9"));
  console.log("VARCI:", v("C11"), v("C12"), v("C13"));
  console.log("BOUND:", v("C15"));
  for (let r = 2; r < 2 + ROW_LABELS.length; r++) console.log("  report", v(`E${r}`), "=", v(`F${r}`));
  for (let r = 2; r < 9; r++) console.log("  gof", v(`H${r}`), "=", v(`I${r}`));
  for (let r = 12; r < 18; r++) console.log("  compare", [v(`H${r}`), v(`I${r}`), v(`J${r}`), v(`K${r}`), v(`L${r}`), v(`M${r}`), v(`N${r}`)].join(" | "));
  console.log("size mismatches:", JSON.stringify(e.sizeMismatches));
}

void (async () => {
  await scenario(DEMO);
  await scenario(CAPPED_DEMO);
})();
