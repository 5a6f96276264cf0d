/**
 * The pane's controller: reads data (workbook or standalone input), runs the analysis in steps, and lays the
 * results out for reading — answer first (parameters, VaR/ES), warnings where the eye lands, evidence and
 * pictures next, then the live-formula writer. Every number shown carries its full value in data-value, the
 * very number the matching cell function returns.
 */
import type { FitMethod, GnoFit } from "../core/fit";
import { readData, CellError } from "../functions/cells";
import { BACKTEST_LABELS } from "../functions/tables/backtest";
import { compareRows, FAMILY_LABELS } from "../functions/tables/compare";
import { gofRows } from "../functions/tables/gof";
import { buildFormulaBlock, columnLetters, levelLabel, type VolBlockSpec } from "../functions/tables/formulas";
import { ES_BACKTEST_LABELS, ES_BACKTEST_PIT_LABELS } from "../functions/tables/esBacktest";
import { VOL_ROW_LABELS } from "../functions/tables/volReport";
import { analyse, Cancelled, type Analysis, type RiskFigure } from "./analysis";
import { horizonLaw, MAX_HORIZON, MAX_HORIZON_SHAPE } from "../core/risk/horizons";
import { backtestChart, histogramChart, horizonChart, meanExcessChart, qqChart, tailChart, volatilityChart } from "./charts";
import { sampleMeanExcess, splicedCells, splicedExpectedShortfall, splicedValueAtRisk } from "../core/pareto";
import { tailReportRows } from "../functions/tables/tailReport";
import { PANE_TAIL_SIDES } from "./analysis";
import { DEMO, CAPPED_DEMO, CLUSTER_DEMO, scenarioData, type DemoScenario } from "./demo";
import { tailVerdicts, type Verdict } from "./esVerdicts";
import { MODEL_LABELS, specProblem, VIEW_MODELS, type LineResult, type ViewModel, type VolResult, type VolSpec } from "./volView";
import { formatColumn, InputProblem } from "./parse";
import { readColumnInSlices, ReadCancelled } from "./reading";
import { canWatchChanges, listSources, overlaps, readSource, watchChanges, writeFormulaBlock, type ExcelHost, type SheetData, type SourceChoice } from "./hostBridge";
import { followVisibility, type AddinEvents } from "./lifecycle";
import { reportRowCount, reportRows } from "./report";
import { ComparisonRunner, VolCancelled, VolRunner } from "./worker";

const $ = <T extends HTMLElement = HTMLElement>(id: string): T => {
  const e = document.getElementById(id);
  if (!e) throw new Error(`pane element #${id} is missing`);
  return e as T;
};

/** Four significant digits for reading; the exact value stays in data-value. */
export function show(x: number | null | undefined): string {
  if (x === null || x === undefined || Number.isNaN(x)) return "–";
  if (!Number.isFinite(x)) return x > 0 ? "∞" : "−∞";
  if (x === 0) return "0";
  const a = Math.abs(x);
  const s = a >= 1e-4 && a < 1e6 ? String(Number(x.toPrecision(4))) : x.toExponential(3);
  return s.replace("-", "−");
}

const pct = (c: number): string => levelLabel(c);

/** An interval at 3 significant digits (the table has little room). */
function range(lo: number, hi: number): string {
  const short = (x: number): string => (Number.isFinite(x) ? show(Number(x.toPrecision(3))) : show(x));
  return `${short(lo)} … ${short(hi)}`;
}

/** The VaR interval cell: ends at 3 significant digits, full ends in data attributes; "no end" where the data cannot bound one. */
function intervalCell(r: RiskFigure): HTMLTableCellElement {
  const iv = r.interval;
  if (!iv) return cell("td", "–");
  const end = (x: number): string => (Number.isFinite(x) ? show(Number(x.toPrecision(3))) : "no end");
  const c = cell("td", `${end(iv.lower)} … ${end(iv.upper)}`);
  c.dataset.lower = String(iv.lower);
  c.dataset.upper = String(iv.upper);
  c.classList.add("interval");
  if (iv.reason) c.title = iv.reason;
  return c;
}

function cell(tag: "td" | "th", content: string | number | null, cls?: string): HTMLTableCellElement {
  const c = document.createElement(tag);
  if (typeof content === "number" || content === null) {
    c.textContent = show(content);
    if (typeof content === "number") c.dataset.value = String(content);
    c.classList.add("num");
  } else {
    c.textContent = content;
    if (tag === "td" && content.length > 14) c.classList.add("text");
  }
  if (cls) c.classList.add(...cls.split(" "));
  return c;
}

function fillTable(t: HTMLTableElement, head: string[], rows: Array<Array<string | number | null>>, caption?: string): void {
  t.replaceChildren();
  if (caption) {
    const cap = document.createElement("caption");
    cap.textContent = caption;
    t.appendChild(cap);
  }
  const thead = document.createElement("thead");
  const hr = document.createElement("tr");
  head.forEach((h) => hr.appendChild(cell("th", h)));
  thead.appendChild(hr);
  const tbody = document.createElement("tbody");
  for (const r of rows) {
    const tr = document.createElement("tr");
    r.forEach((v, i) => tr.appendChild(i === 0 ? cell("th", v) : cell("td", v)));
    tbody.appendChild(tr);
  }
  t.append(thead, tbody);
}

interface PaneState {
  data: Float64Array | null;
  label: string;
  host: ExcelHost | null;
  sheet: SheetData | null;
  source: SourceChoice;
  analysis: Analysis | null;
  running: { cancelled: boolean } | null;
  tailSide: "long" | "short";
  unwatch: (() => Promise<void>) | null;
  comparisons: ComparisonRunner;
  vol: VolRunner;
  volResult: VolResult | null;
  volRun: number;
}

const state: PaneState = {
  data: null,
  label: "",
  host: null,
  sheet: null,
  source: { kind: "selection" },
  analysis: null,
  running: null,
  tailSide: "long",
  unwatch: null,
  comparisons: new ComparisonRunner(null),
  vol: new VolRunner(null),
  volResult: null,
  volRun: 0,
};

function say(text: string): void {
  const m = $("message");
  m.textContent = text;
  m.hidden = text === "";
}

function method(): FitMethod {
  return ($("method") as HTMLSelectElement).value === "lmom" ? "lmom" : "mle";
}

async function run(): Promise<void> {
  if (!state.data) return;
  if (state.running) {
    state.running.cancelled = true;
    state.comparisons.cancel(new Cancelled());
  }
  const token = { cancelled: false };
  state.running = token;
  const bar = $<HTMLProgressElement>("progress-bar");
  $("progress").hidden = false;
  $("app").dataset.state = "busy";
  // results on screen belong to the previous data until this run ends: mark them stale
  $("results").dataset.stale = "true";
  say("");
  try {
    const a = await analyse(state.data, method(), {
      isCancelled: () => token.cancelled,
      fit: (x, m) => state.comparisons.fit(x, m),
      compare: (x) => state.comparisons.compare(x),
      evidence: (x, m, b, specs) => state.comparisons.evidence(x, m, b, specs),
      onProgress: (p) => {
        bar.value = p.done / p.total;
        $("progress-text").textContent = p.step === "done" ? "" : `${p.step}…`;
      },
    });
    state.analysis = a;
    render(a);
  } catch (e) {
    $("app").dataset.state = "stopped";
    if (token === state.running) clearResults();
    if (e instanceof Cancelled) say("Analysis cancelled.");
    else say(`The analysis failed: ${e instanceof Error ? e.message : String(e)}`);
  } finally {
    if (state.running === token) {
      state.running = null;
      $("progress").hidden = true;
    }
  }
}

/** Takes the previous analysis off the screen (it no longer matches the data named above it). */
function clearResults(): void {
  state.analysis = null;
  $("results").hidden = true;
  delete $("results").dataset.stale;
}

function useData(values: Float64Array, label: string): void {
  if (state.data !== values) {
    state.vol.cancel();
    state.volResult = null;
    $("vol-results").hidden = true;
  }
  state.data = values;
  state.label = label;
  $("source-note").textContent = `${label} — ${values.length} numbers.`;
  $<HTMLTextAreaElement>("data-text").value = formatColumn(values);
}

function fitSummary(f: GnoFit): string {
  const how = f.method === "mle" ? "maximum likelihood" : "L-moments";
  const state = f.converged ? "converged" : "did not converge";
  return `${f.n} returns, ${how}: ${state}${f.method === "mle" ? ` in ${f.iterations} iterations` : ""}${f.regular ? "" : " (irregular)"}.`;
}

function renderParams(f: GnoFit): void {
  const names = ["location", "scale", "shape"] as const;
  const t = $<HTMLTableElement>("params");
  fillTable(t, ["", "estimate", "s.e."], []);
  const iv = f.intervals;
  names.forEach((n, i) => {
    const tr = document.createElement("tr");
    tr.dataset.param = n;
    tr.append(cell("th", n), cell("td", f.params[n], "estimate"), cell("td", f.standardErrors ? f.standardErrors[i] : null));
    const sub = document.createElement("tr");
    sub.className = "sub";
    const label = cell("th", "");
    const span = cell("td", iv ? `95% interval ${range(iv[n][0], iv[n][1])}` : "no interval (needs a regular maximum-likelihood fit)");
    span.colSpan = 2;
    sub.append(label, span);
    t.tBodies[0].append(tr, sub);
  });
  t.dataset.location = String(f.params.location);
  t.dataset.scale = String(f.params.scale);
  t.dataset.shape = String(f.params.shape);
}

function renderRisk(risk: readonly RiskFigure[]): void {
  const t = $<HTMLTableElement>("risk");
  fillTable(t, ["level", "VaR", "VaR range", "ES"], []);
  const body = t.tBodies[0];
  for (const side of ["long", "short"] as const) {
    const head = document.createElement("tr");
    head.className = "group";
    const th = cell("th", side === "long" ? "Long: loss when returns fall" : "Short: loss when returns rise");
    th.colSpan = 4;
    th.scope = "colgroup";
    head.appendChild(th);
    body.appendChild(head);
    for (const r of risk.filter((f) => f.side === side)) {
      const tr = document.createElement("tr");
      tr.dataset.side = side;
      tr.dataset.confidence = String(r.confidence);
      tr.append(
        cell("th", pct(r.confidence)),
        cell("td", r.valueAtRisk, "var"),
        intervalCell(r),
        cell("td", r.expectedShortfall, "es"),
      );
      body.appendChild(tr);
    }
  }
}

const valueAtRiskOf = (a: Analysis, c: number, side: "long" | "short"): number | null => a.risk.find((r) => r.confidence === c && r.side === side)?.valueAtRisk ?? null;
const esOf = (a: Analysis, c: number, side: "long" | "short"): number | null => a.risk.find((r) => r.confidence === c && r.side === side)?.expectedShortfall ?? null;

/** The fit's own warnings (the words FITREPORT shows), led by a short headline when something is badly wrong. */
function warningsOf(a: Analysis): Array<{ text: string; severe: boolean }> {
  const f = a.fit;
  const out: Array<{ text: string; severe: boolean }> = [];
  if (!f.converged) out.push({ text: `The fit did not converge (${f.reason}): treat every number below with care.`, severe: true });
  else if (!f.regular) out.push({ text: "Irregular fit: the likelihood has no proper maximum (the edge runs into the data).", severe: true });
  if (f.edge && f.edge.distance < 1) out.push({ text: "The support edge is close to the data: see Support edge below.", severe: true });
  for (const w of f.warnings) out.push({ text: w, severe: false });
  return out;
}

function renderWarnings(a: Analysis): void {
  const list = $("warning-list");
  list.replaceChildren();
  const ws = warningsOf(a);
  for (const w of ws) {
    const li = document.createElement("li");
    li.textContent = w.text;
    if (w.severe) li.classList.add("severe");
    list.appendChild(li);
  }
  $("warnings").hidden = ws.length === 0;
  $("warnings-h").textContent = ws.some((w) => w.severe) ? "Read this first" : "Notes";
  $("warnings").classList.toggle("has-severe", ws.some((w) => w.severe));
}

function renderEdge(f: GnoFit): void {
  const body = $("edge-body");
  body.replaceChildren();
  const p = (text: string, cls?: string): void => {
    const e = document.createElement("p");
    e.textContent = text;
    if (cls) e.className = cls;
    body.appendChild(e);
  };
  const e = f.edge;
  $("edge-panel").classList.toggle("edge-close", !!e && e.distance < 1);
  if (!e) {
    p("Shape 0 (normal law): no edge on either side; losses are unbounded both ways.");
    return;
  }
  const table = document.createElement("table");
  table.className = "grid";
  table.id = "edge-table";
  fillTable(
    table,
    ["", "value"],
    [
      [`${e.side === "upper" ? "Upper" : "Lower"} edge (return)`, e.value],
      [`Most extreme return on that side`, e.extreme],
      ["Gap, in sample sd", e.distance],
      ["Fitted chance of a return beyond that extreme", e.exceedance],
    ],
  );
  body.appendChild(table);
  if (e.side === "upper") {
    p(`Returns above ${show(e.value)} are impossible under this fit, so a short position's loss is capped at ${show(e.value)}. The long side (falls) is unbounded.`);
  } else {
    p(`Returns below ${show(e.value)} are impossible under this fit, so a long position's loss is capped at ${show(-e.value)}. The short side (rises) is unbounded.`);
  }
  if (e.distance < 1) p(`Close to the data: the edge is ${show(e.distance)} sd beyond the extreme return. Do not rely on the capped side's VaR or ES.`, "edge-alert");
}

function renderEvidence(a: Analysis): void {
  const f = a.fit;
  const verdict = $("skew-verdict");
  if (f.method === "mle" && Number.isFinite(f.lrPValue)) {
    const sig = f.lrPValue < 0.05;
    verdict.textContent = `Skew ${sig ? "is" : "is not"} significant at 5%: likelihood ratio against the normal ${show(f.lrStatistic)}, p-value ${show(f.lrPValue)}.`;
    verdict.className = `lead ${sig ? "verdict-yes" : "verdict-no"}`;
  } else {
    verdict.textContent = "The skew test needs a maximum-likelihood fit (choose that method).";
    verdict.className = "lead";
  }
  fillTable(
    $<HTMLTableElement>("moments"),
    ["", "sample", "fitted"],
    [
      ["mean", f.sample.mean, f.fitted.mean],
      ["sd", f.sample.sd, f.fitted.sd],
      ["skewness", f.sample.skewness, f.fitted.skewness],
      ["excess kurtosis", f.sample.excessKurtosis, f.fitted.excessKurtosis],
      ["log-likelihood", null, f.logLikelihood],
      ["AIC", null, f.aic],
    ],
  );
  fillTable($<HTMLTableElement>("gof"), ["", "value"], gofRows(a.gof).map(([label, value]) => [label, typeof value === "number" ? value : value || "–"]));
  const c = a.comparison;
  const [header, ...rows] = compareRows(c);
  const pick = ["Family", "ΔAIC", "VaR 99%"].map((h) => header.indexOf(h));
  fillTable(
    $<HTMLTableElement>("compare"),
    ["law", "ΔAIC", "VaR 99% long"],
    rows.map((r) => pick.map((i) => r[i])),
    `Best by AIC: ${FAMILY_LABELS[c.best]}. ΔAIC above about 2 favours the best law (common practice).`,
  );
}

function renderCharts(a: Analysis): void {
  const normal = { mean: a.normal.params.mean, sd: a.normal.params.sd };
  $("chart-hist").replaceChildren(histogramChart(a.sorted, a.fit.params, normal));
  $("chart-qq").replaceChildren(qqChart(a.sorted, a.fit.params));
  renderTail(a);
}

function renderTail(a: Analysis): void {
  const normal = { mean: a.normal.params.mean, sd: a.normal.params.sd };
  const tails = a.tails.fit;
  const side = state.tailSide;
  $("chart-tail").replaceChildren(tailChart(a.sorted, a.fit.params, normal, side, tails ? tails.params : null));
  const lead = $("tail-lead");
  const riskTable = $<HTMLTableElement>("tail-risk");
  if (!tails) {
    lead.textContent = a.tails.problem ?? "No Pareto tails.";
    riskTable.replaceChildren();
    $("chart-mean-excess").replaceChildren();
    $("tail-report").replaceChildren();
  } else {
    const t = side === "long" ? tails.lower : tails.upper;
    const piece = side === "long" ? tails.params.lower : tails.params.upper;
    const p99 = splicedValueAtRisk(0.99, tails.params, side);
    const law99 = valueAtRiskOf(a, 0.99, side);
    lead.textContent = t
      ? `${side === "long" ? "Loss" : "Gain"} tail beyond ${show(t.threshold)} (${t.exceedances} returns): Pareto shape ξ = ${show(t.fit.params.shape)}. ` +
        `99% VaR with the Pareto tail ${show(p99)} against ${show(law99)} for the law alone (${law99 !== null && p99 > law99 ? "heavier" : "lighter"} tail).`
      : "No Pareto tail on this side.";
    fillTable(
      riskTable,
      ["level", "VaR law", "VaR Pareto", "ES law", "ES Pareto"],
      [0.975, 0.99].map((c) => [pct(c), valueAtRiskOf(a, c, side), splicedValueAtRisk(c, tails.params, side), esOf(a, c, side), splicedExpectedShortfall(c, tails.params, side)]),
    );
    riskTable.dataset.cells = JSON.stringify(splicedCells(tails.params).map((v) => (Number.isNaN(v) ? null : v)));
    const points = sampleMeanExcess(a.data, side === "long" ? "lower" : "upper", { maxShare: 0.3, minExceedances: 10, points: 50 });
    $("chart-mean-excess").replaceChildren(meanExcessChart(points, side, piece));
    fillTable(
      $<HTMLTableElement>("tail-report"),
      ["", "value"],
      tailReportRows(tails, PANE_TAIL_SIDES).map(([label, v]) => [label, v === null ? "" : typeof v === "boolean" ? (v ? "TRUE" : "FALSE") : v]),
    );
  }
  $("tail-long").setAttribute("aria-pressed", String(state.tailSide === "long"));
  $("tail-short").setAttribute("aria-pressed", String(state.tailSide === "short"));
}

/** The volatility part of the live block: the spec of the backtest the view last showed (so the sheet reproduces it). */
function volBlockSpec(): VolBlockSpec | null {
  const r = state.volResult;
  if (!r || !state.data) return null;
  return {
    ...r.spec,
    dataRows: state.data.length,
    backtestRows: BACKTEST_LABELS.length,
    esBacktestRows: ES_BACKTEST_LABELS.length + ES_BACKTEST_PIT_LABELS.length,
    volReportRows: VOL_ROW_LABELS.length,
  };
}

function liveSpec(): { level: number; method: FitMethod; varRef: string | null; reportRows: number; backtestRows: number; vol: VolBlockSpec | null } {
  const level = Number(($("live-level") as HTMLSelectElement).value);
  const varRef = ($("live-var") as HTMLSelectElement).value || null;
  return { level, method: method(), varRef, reportRows: reportRowCount(), backtestRows: BACKTEST_LABELS.length, vol: volBlockSpec() };
}

function renderPreview(a: Analysis): void {
  const ref = `$A$2:$A$${a.data.length + 1}`;
  const block = buildFormulaBlock({ ...liveSpec(), varRef: null, dataRef: ref }, { column: 2, row: 1 });
  const lines = block.cells
    .map((r, i) => ({ r, addr: `C${i + 2}` }))
    .filter(({ r }) => r[0] !== "" || r[1] !== "")
    .map(({ r, addr }) => (r[1] ? `${addr}: ${r[0]}\n    ${r[1]}` : `${addr}: ${r[0]}`));
  // The rolling columns (with a volatility model): one formula each in the first row.
  block.cells[0].slice(2).forEach((f, j) => lines.push(`${columnLetters(4 + j)}2: ${f}`));
  $("formula-preview").textContent = lines.join("\n");
}

/** h-day VaR/ES beside the one-day figures: the exact law of the sum of h independent days, as VAR/SHORTFALL(…, h). */
function renderHorizon(a: Analysis): void {
  const h = Number($<HTMLInputElement>("horizon").value);
  const note = $("horizon-note");
  const table = $<HTMLTableElement>("horizon-risk");
  const chart = $("chart-horizon");
  const k = a.fit.params.shape;
  let problem = "";
  if (!Number.isInteger(h) || h < 2 || h > MAX_HORIZON) problem = `The horizon must be a whole number of days from 2 to ${MAX_HORIZON}.`;
  else if (Math.abs(k) > MAX_HORIZON_SHAPE) problem = `No exact ${h}-day law: the fitted shape ${show(k)} is beyond ±${MAX_HORIZON_SHAPE} (ASKEW.HORIZON simulates instead).`;
  if (problem) {
    note.textContent = problem;
    table.replaceChildren();
    chart.replaceChildren();
    table.dataset.horizon = "";
    return;
  }
  const law = horizonLaw(a.fit.params, h);
  note.textContent = `${h} days: ASKEW.VAR and ASKEW.SHORTFALL with horizon ${h} give these numbers.`;
  fillTable(table, ["level", "VaR 1 day", `VaR ${h} days`, "ES 1 day", `ES ${h} days`], []);
  for (const side of ["long", "short"] as const) {
    const head = document.createElement("tr");
    head.className = "group";
    const th = cell("th", side === "long" ? "Long" : "Short");
    th.colSpan = 5;
    head.appendChild(th);
    table.tBodies[0].appendChild(head);
    for (const r of a.risk.filter((f) => f.side === side)) {
      const tr = document.createElement("tr");
      tr.dataset.side = side;
      tr.dataset.confidence = String(r.confidence);
      tr.append(cell("th", pct(r.confidence)), cell("td", r.valueAtRisk), cell("td", law.valueAtRisk(r.confidence, side), "var-h"), cell("td", r.expectedShortfall), cell("td", law.expectedShortfall(r.confidence, side), "es-h"));
      table.tBodies[0].appendChild(tr);
    }
  }
  table.dataset.horizon = String(h);
  chart.replaceChildren(horizonChart(a.fit.params, law));
}

function render(a: Analysis): void {
  $("results").hidden = false;
  delete $("results").dataset.stale;
  $("fit-summary").textContent = fitSummary(a.fit);
  renderWarnings(a);
  renderParams(a.fit);
  renderRisk(a.risk);
  renderHorizon(a);
  renderEdge(a.fit);
  renderEvidence(a);
  renderCharts(a);
  renderPreview(a);
  fillTable(
    $<HTMLTableElement>("report"),
    ["", "value"],
    reportRows(a.fit).map(([label, v]) => [label, v === null ? "" : typeof v === "boolean" ? (v ? "TRUE" : "FALSE") : v]),
  );
  $("app").dataset.comparedIn = state.comparisons.ranInPage ? "page" : "worker";
  $("app").dataset.state = "ready";
}

// ---- Volatility and backtest view -------------------------------------------------------------------------

const SHORT: Readonly<Record<ViewModel, string>> = { iid: "iid", ewma: "EWMA", garch: "GARCH" };

function volSpec(): VolSpec {
  const m = $<HTMLSelectElement>("vol-model").value;
  const model = (VIEW_MODELS as readonly string[]).includes(m) ? (m as ViewModel) : "garch";
  return {
    model,
    window: Number($<HTMLInputElement>("vol-window").value),
    level: Number($<HTMLSelectElement>("vol-level").value),
    side: $<HTMLSelectElement>("vol-side").value === "short" ? "short" : "long",
    compare: $<HTMLInputElement>("vol-compare").checked,
  };
}

const SHORT_METHOD: Readonly<Record<string, string>> = {
  "Generalized normal, window fit": "GNO, window",
  "Generalized normal, EWMA": "GNO, EWMA",
  "Generalized normal, GARCH(1,1)": "GNO, GARCH",
  "Historical simulation": "HS",
  "Filtered historical simulation": "Filtered HS",
};

/** The method comparison (tables/methodComparison.ts rows), a few columns for the pane's width; all in data-value. */
function renderMethods(r: VolResult): void {
  const part = $("vol-compare-part");
  part.hidden = r.comparison === null;
  if (!r.comparison) return;
  const [header, ...rows] = r.comparison;
  const pick = ["Method", "Exceptions", "Kupiec p-value", "Zone", "Mean FZ0 loss", "DM p-value against the best"].map((h) => header.indexOf(String(h)));
  const t = $<HTMLTableElement>("vol-methods");
  fillTable(
    t,
    ["method", "exc.", "Kupiec p", "zone", "FZ0", "DM p"],
    rows.map((row) => pick.map((i, j) => (j === 0 ? (SHORT_METHOD[String(row[i])] ?? String(row[i])) : row[i] === "" ? "–" : row[i]))),
    `${r.comparisonRows} rows where every method forecasts. FZ0: mean loss of VaR and ES together (lower is better); DM p: Diebold–Mariano test of equal loss against the best. GNO: the generalized normal law; HS: historical simulation.`,
  );
  Array.from(t.tBodies[0].rows).forEach((tr, k) => (tr.dataset.method = String(rows[k][pick[0]])));
}

function volSay(text: string): void {
  const m = $("vol-message");
  m.textContent = text;
  m.hidden = text === "";
}

async function runVol(): Promise<void> {
  if (!state.data) return;
  const view = $("volbt");
  const spec = volSpec();
  const problem = specProblem(state.data.length, spec);
  if (problem) {
    volSay(problem);
    view.dataset.state = "input-error";
    return;
  }
  const token = ++state.volRun;
  volSay("");
  const bar = $<HTMLProgressElement>("vol-progress-bar");
  bar.value = 0;
  $("vol-progress-text").textContent = "starting…";
  $("vol-progress").hidden = false;
  view.dataset.state = "busy";
  try {
    const r = await state.vol.run(state.data, spec, (f) => {
      if (token !== state.volRun) return;
      bar.value = f;
      $("vol-progress-text").textContent = `${Math.floor(f * 100)}% of the window fits`;
    });
    if (token !== state.volRun) return;
    state.volResult = r;
    renderVol(r);
    if (state.analysis) renderPreview(state.analysis);
    view.dataset.ranIn = state.vol.ranIn ?? "";
    view.dataset.state = "ready";
  } catch (e) {
    if (token !== state.volRun) return;
    view.dataset.state = "stopped";
    volSay(e instanceof VolCancelled ? "Backtest cancelled: nothing was kept." : `The backtest failed: ${e instanceof Error ? e.message : String(e)}`);
  } finally {
    if (token === state.volRun) $("vol-progress").hidden = true;
  }
}

type Shown = string | number | null;

/** A builder row's value as the pane prints it: numbers stay numbers (data-value), booleans as the cell shows them. */
function shownValue(v: unknown): Shown {
  if (typeof v === "number") return v;
  if (typeof v === "boolean") return v ? "TRUE" : "FALSE";
  if (v === null || v === undefined || v === "") return "";
  return String(v);
}

function rowValue(rows: ReadonlyArray<readonly [string, unknown]> | null, label: string): Shown {
  const r = rows?.find(([l]) => l === label);
  return r ? shownValue(r[1]) : null;
}

/** Label/value rows of each line side by side (same labels in the same order). */
function sideBySide(t: HTMLTableElement, lines: readonly LineResult[], pick: (l: LineResult) => ReadonlyArray<readonly [string, unknown]> | null): void {
  const base = lines.map(pick).find((r) => r !== null) ?? null;
  fillTable(t, ["", ...lines.map((l) => SHORT[l.model])], (base ?? []).map(([label]) => [label, ...lines.map((l) => rowValue(pick(l), label))]));
  Array.from(t.tBodies[0]?.rows ?? []).forEach((tr, i) => (tr.dataset.label = base ? base[i][0] : ""));
}

const SUMMARY: ReadonlyArray<readonly [string, "bt" | "es", string]> = [
  ["Observations used", "bt", "Forecast days"],
  ["Exceptions", "bt", "Exceptions"],
  ["Expected exceptions", "bt", "Expected"],
  ["Kupiec p-value", "bt", "Kupiec p-value"],
  ["Independence p-value", "bt", "Christoffersen p-value"],
  ["Traffic-light zone", "bt", "Zone"],
  ["Z2", "es", "ES: Z2"],
  ["Z2 p-value (simulated)", "es", "ES: Z2 p-value"],
  ["ES traffic-light zone", "es", "ES zone"],
];

function renderVerdictTable(t: HTMLTableElement, lines: readonly LineResult[]): void {
  const per = lines.map((l) => tailVerdicts(l.backtest, l.es));
  const keys: Array<{ question: string; test: string }> = [];
  for (const vs of per) for (const v of vs) if (!keys.some((k) => k.question === v.question && k.test === v.test)) keys.push(v);
  t.replaceChildren();
  const thead = document.createElement("thead");
  const hr = document.createElement("tr");
  ["test", ...lines.map((l) => SHORT[l.model])].forEach((h) => hr.appendChild(cell("th", h)));
  thead.appendChild(hr);
  const body = document.createElement("tbody");
  let question = "";
  for (const k of keys) {
    if (k.question !== question) {
      question = k.question;
      const g = document.createElement("tr");
      g.className = "group";
      const th = cell("th", question);
      th.colSpan = 1 + lines.length;
      th.scope = "colgroup";
      g.appendChild(th);
      body.appendChild(g);
    }
    const tr = document.createElement("tr");
    tr.dataset.test = k.test;
    tr.appendChild(cell("th", k.test));
    per.forEach((vs) => {
      const v: Verdict | undefined = vs.find((x) => x.question === k.question && x.test === k.test);
      const td = document.createElement("td");
      const outcome = v ? v.outcome : "n/a";
      td.className = `verdict verdict-${outcome === "n/a" ? "na" : outcome}`;
      const word = document.createElement("strong");
      word.textContent = outcome;
      const detail = document.createElement("span");
      detail.className = "detail";
      detail.textContent = v ? v.detail : "no result";
      td.append(word, detail);
      tr.appendChild(td);
    });
    body.appendChild(tr);
  }
  t.append(thead, body);
}

function answerOf(r: VolResult): string {
  const lvl = pct(r.spec.level);
  const say1 = (l: LineResult): string => {
    const bt = l.backtest;
    if (!bt) return `${MODEL_LABELS[l.model]}: no day has a forecast to test${l.firstProblem ? ` (${l.firstProblem})` : ""}.`;
    const es = l.es ? `; ES Z2 p ${show(l.es.z2PValue.pValue)}` : "";
    return `${MODEL_LABELS[l.model]}: ${bt.exceptions} exceptions in ${bt.observations} days (${show(bt.expectedExceptions)} expected), ${bt.zone} zone, Kupiec p ${show(bt.kupiec.pValue)}${es}.`;
  };
  const [a, b] = r.lines;
  return `${lvl} VaR, ${r.spec.side} side, ${r.spec.window}-day window. ${say1(a)}${b ? ` Same windows, ${say1(b).charAt(0).toLowerCase()}${say1(b).slice(1)}` : ""}`;
}

function columnsText(data: Float64Array, r: VolResult): string {
  const head = ["return", ...r.lines.flatMap((l) => [`VaR ${SHORT[l.model]}`, `ES ${SHORT[l.model]}`, `PIT ${SHORT[l.model]}`]), "sigma"];
  const num = (x: number): string => (Number.isNaN(x) ? "" : String(x));
  const out = [head.join("\t")];
  for (let i = 0; i < data.length; i++) {
    out.push([num(data[i]), ...r.lines.flatMap((l) => [num(l.valueAtRisk[i]), num(l.expectedShortfall[i]), num(l.pit[i])]), r.sigmas ? num(r.sigmas[i]) : ""].join("\t"));
  }
  return out.join("\n");
}

function renderVol(r: VolResult): void {
  const data = state.data!;
  $("vol-results").hidden = false;
  $("vol-answer").textContent = answerOf(r);
  const problems = r.lines.filter((l) => l.problemRows > 0).map((l) => `${MODEL_LABELS[l.model]}: ${l.problemRows} day(s) without a forecast (${l.firstProblem}); the cells show an error there.`);
  if (problems.length) volSay(problems.join(" "));
  const summary = $<HTMLTableElement>("vol-summary");
  fillTable(
    summary,
    ["", ...r.lines.map((l) => SHORT[l.model])],
    SUMMARY.map(([label, from, text]) => [text, ...r.lines.map((l) => rowValue(from === "bt" ? l.backtestRows : l.esRows, label))]),
  );
  Array.from(summary.tBodies[0].rows).forEach((tr, i) => (tr.dataset.label = SUMMARY[i][0]));
  $("chart-backtest").replaceChildren(
    backtestChart(
      data,
      r.lines.map((l) => ({ label: SHORT[l.model], values: l.valueAtRisk, exceptions: l.exceptions, className: "" })),
      r.spec.side,
      pct(r.spec.level),
    ),
  );
  renderVerdictTable($<HTMLTableElement>("vol-verdicts"), r.lines);
  renderMethods(r);
  if (r.sigmas) $("chart-vol").replaceChildren(volatilityChart(data, r.sigmas, MODEL_LABELS[r.spec.model]));
  else $("chart-vol").textContent = r.sigmaProblem ?? "";
  sideBySide($<HTMLTableElement>("vol-bt-rows"), r.lines, (l) => l.backtestRows);
  sideBySide($<HTMLTableElement>("vol-es-rows"), r.lines, (l) => l.esRows);
  fillTable(
    $<HTMLTableElement>("vol-report"),
    ["", "value"],
    r.report ? r.report.map(([label, v]) => [label, shownValue(v)]) : [["No report", r.reportProblem ?? ""]],
  );
  $<HTMLTextAreaElement>("vol-columns").value = columnsText(data, r);
}

function loadScenario(s: DemoScenario): void {
  const values = scenarioData(s);
  $<HTMLTextAreaElement>("paste").value = "";
  useData(values, s.title);
  void run();
}

/** Reads pasted or dropped text in short slices (progress and Cancel work meanwhile), then analyses it. */
async function analysePasted(text: string, origin: string): Promise<void> {
  if (state.running) {
    state.running.cancelled = true;
    state.comparisons.cancel(new Cancelled());
  }
  const token = { cancelled: false };
  state.running = token;
  const app = $("app");
  $("progress").hidden = false;
  app.dataset.state = "busy";
  $("results").dataset.stale = "true";
  say("");
  try {
    const read = await readColumnInSlices(text, {
      isCancelled: () => token.cancelled,
      onProgress: (p) => {
        $<HTMLProgressElement>("progress-bar").value = p.fraction;
        $("progress-text").textContent = "reading the data…";
        app.dataset.readYields = String(p.yields);
        app.dataset.readSlices = String(p.slices);
      },
    });
    if (state.running !== token) return;
    state.running = null;
    const col = read.column;
    useData(col.values, col.label ? `${origin}: column "${col.label}"` : origin);
    void run();
  } catch (e) {
    if (state.running !== token) return; // a newer paste or run owns the screen
    state.running = null;
    $("progress").hidden = true;
    clearResults();
    if (e instanceof InputProblem) {
      say(e.message);
      app.dataset.state = "input-error";
    } else if (e instanceof ReadCancelled) {
      say("Analysis cancelled.");
      app.dataset.state = "stopped";
    } else throw e;
  }
}

function wireStandalone(): void {
  $("demo").addEventListener("click", () => loadScenario(DEMO));
  $("demo-capped").addEventListener("click", () => loadScenario(CAPPED_DEMO));
  $("demo-cluster").addEventListener("click", () => loadScenario(CLUSTER_DEMO));
  $("analyse").addEventListener("click", () => {
    const text = $<HTMLTextAreaElement>("paste").value;
    if (text.trim() === "" && state.data) void run();
    else void analysePasted(text, "Pasted data");
  });
  const readFile = (file: File): void => {
    void file.text().then((t) => analysePasted(t, `File ${file.name}`));
  };
  $<HTMLInputElement>("file").addEventListener("change", (ev) => {
    const f = (ev.target as HTMLInputElement).files?.[0];
    if (f) readFile(f);
  });
  const zone = $("standalone-source");
  zone.addEventListener("dragover", (ev) => {
    ev.preventDefault();
    zone.classList.add("dropping");
  });
  zone.addEventListener("dragleave", () => zone.classList.remove("dropping"));
  zone.addEventListener("drop", (ev) => {
    ev.preventDefault();
    zone.classList.remove("dropping");
    const f = ev.dataTransfer?.files?.[0];
    if (f) readFile(f);
  });
}

async function analyseSheet(choice: SourceChoice = state.source): Promise<void> {
  if (!state.host) return;
  try {
    const sheet = await readSource(state.host, choice);
    state.sheet = sheet;
    const values = readData(sheet.values, sheet.address);
    useData(values, `${sheet.reference} (${sheet.address})`);
    await run();
  } catch (e) {
    clearResults();
    if (e instanceof CellError) say(e.message);
    else say(`Could not read the workbook: ${e instanceof Error ? e.message : String(e)}`);
  }
}

async function wireHost(host: ExcelHost): Promise<void> {
  state.host = host;
  const pick = $<HTMLSelectElement>("source-pick");
  const varPick = $<HTMLSelectElement>("live-var");
  const options = await listSources(host).catch(() => []);
  const byValue = new Map<string, SourceChoice>([["selection", { kind: "selection" }]]);
  options.forEach((o, i) => {
    const v = `s${i}`;
    byValue.set(v, o.choice);
    pick.appendChild(new Option(o.label, v));
    const ref = o.choice.kind === "name" ? o.choice.name : o.choice.kind === "tableColumn" ? `${o.choice.table}[${o.choice.column}]` : "";
    if (ref) varPick.appendChild(new Option(o.label, ref));
  });
  pick.addEventListener("change", () => (state.source = byValue.get(pick.value) ?? { kind: "selection" }));
  $("analyse").addEventListener("click", () => void analyseSheet(state.source));
  // The change watcher needs ExcelApi 1.9 (WorksheetCollection.onChanged): offered only where the host has it.
  const office = typeof Office !== "undefined" ? Office : null;
  const watchable = canWatchChanges(office?.context?.requirements);
  const auto = $<HTMLInputElement>("auto-refresh");
  if (!watchable) {
    auto.checked = false;
    auto.disabled = true;
    $("auto-refresh-note").textContent = "This version of the spreadsheet cannot report cell edits to the pane (it needs ExcelApi 1.9): use Analyse after editing.";
  }
  // Watch and analyse only while the pane is shown (the shared runtime also runs, hidden, for the functions).
  const onVisibility = async (visible: boolean): Promise<void> => {
    if (!visible) {
      const stop = state.unwatch;
      state.unwatch = null;
      if (stop) await stop().catch(() => undefined);
      return;
    }
    if (watchable && !state.unwatch) {
      state.unwatch = await watchChanges(host, (address) => {
        if (auto.checked && state.sheet && overlaps(address, state.sheet.address)) {
          void analyseSheet(state.source.kind === "selection" ? { kind: "address", address: state.sheet.address } : state.source);
        }
      }).catch(() => null);
    }
    await analyseSheet();
  };
  const addin = (office as unknown as { addin?: AddinEvents } | null)?.addin ?? null;
  const visibility = followVisibility(addin, document, (v) => void onVisibility(v));
  $("write").addEventListener("click", () => void writeBlock(false));
  $("confirm-yes").addEventListener("click", () => {
    $("confirm").hidden = true;
    void writeBlock(true);
  });
  $("confirm-no").addEventListener("click", () => {
    $("confirm").hidden = true;
    $("live-note").textContent = "Nothing written; your cells are unchanged.";
  });
  if (visibility.visible()) await onVisibility(true);
}

async function writeBlock(overwrite: boolean): Promise<void> {
  if (!state.host || !state.sheet) {
    $("live-note").textContent = "Analyse a range first.";
    return;
  }
  try {
    const out = await writeFormulaBlock(state.host, state.sheet, liveSpec(), overwrite);
    if (out.status === "occupied") {
      $("confirm-text").textContent = `${out.address} already holds ${out.filledCells} filled cell${out.filledCells === 1 ? "" : "s"}. Overwrite them with the formula block?`;
      $("confirm").hidden = false;
    } else $("live-note").textContent = `Formulas written to ${out.address}.`;
  } catch (e) {
    $("live-note").textContent = `Could not write: ${e instanceof Error ? e.message : String(e)}`;
  }
}

function wireCommon(): void {
  $("cancel").addEventListener("click", () => {
    if (state.running) state.running.cancelled = true;
    state.comparisons.cancel(new Cancelled());
  });
  $("tail-long").addEventListener("click", () => {
    state.tailSide = "long";
    if (state.analysis) renderTail(state.analysis);
  });
  $("tail-short").addEventListener("click", () => {
    state.tailSide = "short";
    if (state.analysis) renderTail(state.analysis);
  });
  $("method").addEventListener("change", () => void run());
  $("vol-run").addEventListener("click", () => void runVol());
  $("horizon").addEventListener("change", () => state.analysis && renderHorizon(state.analysis));
  $("vol-cancel").addEventListener("click", () => state.vol.cancel());
  $("live-level").addEventListener("change", () => state.analysis && renderPreview(state.analysis));
}

/** Starts the pane; `host` is the office-js Excel namespace, or null to run standalone. */
export function startPane(host: ExcelHost | null, scriptUrl: string | null = null): void {
  state.comparisons = new ComparisonRunner(scriptUrl);
  state.vol = new VolRunner(scriptUrl);
  const app = $("app");
  app.dataset.mode = host ? "host" : "standalone";
  wireCommon();
  if (host) {
    void wireHost(host);
  } else {
    wireStandalone();
    loadScenario(DEMO);
  }
}

/** For the standalone page: the demo scenarios, so a test or a reader can regenerate the numbers. */
export const scenarios = { DEMO, CAPPED_DEMO, CLUSTER_DEMO };
