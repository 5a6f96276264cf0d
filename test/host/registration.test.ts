/**
 * The built bundle registers exactly what the generated metadata declares, and the metadata carries help
 * text for every function and argument (the host shows it while typing).
 */
import * as fs from "node:fs";
import * as path from "node:path";
import { loadBundle, distDir } from "./harness";

describe("built bundle and generated metadata", () => {
  test("every id in functions.json is registered by dist/functions.js, and nothing else", async () => {
    const b = await loadBundle();
    const declared = b.metadata.functions.map((f) => f.id.toUpperCase()).sort();
    expect(b.ids.slice().sort()).toEqual(declared);
  });

  test("the issue's functions are all there", async () => {
    const b = await loadBundle();
    const ids = new Set(b.metadata.functions.map((f) => f.id));
    for (const id of ["PARAMS", "PDF", "CDF", "QUANTILE", "MOMENTS", "LMOMENTS", "BOUND", "RANDOM"]) expect(ids.has(id) ? id : `missing ${id}`).toBe(id);
  });

  test("every function and every argument has a one-line description", async () => {
    const b = await loadBundle();
    const missing: string[] = [];
    for (const f of b.metadata.functions) {
      if ((f.description ?? "").trim().length < 12) missing.push(f.id);
      for (const p of f.parameters) if ((p.description ?? "").trim().length < 8) missing.push(`${f.id}(${p.name})`);
    }
    expect(missing).toEqual([]);
  });

  test("error cells reach the functions (allowErrorForDataTypeAny) so they can name the cell", async () => {
    const b = await loadBundle();
    expect(b.metadata.allowErrorForDataTypeAny).toBe(true);
  });

  test("the bundles contain no eval or new Function (the pages' policy forbids them)", () => {
    for (const name of ["functions.js", "taskpane.js"]) {
      const src = fs.readFileSync(path.join(distDir, name), "utf8");
      expect(src.length).toBeGreaterThan(100);
      const hits = src.match(/\beval\s*\(|new\s+Function\s*\(/g) ?? [];
      expect(`${name}: ${hits.join(", ")}`).toBe(`${name}: `);
    }
  });
});
