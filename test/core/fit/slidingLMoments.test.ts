/**
 * The sliding-window L-moment estimator against the batch estimator (sort + PWM sums) on every window of seeded
 * series, including ties and a constant stretch, and its l2 against Hosking's (1990, JRSS-B 52:105-124, eq. 2.1)
 * pairwise-difference form l2 = ½·C(n,2)⁻¹ Σ_{i>j} (x_(i) − x_(j)), computed directly (independent of the PWM route).
 */
import { SlidingLMoments, sampleLMoments, estimateFromLMoments } from "../../../src/core/fit";
import { sample } from "../../../src/core/gno";

function fail(what: string, input: unknown, got: unknown, want: unknown): never {
  throw new Error(`${what}\n  input: ${JSON.stringify(input)}\n  got:  ${JSON.stringify(got)}\n  want: ${JSON.stringify(want)}`);
}

/** Seeded series: law draws, rounded to 4 decimals in the second half (many ties), with a constant stretch. */
function series(n: number, seed: number): number[] {
  const x = Array.from(sample({ location: 0.0004, scale: 0.011, shape: -0.2 }, n, seed));
  for (let i = n >> 1; i < n; i++) x[i] = Math.round(x[i] * 1e4) / 1e4;
  for (let i = 300; i < 330; i++) x[i] = 0.001;
  return x;
}

describe("SlidingLMoments", () => {
  test("every window's sorted values, L-moments and estimate equal the batch estimator's exactly", () => {
    for (const w of [4, 5, 25, 250]) {
      const x = series(700, 11 + w);
      const f = new SlidingLMoments(w);
      let compared = 0;
      for (let j = 0; j < x.length; j++) {
        if (f.full) {
          const win = x.slice(j - w, j);
          const sorted = [...win].sort((a, b) => a - b);
          const view = Array.from(f.sortedView());
          if (view.some((v, i) => v !== sorted[i])) fail(`sorted window w=${w} j=${j}`, win, view, sorted);
          const got = f.lmoments();
          const want = sampleLMoments(win);
          for (const key of ["l1", "l2", "t3", "t4"] as const) {
            if (!Object.is(got[key], want[key])) fail(`${key} w=${w} j=${j}`, win, got[key], want[key]);
          }
          const e = f.estimate();
          const b = estimateFromLMoments(want);
          if (JSON.stringify(e) !== JSON.stringify(b)) fail(`estimate w=${w} j=${j}`, win, e, b);
          compared++;
        }
        f.push(x[j]);
      }
      expect(compared).toBe(x.length - w);
    }
  });

  test("l2 agrees with Hosking's pairwise-difference definition (1e-12 relative)", () => {
    const x = series(400, 5);
    const w = 60;
    const f = new SlidingLMoments(w);
    for (let j = 0; j < x.length; j++) {
      if (f.full && j % 7 === 0) {
        const s = [...x.slice(j - w, j)].sort((a, b) => a - b);
        let sum = 0;
        for (let i = 0; i < w; i++) for (let k = 0; k < i; k++) sum += s[i] - s[k];
        const want = (0.5 * sum) / ((w * (w - 1)) / 2);
        const got = f.lmoments().l2;
        if (!(Math.abs(got - want) <= 1e-12 * Math.abs(want))) fail(`l2 at j=${j}`, s, got, want);
      }
      f.push(x[j]);
    }
  });

  test("slideTo follows consecutive windows with one push each and rebuilds after a jump, matching the batch estimate", () => {
    const x = series(500, 9);
    const w = 40;
    const f = new SlidingLMoments(w);
    let pushes = 0;
    for (let j = w; j <= x.length; j += j < 300 ? 1 : 17) {
      const win = x.slice(j - w, j);
      if (f.slideTo(win)) pushes++;
      const got = f.lmoments();
      const want = sampleLMoments(win);
      for (const key of ["l1", "l2", "t3", "t4"] as const) if (!Object.is(got[key], want[key])) fail(`${key} at j=${j}`, win, got[key], want[key]);
    }
    expect(pushes).toBe(300 - w - 1 + 1); // every step of one value after the first window; none after the jumps
    expect(() => f.slideTo(x.slice(0, w - 1))).toThrow(/exactly 40/);
  });

  test("a constant window has no estimate; pop returns values oldest first; bad input is refused", () => {
    const f = new SlidingLMoments(10);
    for (let i = 0; i < 10; i++) f.push(0.002);
    expect(f.full).toBe(true);
    expect(f.estimate()).toBeNull();
    f.push(0.01);
    expect(f.estimate()).not.toBeNull();
    expect(f.size).toBe(10);
    expect(f.pop()).toBe(0.002);
    expect(f.size).toBe(9);
    f.clear();
    expect(f.pop()).toBeNaN();
    expect(f.estimate()).toBeNull();
    expect(() => f.push(NaN)).toThrow(/finite/);
    expect(() => new SlidingLMoments(3)).toThrow(/at least 4/);
  });
});
