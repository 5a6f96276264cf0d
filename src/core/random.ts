/**
 * Seeded uniform stream shared by every simulation in the core (GNO draws, bootstrap, Monte Carlo checks).
 *
 * Generator: xoroshiro128+ (Blackman & Vigna 2016) from pure-rand, mapped to multiples of 2⁻⁵³ in [0, 1) by
 * pure-rand's uniformFloat64; exact zeros are redrawn so every value lies strictly inside (0, 1) and can be
 * passed to a quantile function without producing an infinite draw. Same seed → same sequence.
 */
import { xoroshiro128plus } from "pure-rand/generator/xoroshiro128plus";
import { uniformFloat64 } from "pure-rand/distribution/uniformFloat64";

/** A stateful source of uniforms strictly inside (0, 1), reproducible from `seed` (any finite number; it is truncated to 32 bits). */
export function uniformStream(seed: number): () => number {
  const rng = xoroshiro128plus(seed | 0);
  return () => {
    let u = uniformFloat64(rng);
    while (u === 0) u = uniformFloat64(rng);
    return u;
  };
}
