/**
 * The BUILT bundle in its own node:vm context with a counting clock: Date.now() advances 1 per call (the async driver
 * reads it once per unit of work, so a 40 ms slice is exactly 40 units) and setTimeout counts the returns to the event
 * loop. Tests of the asynchronous convention use it to prove that work is cut into many small units and that a cancel
 * is seen within one slice — with no wall-clock assertion.
 */
import fs from "node:fs";
import path from "node:path";
import vm from "node:vm";
import { distDir, ErrorCode, HostError, type Metadata } from "./harness";

export interface Sandbox {
  run(id: string, args: unknown[], invocation: { onCanceled?: () => void }): Promise<unknown>;
  yields: () => number;
  ticks: () => number;
  metadata: Metadata;
}

export function loadCounted(): Sandbox {
  const file = path.join(distDir, "functions.js");
  const metadata = JSON.parse(fs.readFileSync(path.join(distDir, "functions.json"), "utf8")) as Metadata;
  const registry = new Map<string, (...a: unknown[]) => unknown>();
  let yields = 0;
  let tick = 0;
  class CountingDate extends Date {
    static now(): number {
      return ++tick;
    }
  }
  const context = vm.createContext({
    CustomFunctions: {
      associate(id: string, fn: (...a: unknown[]) => unknown) {
        registry.set(id.toUpperCase(), fn);
      },
      Error: HostError,
      ErrorCode,
    },
    Office: { onReady: (cb?: () => void) => (cb?.(), Promise.resolve({})) },
    console,
    Date: CountingDate,
    setTimeout: (f: () => void, ms?: number) => {
      yields++;
      return setTimeout(f, ms);
    },
    clearTimeout,
  });
  vm.runInContext(fs.readFileSync(file, "utf8"), context, { filename: file });
  return {
    metadata,
    yields: () => yields,
    ticks: () => tick,
    run(id, args, invocation) {
      const meta = metadata.functions.find((f) => f.id === id)!;
      const full = [...args];
      while (full.length < meta.parameters.length) full.push(null);
      full.push(invocation);
      return Promise.resolve(registry.get(id)!(...full));
    },
  };
}

/** The host error a spilling function answered with (its 1×1 range), or null. */
export const errorOf = (v: unknown): HostError | null => (Array.isArray(v) && v[0]?.[0] instanceof HostError ? (v[0][0] as HostError) : null);

/** Lets pending promise jobs run until cond() holds (at most `limit` turns of the event loop). */
export const settleUntil = async (cond: () => boolean, limit = 100_000): Promise<void> => {
  for (let i = 0; i < limit && !cond(); i++) await new Promise((r) => setImmediate(r));
};

/**
 * Cancels a pending call as the host does, then checks that it answered the "Canceled" #N/A and that no unit of work
 * ran afterwards (the counting clock stands still). Returns the clock reading at the cancel.
 */
export async function cancelAndCheckStopped(s: Sandbox, invocation: { onCanceled?: () => void }, pending: Promise<unknown>): Promise<number> {
  invocation.onCanceled!();
  const e = errorOf(await pending);
  expect(e?.code).toBe(ErrorCode.notAvailable);
  expect(e?.message).toMatch(/Canceled/);
  const after = s.ticks();
  await new Promise((r) => setTimeout(r, 20));
  expect(s.ticks()).toBe(after); // nothing keeps running after the cancel
  return after;
}
