/**
 * npm run bench: every bench/<area>.ts in one process, one after another, each printing ratios measured
 * side by side in the same run (an area's run may be async: it is awaited). Nothing here is asserted: machines are
 * shared and noisy.
 */
import * as fs from "node:fs";
import * as path from "node:path";

const files = fs
  .readdirSync(__dirname)
  .filter((f) => f.endsWith(".ts") && f !== "run.ts" && !f.endsWith(".d.ts"))
  .sort();
const only = process.argv.slice(2);
async function main(): Promise<void> {
  for (const f of files) {
    const name = f.replace(/\.ts$/, "");
    if (only.length && !only.includes(name)) continue;
    // eslint-disable-next-line @typescript-eslint/no-require-imports
    const mod = require(path.join(__dirname, f)) as { run?: (print: (line: string) => void) => void | Promise<void> };
    if (typeof mod.run !== "function") continue;
    console.log(`\n=== bench/${f} ===`);
    await mod.run((line) => console.log(line));
  }
}
void main();

