/**
 * Cell functions for risk over more than one day: the liquidity-horizon cascade (LIQES) and the simulated
 * h-day VaR/ES table under a fitted model (HORIZON). The exact h-day VaR/ES of the i.i.d. law are the horizon
 * argument of ASKEW.VAR and ASKEW.ES (risk.ts). Thin adapters: parse (cells.ts) → src/core/risk/horizons → shape.
 */
import { fitGnoCached } from "../core/fit";
import type { GnoParams } from "../core/gno";
import { expectedShortfall, RISK_SIDES, valueAtRisk } from "../core/risk";
import {
  DEFAULT_LIQUIDITY_HORIZONS,
  horizonLaw,
  liquidityAdjustedEs,
  MAX_HORIZON,
  MAX_HORIZON_SHAPE,
  MAX_PATHS,
  MAX_SIMULATED_STEPS,
  simulatedTail,
  simulateSums,
  type PathModel,
} from "../core/risk/horizons";
import { fitVolatility } from "../core/vol";
import { guardGridAsync, runWork } from "./async";
import { MAX_VOL_ROWS, MIN_GARCH_ROWS } from "./volatility";
import {
  asGrid,
  describeCell,
  fail,
  guardGrid,
  isBlank,
  labelTable,
  notAvailable,
  numberCell,
  readChoice,
  readData,
  readInteger,
  readProbability,
  type Grid,
} from "./cells";

/** Default simulated paths for HORIZON. */
export const DEFAULT_PATHS = 100_000;
/** Default seed for HORIZON (a fixed seed: the same inputs give the same table). */
export const DEFAULT_SEED = 1;

export const HORIZON_MODELS = ["iid", "ewma", "garch"] as const;
export type HorizonModel = (typeof HORIZON_MODELS)[number];

/** Reads a column (or row) of numbers with no blanks allowed in between; text and errors name their cell. */
function readColumn(v: unknown, name: string): number[] {
  const cells = asGrid(v).flat();
  const out: number[] = [];
  cells.forEach((x, i) => {
    if (isBlank(x)) return;
    if (typeof x === "number" && Number.isFinite(x)) out.push(x);
    else fail(`${name}: cell ${i + 1} holds ${describeCell(x)}; only numbers and blanks are allowed.`);
  });
  return out;
}

/**
 * Liquidity-adjusted expected shortfall from ES figures by liquidity-horizon bucket (the cascade of the revised market-risk framework, MAR33.4).
 * @customfunction LIQES
 * @param es Base-horizon ES figures in one column: the whole portfolio first, then one per bucket (only factors with at least that horizon shocked).
 * @param [horizons] Liquidity horizons in days, strictly increasing, one per ES figure; default 10, 20, 40, 60, 120. The first is the base horizon T.
 * @returns √(ES₁² + Σⱼ≥₂ (ESⱼ·√((LHⱼ − LHⱼ₋₁)/T))²).
 */
export function liquidityEs(es: any[][], horizons?: any[][]): any[][] {
  return guardGrid(() => {
    const e = readColumn(es, "es");
    if (e.length === 0) fail("es is empty: give at least the base-horizon ES.");
    e.forEach((x, i) => {
      if (x < 0) fail(`es: figure ${i + 1} is ${x}; expected shortfalls here are positive losses.`);
    });
    let lh: number[];
    if (horizons === null || horizons === undefined || asGrid(horizons).flat().every(isBlank)) {
      if (e.length > DEFAULT_LIQUIDITY_HORIZONS.length) {
        fail(`es has ${e.length} figures but the default horizons are only ${DEFAULT_LIQUIDITY_HORIZONS.join(", ")}: give horizons.`);
      }
      lh = DEFAULT_LIQUIDITY_HORIZONS.slice(0, e.length);
    } else {
      lh = readColumn(horizons, "horizons");
      if (lh.length !== e.length) fail(`horizons has ${lh.length} numbers and es ${e.length}: give one horizon per ES figure.`);
      if (!(lh[0] > 0)) fail(`horizons: the base horizon must be greater than 0 (got ${lh[0]}).`);
      for (let j = 1; j < lh.length; j++) {
        if (!(lh[j] > lh[j - 1])) fail(`horizons must increase strictly: ${lh[j]} follows ${lh[j - 1]}.`);
      }
    }
    return [[numberCell(liquidityAdjustedEs(e, lh), "The liquidity-adjusted ES overflows.")]];
  });
}

/** Label/value rows of HORIZON, in their fixed order (documented in docs/notes/horizon.md). */
function horizonRows(r: {
  model: HorizonModel;
  horizon: number;
  confidence: number;
  side: string;
  exactVar: number;
  exactEs: number;
  simVar: number;
  simVarError: number;
  simEs: number;
  simEsError: number;
  oneDayVar: number;
  oneDayEs: number;
  paths: number;
  seed: number;
  note: string;
}): Grid {
  const root = Math.sqrt(r.horizon);
  return labelTable([
    ["model", r.model],
    ["horizon (days)", r.horizon],
    ["confidence", r.confidence],
    ["side", r.side],
    ["h-day VaR, exact i.i.d. law", r.exactVar],
    ["h-day ES, exact i.i.d. law", r.exactEs],
    ["h-day VaR, simulated", r.simVar],
    ["VaR Monte Carlo standard error", r.simVarError],
    ["h-day ES, simulated", r.simEs],
    ["ES Monte Carlo standard error", r.simEsError],
    ["one-day VaR × √h", r.oneDayVar * root],
    ["one-day ES × √h", r.oneDayEs * root],
    ["one-day VaR", r.oneDayVar],
    ["one-day ES", r.oneDayEs],
    ["paths simulated", r.paths],
    ["seed", r.seed],
    ["note", r.note],
  ]);
}

/**
 * h-day VaR and ES under a model fitted to returns ("iid", "ewma" or "garch"), simulated with Monte Carlo standard errors, beside √h-scaled one-day figures.
 * @customfunction HORIZON
 * @cancelable
 * @param returns Daily returns in one column, oldest first (at least 10; 100 for garch; at most 50,000 for ewma/garch); blanks are skipped.
 * @param confidence Confidence level strictly between 0 and 1, e.g. 0.99.
 * @param horizon Days, a whole number from 1 to 250.
 * @param [side] "long" (default) or "short".
 * @param [model] "iid" (default: the fitted law, exact figures too), "ewma" or "garch" (volatility paths with generalized-normal innovations).
 * @param [paths] Simulated paths: 1,000 to 1,000,000, default 100,000; paths × horizon ≤ 50,000,000.
 * @param [seed] Seed of the simulation (default 1): the same inputs and seed give the same table.
 * @returns A 17×2 table (label, value): exact and simulated h-day VaR and ES with standard errors, √h-scaled one-day figures, paths, seed, note.
 */
export async function horizonTable(
  returns: any[][],
  confidence: any,
  horizon: any,
  side: any,
  model: any,
  paths: any,
  seed: any,
  invocation: CustomFunctions.CancelableInvocation,
): Promise<any[][]> {
  return guardGridAsync(async () => {
    const x = readData(returns, "returns");
    const c = readProbability(confidence, "confidence");
    const h = readInteger(horizon, "horizon", 1, MAX_HORIZON);
    const s = readChoice(side, "side", RISK_SIDES, "long");
    const m = readChoice(model, "model", HORIZON_MODELS, "iid");
    const n = readInteger(paths, "paths", 1000, MAX_PATHS, DEFAULT_PATHS);
    if (n * h > MAX_SIMULATED_STEPS) {
      fail(`paths × horizon is ${n * h}; the bound is ${MAX_SIMULATED_STEPS.toLocaleString("en-US")} simulated days: lower paths or horizon.`);
    }
    const sd = readInteger(seed, "seed", -2147483648, 2147483647, DEFAULT_SEED);
    let pathModel: PathModel;
    let oneDay: GnoParams;
    let exactVar = NaN;
    let exactEs = NaN;
    const notes: string[] = [];
    if (m === "iid") {
      const fit = fitGnoCached(x, "mle");
      if (!fit.regular) notes.push(`irregular fit (${fit.reason}): the L-moment estimate is used`);
      oneDay = fit.params;
      pathModel = { kind: "iid", law: oneDay };
      if (h === 1 || Math.abs(oneDay.shape) <= MAX_HORIZON_SHAPE) {
        const law = horizonLaw(oneDay, h);
        exactVar = law.valueAtRisk(c, s);
        exactEs = law.expectedShortfall(c, s);
      } else {
        notes.push(`no exact figures: the fitted shape ${oneDay.shape.toFixed(3)} is beyond ±${MAX_HORIZON_SHAPE}`);
      }
    } else {
      // The same fit and the same limits as VOLFIT / NEXTDAY (src/functions/volatility.ts).
      if (x.length > MAX_VOL_ROWS) fail(`returns has ${x.length} numbers; the volatility models accept at most ${MAX_VOL_ROWS.toLocaleString("en-US")}.`);
      if (m === "garch" && x.length < MIN_GARCH_ROWS) fail(`A GARCH fit needs at least ${MIN_GARCH_ROWS} returns (got ${x.length}).`);
      const est = fitVolatility(x, m);
      if (!est.converged) notAvailable(`The ${m.toUpperCase()} fit did not converge (${est.reason}).`);
      if (est.boundary) notes.push(est.boundary);
      oneDay = est.nextDay;
      const nextVariance = est.nextSigma * est.nextSigma;
      if (!(nextVariance > 0 && Number.isFinite(nextVariance))) notAvailable(`The ${m} fit gives no usable next-day variance.`);
      if (m === "garch") {
        const g = est.garch!.params;
        pathModel = { kind: "garch", mu: g.mu, omega: g.omega, alpha: g.alpha, beta: g.beta, shape: g.shape, nextVariance };
      } else {
        pathModel = { kind: "ewma", lambda: est.lambda!, shape: est.shape, nextVariance };
      }
    }
    const sim = await runWork(simulateSums(pathModel, { horizon: h, paths: n, seed: sd }), invocation);
    const tail = simulatedTail(sim, c, s);
    notes.push("statistical estimates, not advice");
    return horizonRows({
      model: m,
      horizon: h,
      confidence: c,
      side: s,
      exactVar,
      exactEs,
      simVar: tail.valueAtRisk,
      simVarError: tail.valueAtRiskError,
      simEs: tail.expectedShortfall,
      simEsError: tail.expectedShortfallError,
      oneDayVar: valueAtRisk(c, oneDay, s),
      oneDayEs: expectedShortfall(c, oneDay, s),
      paths: tail.paths,
      seed: sd,
      note: notes.join("; "),
    });
  });
}
