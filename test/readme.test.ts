/**
 * README promises: the job first, exactly the two set-up commands, and a function reference that equals the
 * generated metadata (written by scripts/function-table.cjs from dist/functions.json).
 */
import * as fs from "node:fs";
import * as path from "node:path";

const root = path.resolve(__dirname, "..");
const readme = fs.readFileSync(path.join(root, "README.md"), "utf8");

describe("README.md", () => {
  test("gives the two set-up commands, and .ci/run runs the test one", () => {
    expect(readme).toContain("npm ci && npm start");
    expect(readme).toContain("npm ci && npm test");
    expect(fs.readFileSync(path.join(root, ".ci/run"), "utf8")).toMatch(/^npm ci && npm test$/m);
  });

  test("the function reference equals the generated metadata", () => {
    // eslint-disable-next-line @typescript-eslint/no-require-imports
    const { functionTable, spliceTable } = require(path.join(root, "scripts/function-table.cjs"));
    const meta = JSON.parse(fs.readFileSync(path.join(root, "dist/functions.json"), "utf8"));
    expect(spliceTable(readme, functionTable(meta))).toBe(readme);
  });
});
