// Writes the README's function reference from the generated metadata (dist/functions.json), between the
// markers <!-- functions:start --> and <!-- functions:end -->. Run after a build: node scripts/function-table.cjs
// test/readme.test.ts checks that the README's table equals what this script would write.
const fs = require("node:fs");
const path = require("node:path");

const root = path.resolve(__dirname, "..");

function functionTable(metadata) {
  const esc = (s) => String(s ?? "").replace(/\|/g, "\\|").replace(/\n/g, " ");
  const lines = ["| function | what it returns | arguments |", "|---|---|---|"];
  for (const f of metadata.functions) {
    const sig = f.parameters.map((p) => (p.optional ? `[${p.name}]` : p.name)).join(", ");
    const args = f.parameters.map((p) => `\`${p.optional ? `[${p.name}]` : p.name}\`: ${esc(p.description)}`).join("<br>");
    lines.push(`| \`ASKEW.${f.name}(${sig})\` | ${esc(f.description)} | ${args} |`);
  }
  return lines.join("\n");
}

function spliceTable(readme, table) {
  const start = "<!-- functions:start -->", end = "<!-- functions:end -->";
  const i = readme.indexOf(start), j = readme.indexOf(end);
  if (i < 0 || j < i) throw new Error("README.md lacks the functions markers");
  return readme.slice(0, i + start.length) + "\n" + table + "\n" + readme.slice(j);
}

module.exports = { functionTable, spliceTable };

if (require.main === module) {
  const meta = JSON.parse(fs.readFileSync(path.join(root, "dist", "functions.json"), "utf8"));
  const file = path.join(root, "README.md");
  fs.writeFileSync(file, spliceTable(fs.readFileSync(file, "utf8"), functionTable(meta)));
  console.log(`README.md: function reference written for ${meta.functions.length} functions.`);
}
