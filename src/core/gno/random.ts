/**
 * Seeded GNO draws by inversion: x_i = quantile(u_i) with u_i from the shared uniform stream
 * (src/core/random.ts: xoroshiro128+ via pure-rand, uniforms strictly inside (0, 1)). Same seed → same draws.
 */
import { uniformStream } from "../random";
import type { GnoParams } from "./params";
import { isValidParams } from "./params";
import { quantile } from "./quantile";

/** n draws (n floored; non-finite or negative n gives an empty array); NaN-filled for invalid params. */
export function sample(p: GnoParams, n: number, seed: number): Float64Array {
  const count = Number.isFinite(n) && n > 0 ? Math.floor(n) : 0;
  const out = new Float64Array(count);
  if (!isValidParams(p)) return out.fill(NaN);
  const next = uniformStream(seed);
  for (let i = 0; i < count; i++) out[i] = quantile(next(), p);
  return out;
}

export { uniformStream };
