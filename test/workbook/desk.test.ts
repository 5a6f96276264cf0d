/**
 * A recalculating workbook, for real: the built ASKEW functions inside HyperFormula (engine.ts), in the layout a
 * risk desk would use — prices, ASKEW.RETURNS, a spilled ASKEW.FIT, VaR/ES cells referencing the fit, an
 * ASKEW.ROLLVAR column and an ASKEW.BACKTEST block — then a new day of prices lands and an old price is corrected.
 * Every dependent result must change exactly as a fresh computation on the new numbers says (direct bundle calls,
 * and a fresh engine built from the edited sheet), and unrelated cells must neither change nor recalculate.
 *
 * Prices: an invented, simulated scenario (seeded draws, test/hardening/corpus.ts), not market data.
 * Ranges are bounded (ROWS rows, blanks below the data): blanks are skipped by the data functions.
 */
import type { HyperFormula } from "hyperformula";
import { simulatedReturns } from "../hardening/corpus";
import { sameResult, preview, cellProblems } from "../hardening/checker";
import { askewEngine, AskewEngine, sizeRuleOf } from "./engine";

const ROWS = 260; // rows 2..261 hold prices (bounded range, blanks below the data)
const DAYS = 200; // simulated days at the start
const WINDOW = 60;
const CONF = 0.99;

// Column letters and 0-based indexes.
const A = 0, B = 1, D = 3, E = 4, G = 6, J = 9;
const last = ROWS + 1; // last sheet row (1-based) of the bounded range

function simulatedPrices(n: number): number[] {
  const r = simulatedReturns(n - 1, 2024, 0.0003, 0.012);
  const out = [100];
  for (const x of r) out.push(out[out.length - 1] * Math.exp(x));
  return out.map((p) => Math.round(p * 100) / 100);
}

/** The desk sheet: labels in row 1, data from row 2. */
function deskSheet(prices: ReadonlyArray<number | null>): unknown[][] {
  const rows: unknown[][] = Array.from({ length: ROWS + 1 }, () => []);
  rows[0][A] = "Price (simulated scenario, invented)";
  rows[0][B] = "Log return";
  rows[0][D] = "Fit (location, scale, shape)";
  rows[0][E] = "Rolling 99% VaR";
  rows[0][G] = "Backtest";
  rows[0][J] = "Unrelated: a fixed law";
  for (let i = 0; i < ROWS; i++) rows[i + 1][A] = prices[i] ?? null;
  // Returns spill from B3 (one shorter than prices): row k's return uses prices k-1 and k.
  rows[2][B] = `=ASKEW.RETURNS(A2:A${last})`;
  rows[1][D] = `=ASKEW.FIT(B3:B${last})`;
  rows[5][D] = `=ASKEW.VAR(${CONF}, D2:D4)`;
  rows[6][D] = "=ASKEW.SHORTFALL(0.975, D2:D4)";
  rows[7][D] = "=ASKEW.LOGLIK(B3:B" + last + ", D2:D4)";
  rows[2][E] = `=ASKEW.ROLLVAR(B3:B${last}, ${WINDOW}, ${CONF})`;
  rows[1][G] = `=ASKEW.BACKTEST(B3:B${last}, E3:E${last}, ${CONF})`;
  rows[1][J] = "=ASKEW.PARAMS(0.0005, 0.01, -0.15)";
  rows[5][J] = "=ASKEW.QUANTILE(0.05, J2:J4)";
  rows[6][J] = "=ASKEW.MOMENTS(J2:J4)";
  return rows;
}

const cell = (hf: HyperFormula, col: number, row1: number): unknown => hf.getCellValue({ sheet: 0, col, row: row1 - 1 });
/** A block of the sheet (1-based first row), as the host would pass it: blanks as null, errors kept. */
function block(hf: HyperFormula, col: number, row1: number, rows: number, cols = 1): unknown[][] {
  const out: unknown[][] = [];
  for (let r = 0; r < rows; r++) {
    const line: unknown[] = [];
    for (let c = 0; c < cols; c++) line.push(cell(hf, col + c, row1 + r));
    out.push(line);
  }
  return out;
}
/** Engine values → host-shaped values (empty → "", as the functions return for blank-looking cells). */
const hostish = (g: unknown[][]) => g.map((r) => r.map((v) => (v === null ? "" : v)));
const col = (xs: ReadonlyArray<number | null>) => xs.map((x) => [x]);

let eng: AskewEngine;
beforeAll(async () => {
  eng = await askewEngine();
});

/** What each block must hold for a price column, computed by calling the bundle directly (no engine). */
async function expected(prices: ReadonlyArray<number | null>) {
  const b = eng.bundle;
  const p = col(Array.from({ length: ROWS }, (_, i) => prices[i] ?? null));
  const returns = b.call("RETURNS", p) as unknown[][];
  const hostReturns = returns.map((r) => [r[0] === "" ? null : r[0]]);
  const fit = (await b.run("FIT", hostReturns)) as unknown[][];
  const rollvar = (await b.run("ROLLVAR", hostReturns, WINDOW, CONF)) as unknown[][];
  return {
    returns,
    fit,
    var99: (b.call("VAR", [[CONF]], fit) as unknown[][])[0][0],
    es975: (b.call("SHORTFALL", [[0.975]], fit) as unknown[][])[0][0],
    loglik: b.call("LOGLIK", hostReturns, fit),
    rollvar,
    backtest: b.call("BACKTEST", hostReturns, rollvar.map((r) => [r[0] === "" ? null : r[0]]), CONF) as unknown[][],
  };
}

function readDesk(hf: HyperFormula) {
  return {
    returns: hostish(block(hf, B, 3, ROWS - 1)),
    fit: block(hf, D, 2, 3),
    var99: cell(hf, D, 6),
    es975: cell(hf, D, 7),
    loglik: cell(hf, D, 8),
    rollvar: hostish(block(hf, E, 3, ROWS - 1)),
    backtest: block(hf, G, 2, 20, 2),
    unrelated: hostish(block(hf, J, 2, 9)),
  };
}

async function expectDeskMatches(hf: HyperFormula, prices: ReadonlyArray<number | null>) {
  const got = readDesk(hf);
  const want = await expected(prices);
  for (const k of ["returns", "fit", "var99", "es975", "loglik", "rollvar", "backtest"] as const) {
    const ok = sameResult(got[k], want[k]);
    expect(ok ? k : `${k}: engine ${preview(got[k])} vs direct ${preview(want[k])}`).toBe(k);
  }
}

describe("a desk workbook in a real calculation engine", () => {
  const prices0 = simulatedPrices(DAYS);
  let hf: HyperFormula;

  beforeAll(async () => {
    hf = eng.build(deskSheet(prices0));
    await eng.settle(hf); // asynchronous functions (ROLLVAR) show busy until settled, as in the host
  });
  afterAll(() => hf?.destroy());

  test("every size rule the adapter plans agrees with the bundle's real result", () => {
    expect(eng.sizeMismatches).toEqual([]);
    const missing = eng.bundle.metadata.functions.map((f) => f.id).filter((id) => !sizeRuleOf(id, eng.bundle));
    expect(missing).toEqual([]);
  });

  test("the sheet computes: returns, spilled fit, VaR/ES, rolling VaR and the backtest block, with no error cells", () => {
    const got = readDesk(hf);
    expect(typeof got.fit[2][0]).toBe("number");
    expect(got.backtest[0][0]).toBe("Observations used");
    // Rolling VaR: "" until a full window of earlier returns exists (ROLLVAR's documented contract).
    expect(got.rollvar[WINDOW - 1][0]).toBe("");
    expect(typeof got.rollvar[WINDOW][0]).toBe("number");
    expect(got.backtest[0][1]).toBe(DAYS - 1 - WINDOW);
    // The checker flags any engine error object (DetailedCellError is not a host value) as well as NaN/Infinity.
    for (const [k, v] of Object.entries(got)) expect({ k, problems: cellProblems(v) }).toEqual({ k, problems: [] });
  });

  test("what the engine shows equals the functions called directly on the same numbers", async () => {
    await expectDeskMatches(hf, prices0);
  });

  test("a new day of prices and a corrected old price: every dependent result moves exactly as a fresh computation says, unrelated cells stay put and are not recalculated", async () => {
    const before = readDesk(hf);
    const prices1: Array<number | null> = [...prices0];
    prices1[DAYS] = Math.round(prices0[DAYS - 1] * 0.962 * 100) / 100; // a new day: a 3.9% drop
    prices1[40] = Math.round(prices0[40] * 1.015 * 100) / 100; // a correction of an old price

    eng.calls.length = 0;
    hf.batch(() => {
      hf.setCellContents({ sheet: 0, col: A, row: 1 + DAYS }, [[prices1[DAYS]]]);
      hf.setCellContents({ sheet: 0, col: A, row: 1 + 40 }, [[prices1[40]]]);
    });
    await eng.settle(hf);
    const recalculated = new Set(eng.calls);

    // 1. The engine's results are those of a fresh computation on the edited numbers…
    await expectDeskMatches(hf, prices1);
    // …and of a fresh engine built from the edited sheet.
    const fresh = eng.build(deskSheet(prices1));
    await eng.settle(fresh);
    const after = readDesk(hf);
    const rebuilt = readDesk(fresh);
    fresh.destroy();
    for (const k of Object.keys(after) as Array<keyof typeof after>) {
      expect(sameResult(after[k], rebuilt[k]) ? k : `${k}: ${preview(after[k])} vs rebuilt ${preview(rebuilt[k])}`).toBe(k);
    }

    // 2. Every dependent result actually changed.
    for (const k of ["fit", "var99", "es975", "loglik", "rollvar", "backtest"] as const) {
      expect(sameResult(before[k], after[k]) ? `${k} did not change` : k).toBe(k);
    }
    expect(after.backtest[0][1]).toBe(DAYS - WINDOW); // one more observation
    // Returns: exactly the two around the corrected price and the new day's return differ.
    const changedRows = after.returns.flatMap((r, i) => (sameResult(r, before.returns[i]) ? [] : [i + 3]));
    expect(changedRows).toEqual([42, 43, DAYS + 2]);

    // 3. Unrelated cells: same values, and their functions were not called again.
    expect(sameResult(after.unrelated, before.unrelated)).toBe(true);
    for (const id of ["PARAMS", "QUANTILE", "MOMENTS"]) expect(recalculated.has(id) ? `${id} recalculated` : id).toBe(id);
    for (const id of ["RETURNS", "FIT", "VAR", "SHORTFALL", "LOGLIK", "ROLLVAR", "BACKTEST"]) expect(recalculated.has(id) ? id : `${id} not recalculated`).toBe(id);
    expect(eng.sizeMismatches).toEqual([]);
  });
});

describe("every ASKEW function through the engine", () => {
  test("each declared function evaluates in a sheet, spills exactly its planned size, and shows no error", async () => {
    const r = simulatedReturns(80, 5);
    const sheet: unknown[][] = r.map((x, i) => [x, i < 3 ? [0.0004, 0.011, -0.1][i] : null, 0.02, 100 + i]);
    const formulas: Record<string, string> = {
      PARAMS: "=ASKEW.PARAMS(0, 0.01, 0.1)",
      PDF: "=ASKEW.PDF(A1:A5, B1:B3)",
      CDF: "=ASKEW.CDF(A1:A5, B1:B3)",
      QUANTILE: "=ASKEW.QUANTILE(0.05, B1:B3)",
      MOMENTS: "=ASKEW.MOMENTS(B1:B3)",
      LMOMENTS: "=ASKEW.LMOMENTS(B1:B3)",
      BOUND: "=ASKEW.BOUND(B1:B3)",
      RANDOM: "=ASKEW.RANDOM(B1:B3, 7, 3)",
      VAR: "=ASKEW.VAR(0.99, B1:B3, \"short\")",
      SHORTFALL: "=ASKEW.SHORTFALL(0.99, B1:B3)",
      VARCI: "=ASKEW.VARCI(A1:A80, 0.99)",
      ROLLVAR: "=ASKEW.ROLLVAR(A1:A80, 40, 0.99, , \"lmom\")",
      BACKTEST: "=ASKEW.BACKTEST(A1:A80, C1:C80, 0.99)",
      RETURNS: "=ASKEW.RETURNS(D1:D80, \"simple\")",
      FIT: "=ASKEW.FIT(A1:A80, \"lmom\")",
      FITREPORT: "=ASKEW.FITREPORT(A1:A80)",
      LOGLIK: "=ASKEW.LOGLIK(A1:A80, B1:B3)",
      GOF: "=ASKEW.GOF(A1:A80, B1:B3)",
      COMPARE: "=ASKEW.COMPARE(A1:A80)",
      DESKTEST: "=ASKEW.DESKTEST(A1:A80, C1:C80, C1:C80)",
      PLATEST: "=ASKEW.PLATEST(A1:A80, C1:C80)",
      ROLLES: "=ASKEW.ROLLES(A1:A80, 40, 0.975, , , \"ewma\")",
      ROLLPIT: "=ASKEW.ROLLPIT(A1:A80, 40, 0.99, , \"normal\", \"ewma\")",
      VOLFIT: "=ASKEW.VOLFIT(A1:A80, \"ewma\")",
      VOLATILITY: "=ASKEW.VOLATILITY(A1:A80, \"ewma\")",
      NEXTDAY: "=ASKEW.NEXTDAY(A1:A80, \"ewma\")",
      TAILFIT: "=ASKEW.TAILFIT(A1:A80, 0.25, \"both\")",
      TAILREPORT: "=ASKEW.TAILREPORT(A1:A80, 0.25)",
      ESBACKTEST: "=ASKEW.ESBACKTEST(A1:A80, C1:C80, C1:C80, 0.975)",
      HISTVAR: "=ASKEW.HISTVAR(A1:A80, 0.99, , 0.98)",
      CFVAR: "=ASKEW.CFVAR(A1:A80, 0.95, \"short\")",
      SCORE: "=ASKEW.SCORE(A1:A80, C1:C80, C1:C80, 0.975)",
      DMTEST: "=ASKEW.DMTEST(A1:A80, C1:C80, C1:C80, C1:C80, C1:C80, 0.975)",
      HORIZON: "=ASKEW.HORIZON(A1:A80, 0.99, 10, , , 2000)",
      LIQES: "=ASKEW.LIQES(C1:C5)",
    };
    const ids = eng.bundle.metadata.functions.map((f) => f.id.toUpperCase());
    expect(ids.filter((id) => !(id in formulas))).toEqual([]);
    // Each formula gets its own column block far enough apart not to collide.
    const anchorRow = 100;
    ids.forEach((id, k) => {
      const row = anchorRow;
      const c = 10 + k * 8;
      while (sheet.length <= row) sheet.push([]);
      sheet[row][c] = formulas[id];
    });
    const before = eng.sizeMismatches.length;
    const hf = eng.build(sheet);
    await eng.settle(hf);
    const problems: string[] = [];
    ids.forEach((id, k) => {
      const c = 10 + k * 8;
      const anchor = hf.getCellValue({ sheet: 0, col: c, row: anchorRow });
      const p = cellProblems(anchor);
      if (p.length) problems.push(`${id}: ${preview(anchor)} ${p.map((x) => x.what).join("; ")}`);
    });
    hf.destroy();
    expect(problems).toEqual([]);
    expect(eng.sizeMismatches.slice(before)).toEqual([]);
  });
});
