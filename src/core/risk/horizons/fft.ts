/**
 * In-place iterative radix-2 complex FFT (Cooley & Tukey 1965; bit-reversal permutation, then butterflies with
 * twiddle factors taken from one precomputed table of cos/sin, so no angle error accumulates across stages).
 * Length must be a power of two. `inverse` uses e^{+2πi jk/N} and does NOT divide by N.
 */
export function fft(re: Float64Array, im: Float64Array, inverse = false): void {
  const n = re.length;
  if (n !== im.length || (n & (n - 1)) !== 0) throw new Error("fft: length must be a power of two");
  for (let i = 1, j = 0; i < n; i++) {
    let bit = n >> 1;
    for (; j & bit; bit >>= 1) j ^= bit;
    j ^= bit;
    if (i < j) {
      let t = re[i];
      re[i] = re[j];
      re[j] = t;
      t = im[i];
      im[i] = im[j];
      im[j] = t;
    }
  }
  const half = n >> 1;
  const cos = new Float64Array(half);
  const sin = new Float64Array(half);
  const sign = inverse ? 1 : -1;
  for (let i = 0; i < half; i++) {
    const a = (2 * Math.PI * i) / n;
    cos[i] = Math.cos(a);
    sin[i] = sign * Math.sin(a);
  }
  for (let size = 2; size <= n; size <<= 1) {
    const h = size >> 1;
    const step = n / size;
    for (let start = 0; start < n; start += size) {
      for (let k = 0, t = 0; k < h; k++, t += step) {
        const a = start + k;
        const b = a + h;
        const xr = re[b] * cos[t] - im[b] * sin[t];
        const xi = re[b] * sin[t] + im[b] * cos[t];
        re[b] = re[a] - xr;
        im[b] = im[a] - xi;
        re[a] += xr;
        im[a] += xi;
      }
    }
  }
}
