/**
 * Loaded first in dist/functions.js. When the page runs outside the spreadsheet host with no office.js at all
 * (the standalone pane in a plain browser, offline), there is no CustomFunctions namespace and the generated
 * registration calls would throw. Only in that case, give them a do-nothing registry. Inside the host, office.js
 * has defined both Office and CustomFunctions before this script runs, and nothing here is touched.
 */
const g = globalThis as unknown as Record<string, unknown>;
if (typeof g.Office === "undefined" && typeof g.CustomFunctions === "undefined") {
  class StandaloneError {
    constructor(
      readonly code: string,
      readonly message?: string,
    ) {}
  }
  g.CustomFunctions = {
    associate: () => undefined,
    Error: StandaloneError,
    ErrorCode: { invalidValue: "#VALUE!", notAvailable: "#N/A", divisionByZero: "#DIV/0!", invalidNumber: "#NUM!", nullReference: "#NULL!", invalidName: "#NAME?", invalidReference: "#REF!" },
  };
}
export {};
