/**
 * TAILFIT and TAILREPORT are asynchronous and cancelable in the BUILT bundle: the full-data fit, every likelihood
 * pass of the censored body fit and every profile pass of a tail fit are units of work, so a large sample with a
 * wild outlier gives the event loop back many times, and a cancel stops the work within a slice.
 *
 * No wall-clock assertion (as in fitAsync.test.ts): the bundle runs in a node:vm context whose Date.now() is a
 * counter (1 per call; the driver reads it once per unit, so a 40 ms slice is 40 units) and whose setTimeout counts
 * the returns to the event loop. Data are simulated with the core sampler (seeded), one value replaced by 1e10.
 */
import { sample } from "../../src/core/gno";
import { cancelAndCheckStopped, errorOf, loadCounted, settleUntil } from "./countingSandbox";
import { col } from "./harness";

const law = { location: 0.0003, scale: 0.011, shape: -0.12 };

describe("TAILFIT and TAILREPORT are async and @cancelable", () => {
  test.each(["TAILFIT", "TAILREPORT"])("%s is cancelable in the metadata, its last parameter is not described, and it returns a promise", async (id) => {
    const s = loadCounted();
    const meta = s.metadata.functions.find((f) => f.id === id)!;
    expect(meta.options?.cancelable).toBe(true);
    expect(meta.parameters.map((p) => p.name)).toEqual(["data", "tail", "sides", "method"]);
    expect((meta.description ?? "").length).toBeLessThanOrEqual(255);
    const x = Array.from(sample(law, 400, 71));
    const invocation: { onCanceled?: () => void } = {};
    const pending = s.run(id, [col(x)], invocation);
    expect(pending).toBeInstanceOf(Promise);
    expect(errorOf(await pending)).toBeNull();
    expect(typeof invocation.onCanceled).toBe("function");
  });
});

describe("a large sample with a wild outlier: many returns to the event loop, cancel stops it", () => {
  // 50,000 simulated returns with one 1e10: the full-data fit alone is hundreds of passes over the data
  const x = Array.from(sample(law, 50_000, 73));
  x[25_000] = 1e10;

  test.each(["TAILFIT", "TAILREPORT"])("%s yields at least 5 times (≥ 200 units) before it is canceled, then stops", async (id) => {
    const s = loadCounted();
    const invocation: { onCanceled?: () => void } = {};
    const pending = s.run(id, [col(x), null, "both"], invocation);
    await settleUntil(() => s.yields() >= 5);
    expect(s.yields()).toBeGreaterThanOrEqual(5);
    expect(s.ticks()).toBeGreaterThanOrEqual(5 * 40);
    await cancelAndCheckStopped(s, invocation, pending);
  });
});

describe("the tail part itself is cut into units", () => {
  test("with the full-data fit already cached (by FIT), TAILFIT still takes hundreds of units and several slices", async () => {
    const s = loadCounted();
    const x = Array.from(sample(law, 3_000, 75));
    expect(errorOf(await s.run("FIT", [col(x)], {}))).toBeNull();
    const ticks = s.ticks();
    const yields = s.yields();
    const got = (await s.run("TAILFIT", [col(x), null, "both"], {})) as unknown[][];
    expect(errorOf(got)).toBeNull();
    expect(got).toHaveLength(9);
    // censored body passes plus two tails of about 100 profile passes each (one clock read per unit)
    expect(s.ticks() - ticks).toBeGreaterThanOrEqual(200);
    expect(s.yields() - yields).toBeGreaterThanOrEqual(4);
  });
});
