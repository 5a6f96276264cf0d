/**
 * The fit cache proves a hit by content: two samples that collide under the former 64-bit key (constructed in
 * test/fixtures/cache/runner.ts, simulated data) get their own fits.
 */
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { clearFitCache, ContentCache, fitGno, fitGnoCached, sameContent } from "../../../src/core/fit";

const fixture = JSON.parse(readFileSync(join(__dirname, "../../fixtures/cache/collision.json"), "utf8")) as { a: string[]; b: string[]; changedIndex: number };
const fromHex = (h: string[]): Float64Array => new Float64Array(Uint32Array.from(h, (s) => parseInt(s, 16)).buffer);

/** The key the cache used before: two FNV-1a lanes, length, first and last value (the construction's target). */
function formerKey(data: Float64Array, method: string): string {
  const words = new Uint32Array(data.buffer, data.byteOffset, data.length * 2);
  let h1 = 0x811c9dc5;
  let h2 = 0x01000193 ^ 0x5bd1e995;
  for (let i = 0; i < words.length; i++) {
    const v = words[i];
    h1 = Math.imul(h1 ^ v, 0x01000193) >>> 0;
    h2 = Math.imul(h2 ^ ((v >>> 16) | (v << 16)), 0x01000193) >>> 0;
  }
  return `${method}:${data.length}:${h1.toString(16)}:${h2.toString(16)}:${data[0]}:${data[data.length - 1]}`;
}

describe("content cache", () => {
  const a = fromHex(fixture.a);
  const b = fromHex(fixture.b);

  test("the fixture is a real collision of the former key between different, finite samples", () => {
    expect(formerKey(a, "mle")).toBe(formerKey(b, "mle"));
    expect(sameContent(a, b)).toBe(false);
    const differing = Array.from(a).map((x, i) => (x === b[i] ? -1 : i)).filter((i) => i >= 0);
    expect(differing).toEqual([fixture.changedIndex]);
    expect(Array.from(b).every(Number.isFinite)).toBe(true);
  });

  test("FIT(A) then FIT(B) gives B's own fit, not A's", () => {
    clearFitCache();
    const fa = fitGnoCached(a);
    const fb = fitGnoCached(b);
    const direct = fitGno(b);
    expect(fb).not.toBe(fa);
    expect(fb.params).toEqual(direct.params);
    expect(fb.params.location).not.toBe(fa.params.location);
    // and each is still a hit for its own numbers (from a fresh copy, so the cache does not rely on identity)
    expect(fitGnoCached(Float64Array.from(a))).toBe(fa);
    expect(fitGnoCached(Float64Array.from(b))).toBe(fb);
  });

  test("a caller changing its array after caching does not change what the cache matches", () => {
    const c = new ContentCache<string>(4);
    const x = Float64Array.from([1, 2, 3]);
    c.set(x, "m", "first");
    x[1] = 5;
    expect(c.get(x, "m")).toBeUndefined();
    expect(c.get(Float64Array.from([1, 2, 3]), "m")).toBe("first");
    expect(c.get(Float64Array.from([1, 2, 3]), "other")).toBeUndefined();
    expect(c.get(Float64Array.from([1, 2, -0 + 3]), "m")).toBe("first");
  });

  test("eviction keeps at most the entry and number budgets", () => {
    const c = new ContentCache<number>(3, 10);
    for (let i = 0; i < 5; i++) c.set(Float64Array.from([i, i + 1]), "m", i);
    expect(c.size).toBe(3);
    expect(c.get(Float64Array.from([0, 1]), "m")).toBeUndefined();
    expect(c.get(Float64Array.from([4, 5]), "m")).toBe(4);
    c.set(new Float64Array(8), "m", 99); // 2 + 2 + 8 > 10 numbers: the oldest go
    expect(c.size).toBeLessThanOrEqual(2);
    expect(c.get(new Float64Array(8), "m")).toBe(99);
  });
});
