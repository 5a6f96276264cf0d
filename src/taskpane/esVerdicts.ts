/**
 * The pane's tail verdicts: one line per question (coverage, clustering, size of tail losses, shape of the tail),
 * built from the same core results as ASKEW.BACKTEST and ASKEW.ESBACKTEST, so the backtest view can show the ES
 * verdicts beside the VaR ones. Pure builder plus a small DOM renderer (text and CSS classes only: the outcome is
 * spelled out, never carried by colour alone).
 *
 * Outcome rule (stated, common practice for a screening view): a p-value below 1% is "fail", below 5% "watch",
 * otherwise "pass"; traffic-light zones map green → pass, yellow/amber → watch, red → fail; a test that does not
 * apply (too few exceptions, no PIT column) is "n/a". Statistical evidence only, not a regulatory determination.
 */
import type { VarBacktest } from "../core/risk/backtests/backtest";
import type { EsBacktestParts } from "../functions/tables/esBacktest";

export type Outcome = "pass" | "watch" | "fail" | "n/a";

export interface Verdict {
  readonly question: string;
  readonly test: string;
  readonly outcome: Outcome;
  /** The number behind the outcome, formatted for the pane. */
  readonly detail: string;
}

export function outcomeOfP(p: number): Outcome {
  if (!Number.isFinite(p)) return "n/a";
  return p < 0.01 ? "fail" : p < 0.05 ? "watch" : "pass";
}

export function outcomeOfZone(zone: string): Outcome {
  return zone === "green" ? "pass" : zone === "yellow" || zone === "amber" ? "watch" : zone === "red" ? "fail" : "n/a";
}

const fmtP = (p: number) => (Number.isFinite(p) ? `p = ${p < 0.001 ? p.toExponential(1) : p.toFixed(3)}` : "not informative");

/** Verdict lines for whichever results are available (either may be null). */
export function tailVerdicts(varTest: VarBacktest | null, es: EsBacktestParts | null): Verdict[] {
  const out: Verdict[] = [];
  if (varTest) {
    out.push({ question: "Right number of VaR exceptions?", test: "Kupiec", outcome: outcomeOfP(varTest.kupiec.pValue), detail: `${varTest.exceptions} of ${varTest.expectedExceptions.toFixed(1)} expected; ${fmtP(varTest.kupiec.pValue)}` });
    out.push({ question: "Right number of VaR exceptions?", test: "Traffic light", outcome: outcomeOfZone(varTest.zone), detail: varTest.zone });
    const ind = varTest.independence;
    out.push({ question: "Do exceptions cluster?", test: "Christoffersen", outcome: ind.informative ? outcomeOfP(ind.pValue) : "n/a", detail: ind.informative ? fmtP(ind.pValue) : "not informative" });
    const d = varTest.duration;
    out.push({ question: "Do exceptions cluster?", test: "Durations", outcome: d.informative ? outcomeOfP(d.pValue) : "n/a", detail: d.informative ? `shape ${d.shape.toFixed(2)}; ${fmtP(d.pValue)}` : "fewer than 2 durations" });
  }
  if (es) {
    const z = es.z;
    // The simulated p-value, not the fixed critical values: it adapts to the row count and the confidence.
    const z2Outcome = outcomeOfP(es.z2PValue.pValue);
    out.push({ question: "Are tail losses as large as ES says?", test: "Z2", outcome: z2Outcome, detail: `Z2 = ${z.z2.toFixed(2)}; ${fmtP(es.z2PValue.pValue)}` });
    out.push({ question: "Are tail losses as large as ES says?", test: "Exceedance residuals", outcome: outcomeOfP(es.residuals.pValue), detail: fmtP(es.residuals.pValue) });
    if (es.pit) {
      out.push({ question: "Is the tail beyond VaR shaped right?", test: "Multinomial", outcome: outcomeOfP(es.pit.multinomial.nassPValue), detail: fmtP(es.pit.multinomial.nassPValue) });
      const t = es.pit.tail;
      out.push({ question: "Is the tail beyond VaR shaped right?", test: "Tail LR", outcome: t.informative ? outcomeOfP(t.pValue) : "n/a", detail: t.informative ? fmtP(t.pValue) : "not informative" });
      out.push({ question: "Is the tail beyond VaR shaped right?", test: "ES traffic light", outcome: outcomeOfZone(es.pit.light.zone), detail: es.pit.light.zone });
    } else {
      out.push({ question: "Is the tail beyond VaR shaped right?", test: "PIT tests", outcome: "n/a", detail: "no PIT column" });
    }
  }
  return out;
}

/** Renders the verdicts as a list into `container` (replacing its content); classes verdict-pass/-watch/-fail/-na. */
export function renderVerdicts(container: HTMLElement, verdicts: readonly Verdict[]): void {
  container.replaceChildren();
  const list = document.createElement("ul");
  list.className = "tail-verdicts";
  list.setAttribute("aria-label", "Backtest verdicts (statistical evidence, not a regulatory determination)");
  for (const v of verdicts) {
    const li = document.createElement("li");
    li.className = `verdict-${v.outcome === "n/a" ? "na" : v.outcome}`;
    li.textContent = `${v.question} ${v.test}: ${v.outcome} (${v.detail})`;
    list.appendChild(li);
  }
  container.appendChild(list);
}
