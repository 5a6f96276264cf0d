/** Seeded N(0, σ²) draws for the score tests: inversion of the core uniform stream with the core Φ⁻¹. */
import { normalQuantile } from "../../../src/core/normal";
import { uniformStream } from "../../../src/core/random";

export function normalDraws(n: number, seed: number, sigma: number): Float64Array {
  const u = uniformStream(seed);
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) out[i] = sigma * normalQuantile(u());
  return out;
}
