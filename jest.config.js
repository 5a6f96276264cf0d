/** Jest: every test under test/, TypeScript through ts-jest (type-checked). */
module.exports = {
  testEnvironment: "node",
  roots: ["<rootDir>/test"],
  testMatch: ["**/*.test.ts"],
  transform: { "^.+\\.ts$": ["ts-jest", { tsconfig: "tsconfig.json", isolatedModules: true }] },
  testTimeout: 120000,
};
