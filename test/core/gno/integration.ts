/**
 * Adaptive Simpson quadrature with Richardson correction (Lyness 1969; common textbook form), used by the tests as
 * an integrator independent of the trapezium rule in src/core/gno/lmoments.ts. `integratePieces` sums it over
 * consecutive breakpoints so each piece is smooth and cheap.
 */
export function adaptiveSimpson(f: (x: number) => number, a: number, b: number, tol: number, maxDepth = 22): number {
  const fa = f(a);
  const fb = f(b);
  const m = (a + b) / 2;
  const fm = f(m);
  const whole = ((b - a) / 6) * (fa + 4 * fm + fb);
  const rec = (lo: number, hi: number, flo: number, fmid: number, fhi: number, s: number, eps: number, depth: number): number => {
    const mid = (lo + hi) / 2;
    const fl = f((lo + mid) / 2);
    const fr = f((mid + hi) / 2);
    const left = ((mid - lo) / 6) * (flo + 4 * fl + fmid);
    const right = ((hi - mid) / 6) * (fmid + 4 * fr + fhi);
    const diff = left + right - s;
    if (depth <= 0 || Math.abs(diff) <= 15 * eps) return left + right + diff / 15;
    return rec(lo, mid, flo, fl, fmid, left, eps / 2, depth - 1) + rec(mid, hi, fmid, fr, fhi, right, eps / 2, depth - 1);
  };
  return rec(a, b, fa, fm, fb, whole, tol, maxDepth);
}

export function integratePieces(f: (x: number) => number, breaks: readonly number[], tol: number): number {
  let s = 0;
  for (let i = 0; i + 1 < breaks.length; i++) s += adaptiveSimpson(f, breaks[i], breaks[i + 1], tol / (breaks.length - 1));
  return s;
}
