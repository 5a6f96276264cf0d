// The function reference page (dist/help.html) that each function's helpUrl points at. Generated at build time
// from the built metadata (functions.json) and from the label lists the table builders in src/functions/tables/
// export, so the row lists shown to users are the very labels the cells spill: nothing is copied by hand.
// webpack.config.js calls helpPage(); test/metadata.test.ts checks the built page against it.
const path = require("node:path");

const esc = (s) => String(s ?? "").replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;");

/** The label lists of the spilled tables, read from the TypeScript builders (type-only imports, so they load alone). */
function tableLabels(root) {
  require("ts-node").register({ transpileOnly: true, compilerOptions: { module: "commonjs", moduleResolution: "node" } });
  const dir = path.join(root, "src/functions/tables");
  const fit = require(path.join(dir, "fitReport.ts"));
  const backtest = require(path.join(dir, "backtest.ts"));
  const gof = require(path.join(dir, "gof.ts"));
  const compare = require(path.join(dir, "compare.ts"));
  return {
    FITREPORT: { kind: "rows", labels: [...fit.ROW_LABELS] },
    BACKTEST: { kind: "rows", labels: [...backtest.BACKTEST_LABELS] },
    GOF: { kind: "rows", labels: [...gof.GOF_LABELS] },
    COMPARE: { kind: "columns", labels: [...compare.COMPARE_HEADER] },
  };
}

/** The whole page: one section per function, anchored at ASKEW.<NAME> (the helpUrl fragment). */
function helpPage(meta, tables) {
  const parts = [];
  for (const f of meta.functions) {
    const sig = f.parameters.map((p) => (p.optional ? `[${p.name}]` : p.name)).join(", ");
    const params = f.parameters.map((p) => `<dt><code>${esc(p.optional ? `[${p.name}]` : p.name)}</code></dt><dd>${esc(p.description)}</dd>`).join("");
    let table = "";
    const t = tables[f.name];
    if (t) {
      const title = t.kind === "rows" ? "Rows of the spilled table, in order (label in the first column, value in the second)" : "Columns of the spilled table, after one header row";
      table = `<h3>${title}</h3><ol>${t.labels.map((l) => `<li>${esc(l)}</li>`).join("")}</ol>`;
    }
    parts.push(
      `<section id="ASKEW.${esc(f.name)}"><h2><code>ASKEW.${esc(f.name)}(${esc(sig)})</code></h2>` +
        `<p>${esc(f.description)}</p>${params ? `<dl>${params}</dl>` : ""}${table}</section>`,
    );
  }
  return [
    "<!doctype html>",
    '<html lang="en"><head><meta charset="utf-8" />',
    '<meta http-equiv="Content-Security-Policy" content="default-src \'none\'; style-src \'self\'; base-uri \'none\'; form-action \'none\'" />',
    '<meta name="viewport" content="width=device-width, initial-scale=1" />',
    "<title>Askew function reference</title>",
    '<link rel="stylesheet" href="taskpane.css" /></head>',
    '<body class="help"><main>',
    "<h1>Askew function reference</h1>",
    "<p>Statistical estimates, not advice. Generated from the add-in's own metadata and table labels.</p>",
    ...parts,
    "</main></body></html>",
    "",
  ].join("\n");
}

module.exports = { helpPage, tableLabels };
