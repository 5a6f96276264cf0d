/**
 * sortFinite (src/core/sort.ts) against the built-in Float64Array.prototype.sort (ECMAScript's numeric order for
 * typed arrays) on random, structured and adversarial inputs, on both the bucket path (n ≥ BUCKET_MIN) and the
 * comparison path; the heapsort fallback is exercised directly.
 */
import { BUCKET_MIN, introsort, sortFinite, sortedCopy } from "../../src/core/sort";
import { uniformStream } from "../../src/core/random";

function check(a: Float64Array, what: string): void {
  const want = a.slice().sort();
  const got = sortFinite(a.slice());
  for (let i = 0; i < a.length; i++) {
    // −0 and +0 may swap: compare as numbers
    if (!(got[i] === want[i])) throw new Error(`${what}: index ${i} got ${got[i]}, want ${want[i]} (n = ${a.length})`);
  }
}

describe("sortFinite", () => {
  test("random data of many sizes, with ties, equals the built-in sort", () => {
    const u = uniformStream(17);
    const rng = { next: u };
    for (const n of [0, 1, 2, 3, 5, 24, 25, 26, 100, 1859, 10_000]) {
      const a = new Float64Array(n);
      for (let i = 0; i < n; i++) a[i] = rng.next() < 0.2 ? Math.round(rng.next() * 5) : rng.next() * 2 - 1;
      check(a, "random");
    }
  });
  test("structured inputs: sorted, reversed, constant, organ pipe, sawtooth, median-of-three killer", () => {
    const n = 5000;
    const make = (f: (i: number) => number) => Float64Array.from({ length: n }, (_, i) => f(i));
    check(make((i) => i), "sorted");
    check(make((i) => -i), "reversed");
    check(make(() => 0.5), "constant");
    check(make((i) => Math.min(i, n - i)), "organ pipe");
    check(make((i) => i % 17), "sawtooth");
    // Musser's median-of-3 killer for this pivot rule, approximated: alternating halves
    check(make((i) => (i % 2 === 0 ? i / 2 : n / 2 + (i - 1) / 2)), "interleaved halves");
    check(Float64Array.of(0, -0, 1e308, -1e308, 5e-324, -5e-324, 0, -0), "extremes and signed zeros");
  });
  test("the bucket path's hard cases (n ≥ BUCKET_MIN): an outlier crowding one bucket, many ties, all equal, a range that overflows, subnormal spreads", () => {
    const u = uniformStream(23);
    const n = 3000;
    const normalish = () => Float64Array.from({ length: n }, () => (u() + u() + u() - 1.5) * 0.01);
    const crowded = normalish();
    crowded[17] = 1e10; // every other value lands in the first bucket: finished by introsort
    check(crowded, "one outlier");
    const ties = normalish().map((x, i) => (i % 3 === 0 ? 0 : Math.round(x * 1e4) / 1e4));
    check(ties, "ties and zeros");
    check(new Float64Array(n).fill(-0.25), "all equal");
    const wide = normalish();
    wide[0] = 1.7e308;
    wide[1] = -1.7e308; // max − min overflows: comparison sort
    check(wide, "overflowing range");
    check(Float64Array.from({ length: n }, () => u() * 1e-310), "subnormal values");
    expect(BUCKET_MIN).toBeLessThanOrEqual(n);
  });
  test("the heapsort fallback sorts correctly (depth limit 0 forces it on the whole range)", () => {
    const u = uniformStream(5);
    const rng = { next: u };
    for (const n of [2, 7, 31, 1000]) {
      const a = Float64Array.from({ length: n }, () => Math.floor(rng.next() * 50) / 7);
      const want = a.slice().sort();
      introsort(a, 0, n - 1, 0);
      expect(Array.from(a)).toEqual(Array.from(want));
    }
  });
  test("a NaN falls back to the built-in sort (NaN last), and sortedCopy leaves its input alone", () => {
    const a = Float64Array.of(3, NaN, 1, 2);
    expect(Array.from(sortFinite(a.slice()))).toEqual([1, 2, 3, NaN]);
    const x = [3, 1, 2];
    expect(Array.from(sortedCopy(x))).toEqual([1, 2, 3]);
    expect(x).toEqual([3, 1, 2]);
    const u = uniformStream(3);
    const big = Float64Array.from({ length: 1000 }, () => u());
    const before = big.slice();
    const sorted = sortedCopy(big);
    expect(Array.from(big)).toEqual(Array.from(before)); // the bucket path writes a new array
    expect(Array.from(sorted)).toEqual(Array.from(before.sort()));
  });
});
