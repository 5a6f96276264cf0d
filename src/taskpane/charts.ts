/**
 * The pane's three pictures as plain SVG built with DOM calls: no chart library (no dependency, nothing
 * fetched, nothing inline for the Content-Security-Policy to refuse). Colours and styling live in
 * taskpane.css (classes only); series differ by dash and marker as well as colour; every chart carries a
 * <title>, a <desc> written for a screen reader, and an aria-label.
 *
 * The curves come from core (gno pdf/cdf/quantile, the normal density); this file only places points.
 * Histogram bins follow the Freedman–Diaconis rule (width 2·IQR·n^(−1/3); Freedman & Diaconis 1981), capped
 * to 12–60 bins for the pane's width.
 */
import { cdf, pdf, quantile, type GnoParams } from "../core/gno";
import { normalCdf, normalPdf } from "../core/normal";
import { splicedCdf, splicedSf, type MeanExcessPoint, type SplicedParams } from "../core/pareto";

const SVG = "http://www.w3.org/2000/svg";
const W = 320;
const H = 190;
const M = { left: 44, right: 10, top: 10, bottom: 30 };

type Attrs = Record<string, string | number>;

function el<K extends keyof SVGElementTagNameMap>(tag: K, attrs: Attrs = {}, text?: string): SVGElementTagNameMap[K] {
  const e = document.createElementNS(SVG, tag);
  for (const [k, v] of Object.entries(attrs)) e.setAttribute(k, String(v));
  if (text !== undefined) e.textContent = text;
  return e;
}

/** Maps [d0, d1] onto [r0, r1]. */
export function linear(d0: number, d1: number, r0: number, r1: number): (x: number) => number {
  const s = d1 === d0 ? 0 : (r1 - r0) / (d1 - d0);
  return (x) => r0 + (x - d0) * s;
}

/** About `count` round tick values covering [lo, hi] (steps of 1, 2 or 5 × 10^k). */
export function niceTicks(lo: number, hi: number, count = 5): number[] {
  if (!(hi > lo)) return [lo];
  const raw = (hi - lo) / count;
  const mag = Math.pow(10, Math.floor(Math.log10(raw)));
  const step = [1, 2, 5, 10].map((m) => m * mag).find((s) => s >= raw) ?? 10 * mag;
  const out: number[] = [];
  for (let t = Math.ceil(lo / step) * step; t <= hi + step * 1e-9; t += step) out.push(Math.abs(t) < step * 1e-9 ? 0 : Number(t.toPrecision(12)));
  return out;
}

/** Short tick text: 0.012 → "0.012", 1e-5 → "1e-5". */
export function tickText(x: number): string {
  if (x === 0) return "0";
  const a = Math.abs(x);
  if (a < 1e-3 || a >= 1e5) return x.toExponential(0).replace("e+", "e");
  return String(Number(x.toPrecision(3)));
}

export interface Bins {
  readonly edges: number[];
  readonly counts: number[];
}

/** Freedman–Diaconis histogram of sorted data (12 to 60 bins). */
export function histogramBins(sorted: ArrayLike<number>): Bins {
  const n = sorted.length;
  const lo = sorted[0];
  const hi = sorted[n - 1];
  const iqr = sorted[Math.floor(0.75 * (n - 1))] - sorted[Math.floor(0.25 * (n - 1))];
  const width = iqr > 0 ? (2 * iqr) / Math.cbrt(n) : (hi - lo) / 12;
  const k = Math.min(60, Math.max(12, Math.ceil((hi - lo) / width)));
  const step = (hi - lo) / k;
  const edges = Array.from({ length: k + 1 }, (_, i) => lo + i * step);
  const counts = new Array<number>(k).fill(0);
  for (let i = 0; i < n; i++) counts[Math.min(k - 1, Math.floor((sorted[i] - lo) / step))]++;
  return { edges, counts };
}

function frame(label: string, description: string, className: string): { svg: SVGSVGElement; plot: SVGGElement } {
  const id = `c${Math.random().toString(36).slice(2, 9)}`;
  const svg = el("svg", { viewBox: `0 0 ${W} ${H}`, class: `chart ${className}`, role: "img", "aria-label": label, "aria-labelledby": `${id}t ${id}d` });
  svg.appendChild(el("title", { id: `${id}t` }, label));
  svg.appendChild(el("desc", { id: `${id}d` }, description));
  const plot = el("g");
  svg.appendChild(plot);
  return { svg, plot };
}

function axes(
  g: SVGGElement,
  x: (v: number) => number,
  y: (v: number) => number,
  xTicks: number[],
  yTicks: number[],
  xLabel: string,
  yLabel: string,
  yTickText: (v: number) => string = tickText,
): void {
  const axis = el("g", { class: "axis" });
  axis.appendChild(el("line", { x1: M.left, x2: W - M.right, y1: H - M.bottom, y2: H - M.bottom }));
  axis.appendChild(el("line", { x1: M.left, x2: M.left, y1: M.top, y2: H - M.bottom }));
  for (const t of xTicks) {
    const px = x(t);
    if (px < M.left - 0.5 || px > W - M.right + 0.5) continue;
    axis.appendChild(el("line", { x1: px, x2: px, y1: H - M.bottom, y2: H - M.bottom + 3 }));
    axis.appendChild(el("text", { x: px, y: H - M.bottom + 13, "text-anchor": "middle" }, tickText(t)));
  }
  for (const t of yTicks) {
    const py = y(t);
    if (py < M.top - 0.5 || py > H - M.bottom + 0.5) continue;
    axis.appendChild(el("line", { x1: M.left - 3, x2: M.left, y1: py, y2: py }));
    axis.appendChild(el("line", { x1: M.left, x2: W - M.right, y1: py, y2: py, class: "grid" }));
    axis.appendChild(el("text", { x: M.left - 5, y: py + 3, "text-anchor": "end" }, yTickText(t)));
  }
  axis.appendChild(el("text", { x: (M.left + W - M.right) / 2, y: H - 3, "text-anchor": "middle", class: "axis-label" }, xLabel));
  axis.appendChild(
    el("text", { x: 10, y: (M.top + H - M.bottom) / 2, "text-anchor": "middle", class: "axis-label", transform: `rotate(-90 10 ${(M.top + H - M.bottom) / 2})` }, yLabel),
  );
  g.appendChild(axis);
}

function path(points: Array<[number, number]>, className: string): SVGPathElement {
  let d = "";
  let pen = false;
  for (const [px, py] of points) {
    if (!Number.isFinite(px) || !Number.isFinite(py)) {
      pen = false;
      continue;
    }
    d += `${pen ? "L" : "M"}${px.toFixed(1)},${py.toFixed(1)}`;
    pen = true;
  }
  return el("path", { d, class: className });
}

function legend(g: SVGGElement, items: Array<{ text: string; className: string; marker?: "circle" | "bar" }>): void {
  const box = el("g", { class: "legend" });
  let x = M.left + 6;
  for (const it of items) {
    if (it.marker === "circle") box.appendChild(el("circle", { cx: x + 7, cy: M.top + 6, r: 2.6, class: it.className }));
    else if (it.marker === "bar") box.appendChild(el("rect", { x, y: M.top + 2, width: 14, height: 8, class: it.className }));
    else box.appendChild(el("line", { x1: x, x2: x + 14, y1: M.top + 6, y2: M.top + 6, class: it.className }));
    const t = el("text", { x: x + 18, y: M.top + 9 }, it.text);
    box.appendChild(t);
    x += 24 + it.text.length * 5.2;
  }
  g.appendChild(box);
}

export interface NormalLaw {
  readonly mean: number;
  readonly sd: number;
}

/** Histogram (as a density) with the fitted GNO density (solid) and the normal density (dashed). */
export function histogramChart(sorted: ArrayLike<number>, p: GnoParams, normal: NormalLaw): SVGSVGElement {
  const bins = histogramBins(sorted);
  const n = sorted.length;
  const step = bins.edges[1] - bins.edges[0];
  const lo = bins.edges[0];
  const hi = bins.edges[bins.edges.length - 1];
  const pad = (hi - lo) * 0.04;
  const x = linear(lo - pad, hi + pad, M.left, W - M.right);
  const curve = (f: (v: number) => number): Array<[number, number]> =>
    Array.from({ length: 161 }, (_, i) => {
      const v = lo - pad + ((hi - lo + 2 * pad) * i) / 160;
      return [v, f(v)];
    });
  const fitted = curve((v) => pdf(v, p));
  const gauss = curve((v) => normalPdf((v - normal.mean) / normal.sd) / normal.sd);
  let peak = 0;
  for (const c of bins.counts) peak = Math.max(peak, c / (n * step));
  for (const q of fitted) if (Number.isFinite(q[1])) peak = Math.max(peak, q[1]);
  for (const q of gauss) if (Number.isFinite(q[1])) peak = Math.max(peak, q[1]);
  const y = linear(0, peak * 1.12, H - M.bottom, M.top);
  const { svg, plot } = frame(
    "Histogram of the data with fitted densities",
    `Histogram of ${n} returns from ${tickText(lo)} to ${tickText(hi)} in ${bins.counts.length} bins, drawn as a density. ` +
      "A solid line shows the fitted generalized normal density; a dashed line shows the normal density with the sample mean and standard deviation.",
    "chart-hist",
  );
  axes(plot, x, y, niceTicks(lo, hi, 5), niceTicks(0, peak * 1.1, 4), "return", "density");
  const bars = el("g", { class: "bars" });
  bins.counts.forEach((c, i) => {
    const h = c / (n * step);
    const x0 = x(bins.edges[i]);
    const x1 = x(bins.edges[i + 1]);
    bars.appendChild(el("rect", { x: x0 + 0.3, y: y(h), width: Math.max(0.4, x1 - x0 - 0.6), height: Math.max(0, y(0) - y(h)) }));
  });
  plot.appendChild(bars);
  plot.appendChild(path(gauss.map(([v, d]) => [x(v), y(d)]), "series-normal"));
  plot.appendChild(path(fitted.map(([v, d]) => [x(v), y(d)]), "series-fit"));
  legend(plot, [
    { text: "data", className: "legend-bar", marker: "bar" },
    { text: "fitted", className: "series-fit" },
    { text: "normal", className: "series-normal" },
  ]);
  return svg;
}

/** QQ plot: sorted data against fitted quantiles at (i − 0.5)/n, with the 45° line. */
export function qqChart(sorted: ArrayLike<number>, p: GnoParams): SVGSVGElement {
  const n = sorted.length;
  const pts: Array<[number, number]> = [];
  for (let i = 0; i < n; i++) pts.push([quantile((i + 0.5) / n, p), sorted[i]]);
  // plain loops: spreading 100,000+ values into one call overflows the call stack
  let lo = Infinity;
  let hi = -Infinity;
  for (const [a, b] of pts) {
    if (Number.isFinite(a)) {
      lo = Math.min(lo, a);
      hi = Math.max(hi, a);
    }
    if (Number.isFinite(b)) {
      lo = Math.min(lo, b);
      hi = Math.max(hi, b);
    }
  }
  const pad = (hi - lo) * 0.04;
  const x = linear(lo - pad, hi + pad, M.left, W - M.right);
  const y = linear(lo - pad, hi + pad, H - M.bottom, M.top);
  const { svg, plot } = frame(
    "Quantile plot against the fitted law",
    `Each of the ${n} sorted returns plotted against the fitted law's quantile at the same rank. ` +
      "Points on the dashed diagonal mean the fit matches; points bending away at the ends show tails the fit misses.",
    "chart-qq",
  );
  const ticks = niceTicks(lo, hi, 5);
  axes(plot, x, y, ticks, ticks, "fitted quantile", "observed return");
  plot.appendChild(path([[x(lo - pad), y(lo - pad)], [x(hi + pad), y(hi + pad)]], "series-reference"));
  const dots = el("g", { class: "series-points" });
  const stride = Math.max(1, Math.floor(n / 1500));
  for (let i = 0; i < n; i += stride) if (Number.isFinite(pts[i][0])) dots.appendChild(el("circle", { cx: x(pts[i][0]).toFixed(1), cy: y(pts[i][1]).toFixed(1), r: 1.8 }));
  plot.appendChild(dots);
  legend(plot, [
    { text: "data", className: "series-points", marker: "circle" },
    { text: "perfect fit", className: "series-reference" },
  ]);
  return svg;
}

/**
 * Tail view on the loss side: losses (−return for a long position, +return for a short one) against the
 * probability of a loss at least that large, on a log scale. Empirical points (rank i of n largest: i/n),
 * fitted GNO (solid), normal (dashed).
 */
export function tailChart(sorted: ArrayLike<number>, p: GnoParams, normal: NormalLaw, side: "long" | "short", spliced: SplicedParams | null = null): SVGSVGElement {
  const n = sorted.length;
  const losses: number[] = [];
  for (let i = 0; i < n; i++) losses.push(side === "long" ? -sorted[i] : sorted[n - 1 - i]);
  losses.sort((a, b) => b - a);
  const m = Math.max(10, Math.ceil(n * 0.15));
  const top = losses.slice(0, Math.min(m, n));
  const emp: Array<[number, number]> = top.map((l, i) => [l, (i + 1) / n]);
  const minProb = Math.min(1 / n, 1e-3) / 3;
  const lo = top[top.length - 1];
  const hi = top[0] + (top[0] - lo) * 0.25;
  const exceed = (l: number): number => (side === "long" ? cdf(-l, p) : 1 - cdf(l, p));
  const exceedNormal = (l: number): number => normalCdf(side === "long" ? (-l - normal.mean) / normal.sd : -(l - normal.mean) / normal.sd);
  const grid = Array.from({ length: 121 }, (_, i) => lo + ((hi - lo) * i) / 120);
  const logMin = Math.floor(Math.log10(minProb));
  let empMax = 0;
  for (const e of emp) empMax = Math.max(empMax, e[1]);
  const logMax = Math.ceil(Math.log10(empMax));
  const x = linear(lo, hi, M.left, W - M.right);
  const y = linear(logMin, logMax, H - M.bottom, M.top);
  const ly = (q: number): number => (q > 0 && Math.log10(q) >= logMin ? y(Math.log10(q)) : NaN);
  const who = side === "long" ? "long position (loss = −return)" : "short position (loss = +return)";
  const { svg, plot } = frame(
    `Loss tail for a ${side} position`,
    `Largest ${top.length} losses of a ${who} against the share of days with a loss at least that large, log scale from 1e${logMin} to 1e${logMax}. ` +
      "Hollow circles: the data; solid line: fitted generalized normal; dashed line: normal" +
      (spliced ? "; dash-dot line: the law with generalized Pareto tails spliced on beyond the thresholds" : "") +
      ". A line below the circles understates the tail.",
    "chart-tail",
  );
  const yTicks: number[] = [];
  for (let k = logMin; k <= logMax; k++) yTicks.push(k);
  axes(plot, x, y, niceTicks(lo, hi, 5), yTicks, `loss, ${side} side`, "P(loss ≥ x)", (k) => `1e${k}`);
  plot.appendChild(path(grid.map((l) => [x(l), ly(exceedNormal(l))]), "series-normal"));
  plot.appendChild(path(grid.map((l) => [x(l), ly(exceed(l))]), "series-fit"));
  if (spliced) {
    const exceedSpliced = (l: number): number => (side === "long" ? splicedCdf(-l, spliced) : splicedSf(l, spliced));
    plot.appendChild(path(grid.map((l) => [x(l), ly(exceedSpliced(l))]), "series-spliced"));
  }
  const dots = el("g", { class: "series-empirical" });
  for (const [l, q] of emp) dots.appendChild(el("circle", { cx: x(l).toFixed(1), cy: ly(q).toFixed(1), r: 2.4 }));
  plot.appendChild(dots);
  legend(plot, [
    { text: "data", className: "series-empirical", marker: "circle" },
    { text: "fitted", className: "series-fit" },
    ...(spliced ? [{ text: "Pareto tail", className: "series-spliced" }] : []),
    { text: "normal", className: "series-normal" },
  ]);
  return svg;
}

/** A series along the day axis for the backtest and volatility pictures. */
export interface DayLine {
  readonly label: string;
  /** Per data row; NaN where the line has no value. */
  readonly values: ArrayLike<number>;
  readonly className: string;
}

function dayRange(values: ReadonlyArray<ArrayLike<number>>, from: number, to: number): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of values) {
    for (let i = from; i < to; i++) {
      const x = v[i];
      if (Number.isFinite(x)) {
        if (x < lo) lo = x;
        if (x > hi) hi = x;
      }
    }
  }
  return lo <= hi ? [lo, hi] : [0, 1];
}

/** Conditional volatility σₜ over the days (solid), with |return| as faint dots for context. */
export function volatilityChart(returns: ArrayLike<number>, sigmas: ArrayLike<number>, modelLabel: string): SVGSVGElement {
  const n = returns.length;
  const abs = Array.from(returns, (r) => Math.abs(r));
  const [, hi] = dayRange([abs, sigmas], 0, n);
  const x = linear(0, Math.max(1, n - 1), M.left, W - M.right);
  const y = linear(0, hi * 1.08, H - M.bottom, M.top);
  let sLo = Infinity;
  let sHi = -Infinity;
  for (let i = 0; i < n; i++) if (Number.isFinite(sigmas[i])) [sLo, sHi] = [Math.min(sLo, sigmas[i]), Math.max(sHi, sigmas[i])];
  const { svg, plot } = frame(
    `Volatility over time, ${modelLabel}`,
    `Conditional volatility of each of ${n} days under ${modelLabel}, from ${tickText(sLo)} to ${tickText(sHi)} (solid line), ` +
      "with the size of each day's return as faint dots. Where the line rises, the model expects larger moves.",
    "chart-vol",
  );
  axes(plot, x, y, niceTicks(0, n - 1, 5), niceTicks(0, hi * 1.05, 4), "day", "volatility / |return|");
  const stride = Math.max(1, Math.floor(n / 1500));
  const dots = el("g", { class: "series-faint" });
  for (let i = 0; i < n; i += stride) dots.appendChild(el("circle", { cx: x(i).toFixed(1), cy: y(abs[i]).toFixed(1), r: 1 }));
  plot.appendChild(dots);
  const pts: Array<[number, number]> = [];
  for (let i = 0; i < n; i += stride) pts.push([x(i), Number.isFinite(sigmas[i]) ? y(sigmas[i]) : NaN]);
  plot.appendChild(path(pts, "series-fit"));
  legend(plot, [
    { text: "σ", className: "series-fit" },
    { text: "|return|", className: "series-faint", marker: "circle" },
  ]);
  return svg;
}

/** Marker for an exception: a filled triangle (first line) or a hollow square (second line). */
function hitMarker(px: number, py: number, kind: 0 | 1): SVGElement {
  if (kind === 0) return el("path", { d: `M${px.toFixed(1)},${(py - 3.6).toFixed(1)}L${(px + 3.4).toFixed(1)},${(py + 2.4).toFixed(1)}L${(px - 3.4).toFixed(1)},${(py + 2.4).toFixed(1)}Z` });
  return el("rect", { x: (px - 3.2).toFixed(1), y: (py - 3.2).toFixed(1), width: 6.4, height: 6.4 });
}

/**
 * Backtest picture from the first forecast day: returns as dots, each line's loss threshold (−VaR for a long
 * position, +VaR for a short one) and its exceptions — first line: solid threshold and filled triangles; second
 * line: dashed threshold and hollow squares (shape and colour both differ).
 */
export function backtestChart(
  returns: ArrayLike<number>,
  lines: ReadonlyArray<DayLine & { readonly exceptions: ArrayLike<number> }>,
  side: "long" | "short",
  levelText: string,
): SVGSVGElement {
  const n = returns.length;
  let first = n;
  for (const l of lines) for (let i = 0; i < n; i++) if (Number.isFinite(l.values[i])) { first = Math.min(first, i); break; }
  if (first >= n) first = 0;
  const sign = side === "long" ? -1 : 1;
  const thresholds = lines.map((l) => Array.from(l.values, (v) => sign * v));
  const [lo, hi] = dayRange([returns, ...thresholds], first, n);
  const pad = (hi - lo) * 0.05;
  const x = linear(first, Math.max(first + 1, n - 1), M.left, W - M.right);
  const y = linear(lo - pad, hi + pad, H - M.bottom, M.top);
  const counts = lines.map((l) => {
    let c = 0;
    for (let i = 0; i < n; i++) c += l.exceptions[i] ? 1 : 0;
    return c;
  });
  const { svg, plot } = frame(
    `Backtest of ${levelText} VaR, ${side} side`,
    `Returns of days ${first + 1} to ${n} as dots, with each model's loss threshold (${side === "long" ? "minus VaR" : "VaR"}) as a line. ` +
      lines.map((l, k) => `${l.label}: ${k === 0 ? "solid line, exceptions as filled triangles" : "dashed line, exceptions as hollow squares"}, ${counts[k]} exceptions.`).join(" "),
    "chart-backtest",
  );
  axes(plot, x, y, niceTicks(first, n - 1, 5), niceTicks(lo, hi, 5), "day", "return");
  const stride = Math.max(1, Math.floor((n - first) / 1500));
  const dots = el("g", { class: "series-faint" });
  for (let i = first; i < n; i += stride) dots.appendChild(el("circle", { cx: x(i).toFixed(1), cy: y(returns[i]).toFixed(1), r: 1.1 }));
  plot.appendChild(dots);
  lines.forEach((l, k) => {
    const pts: Array<[number, number]> = [];
    for (let i = first; i < n; i += stride) pts.push([x(i), Number.isFinite(thresholds[k][i]) ? y(thresholds[k][i]) : NaN]);
    plot.appendChild(path(pts, k === 0 ? "series-fit" : "series-normal"));
  });
  // Second line's markers first, so the first line's triangles sit on top where both lines are exceeded.
  for (let k = lines.length - 1; k >= 0; k--) {
    const g = el("g", { class: k === 0 ? "series-hit-first" : "series-hit-second" });
    for (let i = first; i < n; i++) if (lines[k].exceptions[i]) g.appendChild(hitMarker(x(i), y(returns[i]), k === 0 ? 0 : 1));
    plot.appendChild(g);
  }
  legend(
    plot,
    lines.map((l, k) => ({ text: `${l.label} (${counts[k]})`, className: k === 0 ? "series-fit" : "series-normal" })),
  );
  return svg;
}

/**
 * Mean-excess plot on one loss side: the data's mean excess e(u) at order-statistic thresholds (hollow circles,
 * from core's sampleMeanExcess), with the fitted Pareto tail's mean excess beyond its threshold (dash-dot line),
 * which for a generalized Pareto law is linear in the distance d beyond the threshold: (β + ξd)/(1 − ξ) for ξ < 1
 * (Davison & Smith 1990). Losses are drawn positive (−return on the long side). A vertical rule marks the threshold.
 */
export function meanExcessChart(points: readonly MeanExcessPoint[], side: "long" | "short", tail: { threshold: number; shape: number; scale: number } | null): SVGSVGElement {
  const loss = (u: number): number => (side === "long" ? -u : u);
  const pts = points.map((q) => [loss(q.threshold), q.meanExcess] as [number, number]);
  const xs = pts.map((q) => q[0]);
  const lo = smallest(xs);
  const hi = largest(xs);
  const line: Array<[number, number]> = [];
  if (tail && tail.shape < 1) {
    const t = loss(tail.threshold);
    for (let i = 0; i <= 40; i++) {
      const v = t + ((hi - t) * i) / 40;
      line.push([v, (tail.scale + tail.shape * (v - t)) / (1 - tail.shape)]);
    }
  }
  const ys = [...pts.map((q) => q[1]), ...line.map((q) => q[1])];
  const yHi = largest(ys) * 1.1;
  const x = linear(lo, hi, M.left, W - M.right);
  const y = linear(0, yHi, H - M.bottom, M.top);
  const who = side === "long" ? "loss of a long position (−return)" : "loss of a short position (+return)";
  const { svg, plot } = frame(
    `Mean excess, ${side} side`,
    `For ${points.length} thresholds on the ${who} from ${tickText(lo)} to ${tickText(hi)}, the average amount by which losses beyond the threshold exceed it (hollow circles). ` +
      (tail
        ? `The dash-dot line is the fitted Pareto tail's mean excess beyond its threshold ${tickText(loss(tail.threshold))} (vertical rule). A straight rising stretch of circles supports a heavy Pareto tail; circles close to the line support the threshold.`
        : "No Pareto tail was fitted on this side."),
    "chart-mean-excess",
  );
  axes(plot, x, y, niceTicks(lo, hi, 5), niceTicks(0, yHi, 4), `threshold (loss, ${side} side)`, "mean excess");
  if (tail) {
    const tx = x(loss(tail.threshold));
    plot.appendChild(el("line", { x1: tx, x2: tx, y1: M.top, y2: H - M.bottom, class: "rule-threshold" }));
  }
  if (line.length) plot.appendChild(path(line.map(([v, e]) => [x(v), y(e)]), "series-spliced"));
  const dots = el("g", { class: "series-empirical" });
  for (const [v, e] of pts) dots.appendChild(el("circle", { cx: x(v).toFixed(1), cy: y(e).toFixed(1), r: 2.2 }));
  plot.appendChild(dots);
  legend(plot, [
    { text: "data", className: "series-empirical", marker: "circle" },
    ...(tail ? [{ text: "Pareto tail", className: "series-spliced" }] : []),
  ]);
  return svg;
}

/** One-day law (solid) and the h-day law of the sum of h independent days (dash-dot), as densities. */
export function horizonChart(oneDay: GnoParams, hDay: { horizon: number; pdf(x: number): number; quantile(p: number): number }): SVGSVGElement {
  const lo = Math.min(hDay.quantile(0.001), quantile(0.001, oneDay));
  const hi = Math.max(hDay.quantile(0.999), quantile(0.999, oneDay));
  const grid = Array.from({ length: 201 }, (_, i) => lo + ((hi - lo) * i) / 200);
  const one = grid.map((v) => [v, pdf(v, oneDay)] as [number, number]);
  const many = grid.map((v) => [v, hDay.pdf(v)] as [number, number]);
  const peak = Math.max(largest(one.map((q) => q[1]).filter(Number.isFinite)), largest(many.map((q) => q[1]).filter(Number.isFinite)));
  const x = linear(lo, hi, M.left, W - M.right);
  const y = linear(0, peak * 1.12, H - M.bottom, M.top);
  const { svg, plot } = frame(
    `One-day and ${hDay.horizon}-day laws`,
    `Density of a one-day return (solid line) and of the sum of ${hDay.horizon} independent days (dash-dot line), from ${tickText(lo)} to ${tickText(hi)}. ` +
      "The longer horizon spreads the law out; its skew shrinks as days are added.",
    "chart-horizon",
  );
  axes(plot, x, y, niceTicks(lo, hi, 5), niceTicks(0, peak * 1.1, 4), "return", "density");
  plot.appendChild(path(many.map(([v, d]) => [x(v), y(d)]), "series-spliced"));
  plot.appendChild(path(one.map(([v, d]) => [x(v), y(d)]), "series-fit"));
  legend(plot, [
    { text: "1 day", className: "series-fit" },
    { text: `${hDay.horizon} days`, className: "series-spliced" },
  ]);
  return svg;
}

/** Smallest of a list by a loop (a spread into Math.min overflows the call stack on long data). */
function smallest(xs: readonly number[]): number {
  let m = Infinity;
  for (let i = 0; i < xs.length; i++) if (xs[i] < m) m = xs[i];
  return m;
}

/** Largest of a list by a loop (a spread into Math.max overflows the call stack on long data). */
function largest(xs: readonly number[]): number {
  let m = -Infinity;
  for (let i = 0; i < xs.length; i++) if (xs[i] > m) m = xs[i];
  return m;
}
