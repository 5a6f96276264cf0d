/** Shared assertions for the GNO tests: relative/absolute checks whose failure message prints inputs, got, want, tolerance. */
import type { GnoParams } from "../../../src/core/gno";

export const P = (location: number, scale: number, shape: number): GnoParams => ({ location, scale, shape });

export function describeParams(p: GnoParams): string {
  return `(ξ=${p.location}, α=${p.scale}, k=${p.shape})`;
}

/** Relative error |got − want|/|want| (absolute when want = 0). */
export function relErr(got: number, want: number): number {
  if (got === want) return 0;
  return want === 0 ? Math.abs(got) : Math.abs(got - want) / Math.abs(want);
}

export function expectRel(label: string, got: number, want: number, tol: number): number {
  const err = relErr(got, want);
  if (!(err <= tol)) {
    throw new Error(`${label}: got ${got}, want ${want}, diff ${got - want}, rel err ${err.toExponential(3)} > tol ${tol}`);
  }
  return err;
}

export function expectAbs(label: string, got: number, want: number, tol: number): number {
  const err = Math.abs(got - want);
  if (!(err <= tol)) {
    throw new Error(`${label}: got ${got}, want ${want}, abs err ${err.toExponential(3)} > tol ${tol}`);
  }
  return err;
}
