/**
 * Seeded GNO draws by inversion: x_i = quantile(u_i) with u_i from the shared uniform stream
 * (src/core/random.ts: xoroshiro128+ via pure-rand, uniforms strictly inside (0, 1)). Same seed → same draws.
 *
 * sampleSortedInto gives the same draws in ascending order: the uniforms are sorted (the quantile is increasing,
 * so sorting u sorts x; a bucket sort, linear in expectation for uniforms) and then mapped, and one insertion pass repairs any pair that rounding in the quantile
 * left out of order by an ulp. Callers that sort the draws anyway (goodness-of-fit statistics) save that sort
 * and the allocation.
 */
import { uniformsInto, uniformStream } from "../random";
import type { GnoParams } from "./params";
import { isValidParams } from "./params";
import { quantile } from "./quantile";
import { normalQuantilesAscendingInPlace } from "../normal/quantile";
import { sortFinite } from "../sort";

/** n draws (n floored; non-finite or negative n gives an empty array); NaN-filled for invalid params. */
export function sample(p: GnoParams, n: number, seed: number): Float64Array {
  const count = Number.isFinite(n) && n > 0 ? Math.floor(n) : 0;
  const out = new Float64Array(count);
  if (!isValidParams(p)) return out.fill(NaN);
  const next = uniformStream(seed);
  for (let i = 0; i < count; i++) out[i] = quantile(next(), p);
  return out;
}

/**
 * The first out.length draws of sample(p, ·, seed), in ascending order, written into `out` (returned).
 * NaN-filled for invalid params.
 */
export function sampleSortedInto(p: GnoParams, seed: number, out: Float64Array): Float64Array {
  if (!isValidParams(p)) return out.fill(NaN);
  // quantile(u, p) without its per-call checks (p is valid, every u is inside (0, 1)): the same arithmetic, in two
  // short loops (each small enough to be compiled with its callee inlined)
  sortedNormalsInto(seed, out);
  reducedQuantilesInPlace(out, p.location, p.scale, p.shape);
  sortNearlySorted(out);
  return out;
}

/**
 * The standard normal quantiles z_i = Φ⁻¹(u_i) of the first out.length uniforms of the stream for `seed`, in
 * ascending order of u, written into `out` (returned). ξ + α·reducedQuantile(z_i, k) are then the draws of
 * sampleSortedInto (pass them through sortNearlySorted to undo any rounding inversion).
 */
export function sortedNormalsInto(seed: number, out: Float64Array): Float64Array {
  uniformsInto(seed, out);
  sortUniforms(out);
  return normalQuantilesAscendingInPlace(out);
}

/**
 * Sorts values in (0, 1) ascending: the uniforms of a replicate, in expected linear time (src/core/sort.ts's
 * bucket sort, whose buffers are kept between calls, so a bootstrap's replicates allocate nothing).
 */
export function sortUniforms(u: Float64Array): void {
  sortFinite(u);
}

/**
 * v_i ← ξ + α·reducedQuantile(v_i, k), the same arithmetic written out in the loop (no call per value, so the
 * doubles stay unboxed whatever the bundler does to the code).
 */
function reducedQuantilesInPlace(v: Float64Array, xi: number, al: number, k: number): void {
  const n = v.length;
  if (k === 0) {
    for (let i = 0; i < n; i++) v[i] = xi + al * v[i];
    return;
  }
  for (let i = 0; i < n; i++) {
    const z = v[i];
    const u = -k * z;
    v[i] = xi + al * (Math.abs(u) < 1e-5 ? z * (1 + u / 2 + (u * u) / 6) : -Math.expm1(u) / k);
  }
}

/** Insertion pass: sorts an array that is already in order up to rounding (linear time then). */
export function sortNearlySorted(out: Float64Array): void {
  const n = out.length;
  for (let i = 1; i < n; i++) {
    const v = out[i];
    if (v >= out[i - 1]) continue;
    let j = i - 1;
    while (j >= 0 && out[j] > v) {
      out[j + 1] = out[j];
      j--;
    }
    out[j + 1] = v;
  }
}

export { uniformStream };
