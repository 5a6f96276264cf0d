/**
 * Desk-level backtesting and the bank-level multiplier of the revised market-risk framework (Basel Committee,
 * "Minimum capital requirements for market risk", January 2019, d457; consolidated chapters MAR32, MAR33, MAR99).
 *
 * - MAR32.5 / MAR32.18: one-day VaR is compared with each day's actual and hypothetical P&L over the most recent
 *   250 business days; an exception is a loss beyond the VaR (P&L < −VaR, P&L with gains positive); exceptions
 *   are counted separately for each P&L series; a day on which the P&L or the VaR is not available counts as an
 *   exception (MAR32.5(2)).
 * - MAR32.19: a desk with more than 12 exceptions at the 99th percentile or more than 30 at the 97.5th percentile
 *   (in either series) has all its positions capitalised under the standardised approach.
 * - Bank level (MAR32.5, MAR33.42, table in MAR99): the count of 99% exceptions is the larger of the actual and
 *   hypothetical counts; multiplier 1.50 for 0–4 exceptions (green), 1.70, 1.76, 1.83, 1.88, 1.92 for 5–9
 *   (amber), 2.00 for 10 or more (red).
 * Checked against a secondary quotation of those paragraphs (a public study note quoting MAR32.5, MAR32.18–19 and
 * the multiplier table); the primary BCBS text could not be retrieved here. The bank-level test properly runs on
 * the whole bank's VaR; applied to one desk's columns it is indicative only.
 */

/** Observations of the desk test (MAR32.18: the most recent 12 months, 250 business days). */
export const DESK_WINDOW = 250;
/** Most exceptions at 99% a desk may have and stay eligible (MAR32.19). */
export const DESK_LIMIT_99 = 12;
/** Most exceptions at 97.5% a desk may have and stay eligible (MAR32.19). */
export const DESK_LIMIT_975 = 30;

/** Multiplier by exception count 0…9 (index); 10 or more: MULTIPLIER_RED. */
export const MULTIPLIER_TABLE: readonly number[] = Object.freeze([1.5, 1.5, 1.5, 1.5, 1.5, 1.7, 1.76, 1.83, 1.88, 1.92]);
export const MULTIPLIER_RED = 2;

export type RegulatoryZone = "green" | "amber" | "red";

/** The multiplier for a count of 99% exceptions over 250 days. */
export function multiplierFor(exceptions: number): number {
  if (!(exceptions >= 0)) return NaN;
  const k = Math.floor(exceptions);
  return k < MULTIPLIER_TABLE.length ? MULTIPLIER_TABLE[k] : MULTIPLIER_RED;
}

/** Zone of the bank-level count: green 0–4, amber 5–9, red 10+. */
export function multiplierZone(exceptions: number): RegulatoryZone {
  return exceptions >= 10 ? "red" : exceptions >= 5 ? "amber" : "green";
}

export interface ExceptionCount {
  /** Exceptions including unavailable days. */
  readonly exceptions: number;
  /** Of which: days where the P&L or the VaR is missing (each counted as an exception). */
  readonly unavailable: number;
}

/** Exceptions of a P&L series against a VaR series over the given rows: P&L < −VaR, or either missing. */
export function countExceptions(pnl: ArrayLike<number>, varForecasts: ArrayLike<number>, rows: ArrayLike<number>): ExceptionCount {
  let exceptions = 0;
  let unavailable = 0;
  for (let k = 0; k < rows.length; k++) {
    const p = pnl[rows[k]];
    const v = varForecasts[rows[k]];
    if (Number.isNaN(p) || Number.isNaN(v)) {
      unavailable++;
      exceptions++;
    } else if (p < -v) exceptions++;
  }
  return { exceptions, unavailable };
}

export interface SeriesCounts {
  readonly at99: ExceptionCount;
  readonly at975: ExceptionCount;
}

export interface DeskTest {
  /** Days used: the last min(250, days) rows that are not blank in every column. */
  readonly window: number;
  /** True when fewer than 250 rows were given (the regulatory window is not filled). */
  readonly shortWindow: boolean;
  readonly actual: SeriesCounts;
  readonly hypothetical: SeriesCounts | null;
  /** Days in the window where any of the given columns is missing (each such comparison counts as an exception). */
  readonly unavailableDays: number;
  readonly limit99: number;
  readonly limit975: number;
  /** True when no series breaches a limit. */
  readonly deskPasses: boolean;
  /** Larger of the two series' 99% counts. */
  readonly bankExceptions: number;
  readonly multiplier: number;
  readonly zone: RegulatoryZone;
}

/**
 * The desk test over the latest days of equal-length columns (P&L with gains positive, VaR as positive losses).
 * A row blank (NaN) in every given column is not a day (padding, a whole-column reference, a holiday) and is
 * skipped; a day with some values but a missing P&L or VaR counts as an exception. Null when there is no day.
 */
export function deskTest(
  actual: ArrayLike<number>,
  var99: ArrayLike<number>,
  var975: ArrayLike<number>,
  hypothetical: ArrayLike<number> | null = null,
  windowLength = DESK_WINDOW,
): DeskTest | null {
  const n = Math.min(actual.length, var99.length, var975.length, hypothetical ? hypothetical.length : Infinity);
  const allBlank = (i: number) =>
    Number.isNaN(actual[i]) && Number.isNaN(var99[i]) && Number.isNaN(var975[i]) && (!hypothetical || Number.isNaN(hypothetical[i]));
  const picked: number[] = [];
  for (let i = n - 1; i >= 0 && picked.length < windowLength; i--) if (!allBlank(i)) picked.push(i);
  if (picked.length === 0) return null;
  const rows = Int32Array.from(picked.reverse());
  const window = rows.length;
  const counts = (pnl: ArrayLike<number>): SeriesCounts => ({
    at99: countExceptions(pnl, var99, rows),
    at975: countExceptions(pnl, var975, rows),
  });
  const a = counts(actual);
  const h = hypothetical ? counts(hypothetical) : null;
  const breaches = (s: SeriesCounts) => s.at99.exceptions > DESK_LIMIT_99 || s.at975.exceptions > DESK_LIMIT_975;
  const deskPasses = !breaches(a) && !(h && breaches(h));
  let unavailableDays = 0;
  for (const i of rows) {
    if (Number.isNaN(actual[i]) || Number.isNaN(var99[i]) || Number.isNaN(var975[i]) || (hypothetical && Number.isNaN(hypothetical[i]))) {
      unavailableDays++;
    }
  }
  const bankExceptions = Math.max(a.at99.exceptions, h ? h.at99.exceptions : 0);
  return Object.freeze({
    window,
    shortWindow: window < windowLength,
    actual: a,
    hypothetical: h,
    unavailableDays,
    limit99: DESK_LIMIT_99,
    limit975: DESK_LIMIT_975,
    deskPasses,
    bankExceptions,
    multiplier: multiplierFor(bankExceptions),
    zone: multiplierZone(bankExceptions),
  });
}
