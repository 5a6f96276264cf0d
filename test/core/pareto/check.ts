/** Tolerance checks for the Pareto-tail tests: a failure prints the inputs, got, want, difference and tolerance. */
export function expectClose(label: string, got: number, want: number, tol: { abs?: number; rel?: number }): void {
  const abs = tol.abs ?? 0;
  const rel = tol.rel ?? 0;
  const diff = Math.abs(got - want);
  const allowed = abs + rel * Math.abs(want);
  if (!(diff <= allowed)) {
    throw new Error(`${label}: got ${got}, want ${want}, |diff| ${diff} > tol ${allowed} (abs ${abs}, rel ${rel})`);
  }
}
