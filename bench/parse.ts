/**
 * Bench of the pane's text reader (plain node, never jest): `npx ts-node --transpile-only bench/parse.ts [rows...]`.
 * Inputs are simulated (seeded uniform draws, not market data): one column, and a date;return;note file with
 * decimal commas.
 */
import * as parse from "../src/taskpane/parse";

function rng(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (s + 0x6d2b79f5) >>> 0;
    let t = s;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

function inputs(n: number): Array<[string, string]> {
  const u = rng(n);
  const col: string[] = ["return"];
  const semi: string[] = ["date;return;note"];
  for (let i = 0; i < n; i++) {
    const x = (u() - 0.5) * 0.04;
    col.push(String(x));
    semi.push(`2024-01-${String((i % 28) + 1).padStart(2, "0")};${x.toFixed(6).replace(".", ",")};simulated`);
  }
  return [
    ["one column", col.join("\n")],
    ["semicolon, 3 columns", semi.join("\r\n")],
  ];
}

const rows = process.argv.slice(2).map(Number);
for (const n of rows.length ? rows : [80_000, 1_000_000]) {
  for (const [name, text] of inputs(n)) {
    parse.parseColumn(text); // warm-up
    const t0 = process.hrtime.bigint();
    const r = parse.parseColumn(text);
    const ms = Number(process.hrtime.bigint() - t0) / 1e6;
    let line = `${n} rows, ${name} (${(text.length / 1e6).toFixed(1)} MB): one-shot ${ms.toFixed(0)} ms, ${r.values.length} numbers`;
    if (typeof (parse as Record<string, unknown>).parseColumnWork === "function") {
      const w = (parse as unknown as { parseColumnWork: (t: string) => Generator<number, unknown, void> }).parseColumnWork(text);
      let longest = 0;
      let yields = 0;
      let t = process.hrtime.bigint();
      for (;;) {
        const s = w.next();
        const now = process.hrtime.bigint();
        const step = Number(now - t) / 1e6;
        if (step > longest) longest = step;
        t = now;
        if (s.done) break;
        yields++;
      }
      line += `; stepped: ${yields} yields, longest step ${longest.toFixed(1)} ms`;
    }
    console.log(line);
  }
}
