/**
 * The spliced fit as resumable work: fitSplicedWork gives the same fit as fitSpliced (which runs it to the end),
 * cut into many steps (each likelihood pass of the censored body fit, each profile pass of a tail fit), with
 * progress fractions inside [0, 1]. Data are simulated with the core sampler (seeded); one value is replaced by
 * 1e10 so the full-data fit has no regular maximum and the longest route (L-moment body start) is taken.
 */
import { sample } from "../../../src/core/gno";
import { fitGno } from "../../../src/core/fit";
import { fitGpdMle, fitGpdMleWork, fitSpliced, fitSplicedWork, gpdQuantileUpper } from "../../../src/core/pareto";
import { uniformStream } from "../../../src/core/random";
import { runToEnd } from "../../../src/core/work";

const law = { location: 0.0003, scale: 0.011, shape: -0.12 };

function steps<T>(work: Generator<number, T, void>): { value: T; fractions: number[] } {
  const fractions: number[] = [];
  for (;;) {
    const r = work.next();
    if (r.done) return { value: r.value, fractions };
    fractions.push(r.value);
  }
}

describe("fitSplicedWork", () => {
  const x = sample(law, 5_000, 61);
  x[2_500] = 1e10;

  test("same fit as fitSpliced, in many steps with fractions in [0, 1]", () => {
    const direct = fitSpliced(x, { sides: "both" });
    const { value, fractions } = steps(fitSplicedWork(x, { sides: "both" }));
    expect(value.params).toEqual(direct.params);
    expect(value.bodyMethod).toBe(direct.bodyMethod);
    expect(value.warnings).toEqual(direct.warnings);
    // full-data fit (hundreds of passes on this sample), censored body passes, two tails of ~100 profile passes
    expect(fractions.length).toBeGreaterThan(200);
    for (const f of fractions) expect(Number.isNaN(f) || (f >= 0 && f <= 1)).toBe(true);
  });

  test("with a given full-data fit, the censored body and tails alone still take many steps", () => {
    const body = fitGno(x);
    const { value, fractions } = steps(fitSplicedWork(x, { sides: "loss", body }));
    expect(value.params).toEqual(fitSpliced(x, { sides: "loss", body }).params);
    expect(fractions.length).toBeGreaterThan(100);
  });

  test("a Work that is stopped half-way can be dropped (return) without throwing", () => {
    const w = fitSplicedWork(x, { sides: "both" });
    for (let i = 0; i < 50; i++) expect(w.next().done).toBe(false);
    expect(w.return(undefined as never).done).toBe(true);
  });
});

describe("fitGpdMleWork", () => {
  test("one step per profile pass: at least the τ grid, same estimate as fitGpdMle", () => {
    // generalized Pareto excesses by inversion of the survival function (seeded uniform stream)
    const next = uniformStream(3);
    const y = Float64Array.from({ length: 5_000 }, () => gpdQuantileUpper(next(), { shape: 0.2, scale: 1 }));
    const { value, fractions } = steps(fitGpdMleWork(y));
    expect(value).toEqual(fitGpdMle(y));
    expect(fractions.length).toBeGreaterThan(50);
    expect(runToEnd(fitGpdMleWork(y)).params).toEqual(fitGpdMle(y).params);
  });
});
