/**
 * FIT and FITREPORT are asynchronous and cancelable in the BUILT bundle: the maximum-likelihood search (each pass
 * over the data is one unit of work) gives the event loop back many times on a large sample with a wild outlier,
 * and a cancel stops it within a slice and stores nothing in the fit cache.
 *
 * No wall-clock assertion: as in async.test.ts, the bundle runs in a node:vm context whose Date.now() is a counter
 * (1 per call; the driver reads it once per unit, so a 40 ms slice is 40 units) and whose setTimeout counts the
 * returns to the event loop. Data are simulated with the core sampler (seeded), one value replaced by 1e10.
 */
import { sample } from "../../src/core/gno";
import { cancelAndCheckStopped, errorOf, loadCounted, settleUntil } from "./countingSandbox";
import { col } from "./harness";

const law = { location: 0.0003, scale: 0.011, shape: -0.12 };

describe("FIT and FITREPORT are async and @cancelable", () => {
  test.each(["FIT", "FITREPORT"])("%s is cancelable in the metadata, its last parameter is not described, and it returns a promise", async (id) => {
    const s = loadCounted();
    const meta = s.metadata.functions.find((f) => f.id === id)!;
    expect(meta.options?.cancelable).toBe(true);
    expect(meta.parameters.map((p) => p.name)).toEqual(["data", "method"]);
    expect((meta.description ?? "").length).toBeLessThanOrEqual(255);
    const x = Array.from(sample(law, 300, 51));
    const invocation: { onCanceled?: () => void } = {};
    const pending = s.run(id, [col(x)], invocation);
    expect(pending).toBeInstanceOf(Promise);
    const v = (await pending) as unknown[][];
    expect(errorOf(v)).toBeNull();
    expect(typeof invocation.onCanceled).toBe("function");
  });
});

describe("a large sample with a wild outlier: many short units, many returns to the event loop, cancel stops it", () => {
  // 50,000 simulated returns (above the 20,000 from which the start is taken from a subsample) with one 1e10:
  // the search walks the irregular-fit shape profile, hundreds of passes over the data
  const x = Array.from(sample(law, 50_000, 53));
  x[25_000] = 1e10;

  test("FIT yields at least 5 times (≥ 200 units of one pass each) before it is canceled, then stops and caches nothing", async () => {
    const s = loadCounted();
    const invocation: { onCanceled?: () => void } = {};
    const pending = s.run("FIT", [col(x)], invocation);
    await settleUntil(() => s.yields() >= 5);
    // still running after 5 slices of 40 units: the fit is cut into many units, not one block
    expect(s.yields()).toBeGreaterThanOrEqual(5);
    expect(s.ticks()).toBeGreaterThanOrEqual(5 * 40);
    await cancelAndCheckStopped(s, invocation, pending);

    // a canceled fit was not stored: a new call starts the search again (it takes units, it does not return at once)
    const again: { onCanceled?: () => void } = {};
    const before = s.ticks();
    const second = s.run("FIT", [col(x)], again);
    await settleUntil(() => s.ticks() - before >= 80);
    expect(s.ticks() - before).toBeGreaterThanOrEqual(80);
    again.onCanceled!();
    expect(errorOf(await second)?.message).toMatch(/Canceled/);
  });

  test("FITREPORT on the same data can be canceled the same way", async () => {
    const s = loadCounted();
    const invocation: { onCanceled?: () => void } = {};
    const pending = s.run("FITREPORT", [col(x)], invocation);
    await settleUntil(() => s.yields() >= 2);
    invocation.onCanceled!();
    expect(errorOf(await pending)?.message).toMatch(/Canceled/);
  });
});

describe("a regular fit on a cached sample returns without further units", () => {
  test("the second FIT of the same numbers takes no unit of work (the Work returns the cached fit at once)", async () => {
    const s = loadCounted();
    const x = Array.from(sample(law, 2_000, 55));
    const first = (await s.run("FIT", [col(x)], {})) as number[][];
    expect(errorOf(first)).toBeNull();
    const before = s.ticks();
    const second = (await s.run("FIT", [col(x)], {})) as number[][];
    expect(second).toEqual(first);
    // runWork reads the clock once at its start; a cached fit adds no unit beyond that read
    expect(s.ticks() - before).toBeLessThanOrEqual(1);
  });
});
