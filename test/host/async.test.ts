/**
 * GOF, COMPARE and VARCI are asynchronous and cancelable in the BUILT bundle: they return promises, install the
 * host's onCanceled handler, give the event loop back between slices, and stop when canceled.
 *
 * No wall-clock assertion: the bundle runs in its own node:vm context whose clock is a counter (Date.now() advances
 * 1 ms per call, and the driver reads it once per unit of work), and whose setTimeout counts the returns to the
 * event loop. A 40 ms slice is then exactly 40 units, so the number of yields proves that the work is cut into many
 * small units (not one long one), and a cancel is seen within one slice.
 * Data are simulated with the core sampler (seeded).
 */
import { sample } from "../../src/core/gno";
import { cancelAndCheckStopped, errorOf, loadCounted } from "./countingSandbox";
import { col } from "./harness";

const law = { location: 0.0003, scale: 0.011, shape: -0.12 };

describe("heavy functions are async and @cancelable in the built metadata", () => {
  test.each(["GOF", "COMPARE", "VARCI"])("%s is cancelable and its implementation returns a promise", (id) => {
    const s = loadCounted();
    const meta = s.metadata.functions.find((f) => f.id === id)!;
    expect(meta.options?.cancelable).toBe(true);
    expect((meta.description ?? "").length).toBeLessThanOrEqual(255);
  });
});

describe("slices are small: the event loop gets control back many times per call", () => {
  test("GOF's bootstrap yields once per replicate at least (199 replicates → ≥ 199/40 returns to the event loop)", async () => {
    const s = loadCounted();
    const x = Array.from(sample(law, 300, 41));
    const before = s.yields();
    const invocation: { onCanceled?: () => void } = {};
    const t = (await s.run("GOF", [col(x), null, 199], invocation)) as unknown[][];
    expect(errorOf(t)).toBeNull();
    expect(typeof invocation.onCanceled).toBe("function");
    // one clock read per unit: 199 replicates → at least ⌊199/40⌋ = 4 yields
    expect(s.yields() - before).toBeGreaterThanOrEqual(4);
    expect(t.find((r) => r[0] === "p-values from")![1]).toMatch(/199 resamples/);
  });

  test("VARCI's profile end searches yield between profile points", async () => {
    const s = loadCounted();
    const x = Array.from(sample(law, 500, 43));
    const before = s.ticks();
    const invocation: { onCanceled?: () => void } = {};
    const v = (await s.run("VARCI", [col(x), 0.99], invocation)) as unknown[][];
    expect(errorOf(v)).toBeNull();
    expect(typeof invocation.onCanceled).toBe("function");
    // the driver reads the clock once per unit: the interval took several units, not one block
    expect(s.ticks() - before).toBeGreaterThanOrEqual(6);
    expect(v.map((r) => typeof r[0])).toEqual(["number", "number", "number"]);
  });

  test("COMPARE yields after each family (5 units)", async () => {
    const s = loadCounted();
    const x = Array.from(sample(law, 400, 45));
    const before = s.ticks();
    const t = (await s.run("COMPARE", [col(x)], {})) as unknown[][];
    expect(errorOf(t)).toBeNull();
    expect(s.ticks() - before).toBeGreaterThanOrEqual(5);
    expect(t.length).toBe(6);
  });
});

describe("a canceled call stops within a slice", () => {
  test("GOF canceled right after its first slice returns #N/A Canceled and runs no further replicate", async () => {
    const s = loadCounted();
    const x = Array.from(sample(law, 300, 47));
    const invocation: { onCanceled?: () => void } = {};
    const pending = s.run("GOF", [col(x), null, 6000], invocation);
    // the first slice ends after 40 clock reads; cancel as soon as control is back
    await new Promise((r) => setImmediate(r));
    expect(typeof invocation.onCanceled).toBe("function");
    const after = await cancelAndCheckStopped(s, invocation, pending);
    expect(after).toBeLessThan(6000); // far fewer units than the full run
  });
});
