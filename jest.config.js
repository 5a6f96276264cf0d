/** Jest: every test under test/, TypeScript through ts-jest (transpiled per file; `npm test` type-checks the project with tsc first). */
module.exports = {
  testEnvironment: "node",
  roots: ["<rootDir>/test"],
  testMatch: ["**/*.test.ts"],
  transform: { "^.+\\.ts$": ["ts-jest", { tsconfig: "tsconfig.json" }] },
  testTimeout: 120000,
  // The machines here have 2 cores; jest would otherwise use one worker for everything.
  maxWorkers: 2,
};
