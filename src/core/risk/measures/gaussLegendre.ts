/**
 * Gauss–Legendre nodes and weights on [−1, 1], computed once by Newton's method on the Legendre polynomial
 * (three-term recurrence for P_n and its derivative; Abramowitz & Stegun 25.4.29 for the weights
 * w_i = 2/((1 − x_i²) P'_n(x_i)²)). Used to integrate smooth, short pieces of the normal density.
 */
export interface QuadratureRule {
  readonly nodes: Float64Array;
  readonly weights: Float64Array;
}

export function gaussLegendre(n: number): QuadratureRule {
  const nodes = new Float64Array(n);
  const weights = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let x = Math.cos((Math.PI * (i + 0.75)) / (n + 0.5));
    let dp = 1;
    for (let iter = 0; iter < 100; iter++) {
      let p0 = 1;
      let p1 = x;
      for (let j = 2; j <= n; j++) {
        const p2 = ((2 * j - 1) * x * p1 - (j - 1) * p0) / j;
        p0 = p1;
        p1 = p2;
      }
      dp = (n * (x * p1 - p0)) / (x * x - 1);
      const step = p1 / dp;
      x -= step;
      if (Math.abs(step) < 1e-16) break;
    }
    nodes[i] = x;
    weights[i] = 2 / ((1 - x * x) * dp * dp);
  }
  return Object.freeze({ nodes, weights });
}
