/**
 * No data array is spread into a function call anywhere in src/: `Math.max(...xs)` passes every element as an
 * argument and throws "Maximum call stack size exceeded" at some 100,000 elements (the engine's argument limit
 * depends on the stack; V8 fails between about 65,000 and 200,000, measured in Node 20 and Chromium).
 * Allowed: spreads of small literal lists that are named here (warnings, CSS classes).
 */
import { readdirSync, readFileSync, statSync } from "node:fs";
import { join } from "node:path";

function files(dir: string): string[] {
  return readdirSync(dir).flatMap((f) => {
    const p = join(dir, f);
    return statSync(p).isDirectory() ? files(p) : /\.ts$/.test(f) ? [p] : [];
  });
}

const ALLOWED = [
  /warnings\.push\(\.\.\.(core\.warnings|edgeWarnings\(ed\)|fit\.warnings)\)/, // at most a handful of messages
  /classList\.add\(\.\.\.cls\.split/, // CSS class names
  /pts\.splice\(0, pts\.length, \.\.\.sorted\)/, // a simplex: 4 or 5 vertices
];

describe("no spread of data into a call", () => {
  test("Math.max(...)/Math.min(...) and push(...)/apply of arrays do not occur in src", () => {
    const root = join(__dirname, "..", "..", "src");
    const hits: string[] = [];
    for (const f of files(root)) {
      readFileSync(f, "utf8").split("\n").forEach((line, i) => {
        const code = line.replace(/\/\/.*$/, "");
        const bad = /Math\.(max|min)\([^)]*\.\.\./.test(code) || /\.(push|unshift)\(\s*\.\.\./.test(code) || /\.splice\([^)]*,\s*\.\.\./.test(code) || /\.apply\(/.test(code) || /String\.fromCharCode\(\.\.\./.test(code);
        if (bad && !ALLOWED.some((a) => a.test(code))) hits.push(`${f}:${i + 1}: ${line.trim()}`);
      });
    }
    expect(hits).toEqual([]);
  });

  test("the check itself catches a spread (guard against a check that cannot fail)", () => {
    expect(/Math\.(max|min)\([^)]*\.\.\./.test("const hi = Math.max(...values);")).toBe(true);
  });
});
