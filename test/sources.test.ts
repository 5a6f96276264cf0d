/**
 * Every value in the repository names a source a reader of the repository can check (paper and table, library and
 * version, a runner under test/fixtures/, or "from memory" in words). A sheet outside the repository is not such a
 * source, so no file under src/ or test/ may cite the team's former reference sheet by its file name.
 */
import * as fs from "node:fs";
import * as path from "node:path";

const root = path.resolve(__dirname, "..");
// The name is assembled from parts so that this file does not match itself.
const CITATION = new RegExp(["REFER", "ENCE(\\.md|\\s+§|-style)"].join(""));

function files(dir: string): string[] {
  const out: string[] = [];
  for (const e of fs.readdirSync(dir, { withFileTypes: true })) {
    const p = path.join(dir, e.name);
    if (e.isDirectory()) out.push(...files(p));
    else if (/\.(ts|js|cjs|mjs|json|md|R|py|txt)$/.test(e.name)) out.push(p);
  }
  return out;
}

test("no file under src/ or test/ cites the outside reference sheet", () => {
  const all = [...files(path.join(root, "src")), ...files(path.join(root, "test"))];
  expect(all.length).toBeGreaterThan(50);
  const hits = all.filter((f) => CITATION.test(fs.readFileSync(f, "utf8"))).map((f) => path.relative(root, f));
  expect(hits).toEqual([]);
  expect(CITATION.test(["REFER", "ENCE.md §2"].join(""))).toBe(true);
});
