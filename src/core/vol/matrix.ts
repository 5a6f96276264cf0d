/** Small dense symmetric-matrix helpers (row-major Float64Array, n ≤ 5) for the volatility fits. */

/** Inverse of a symmetric positive-definite matrix by Cholesky; null when not positive definite. */
export function inverseSpd(a: Float64Array, n: number): Float64Array | null {
  const L = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j <= i; j++) {
      let s = a[i * n + j];
      for (let k = 0; k < j; k++) s -= L[i * n + k] * L[j * n + k];
      if (i === j) {
        if (!(s > 0) || !Number.isFinite(s)) return null;
        L[i * n + i] = Math.sqrt(s);
      } else L[i * n + j] = s / L[j * n + j];
    }
  }
  // inverse of L, then L⁻ᵀ L⁻¹
  const Li = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    Li[i * n + i] = 1 / L[i * n + i];
    for (let j = 0; j < i; j++) {
      let s = 0;
      for (let k = j; k < i; k++) s -= L[i * n + k] * Li[k * n + j];
      Li[i * n + j] = s / L[i * n + i];
    }
  }
  const inv = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j <= i; j++) {
      let s = 0;
      for (let k = i; k < n; k++) s += Li[k * n + i] * Li[k * n + j];
      inv[i * n + j] = s;
      inv[j * n + i] = s;
    }
  }
  return inv;
}

/** C = A·B·A for symmetric n×n A and B (the sandwich of robust covariances). */
export function sandwich(a: Float64Array, b: Float64Array, n: number): Float64Array {
  const ab = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) {
    let s = 0;
    for (let k = 0; k < n; k++) s += a[i * n + k] * b[k * n + j];
    ab[i * n + j] = s;
  }
  const c = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) {
    let s = 0;
    for (let k = 0; k < n; k++) s += ab[i * n + k] * a[k * n + j];
    c[i * n + j] = s;
  }
  return c;
}

/** y = A·x */
export function multiply(a: Float64Array, x: ArrayLike<number>, n: number): Float64Array {
  const y = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let s = 0;
    for (let j = 0; j < n; j++) s += a[i * n + j] * x[j];
    y[i] = s;
  }
  return y;
}
