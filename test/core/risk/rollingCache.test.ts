/**
 * Rolling runs cached by content: ROLLVAR, ROLLES and ROLLPIT over the same column and arguments compute one run
 * (also when the host evaluates the three at once), any change of a value or an argument computes a new one, and a
 * cached answer equals a fresh one. The cells are called from source (src/functions/rolling.ts) with a stand-in
 * invocation object, as the host passes one. Data: an invented, simulated scenario (seeded draws of the law).
 */
import { sample } from "../../../src/core/gno";
import { clearRollingCache, cachedRolling, rollingCacheKey, rollingCacheStats, storeRolling, rollingForecasts, createModel } from "../../../src/core/risk";
import { runToEnd } from "../../../src/core/work";
import { rollingEsCell, rollingPitCell, rollingVarCell } from "../../../src/functions/rolling";

const x = sample({ location: 0.0002, scale: 0.01, shape: -0.1 }, 300, 57);
const col = (v: ArrayLike<number>) => Array.from(v, (u) => [u]);
// eslint-disable-next-line @typescript-eslint/no-explicit-any
const inv = () => ({ onCanceled: undefined }) as any;

// the host's error type, as the runtime defines it (CustomFunctionsRuntime 1.1: an error code and a message)
(globalThis as Record<string, unknown>).CustomFunctions = {
  ErrorCode: { notAvailable: "#N/A", invalidValue: "#VALUE!" },
  Error: class {
    constructor(
      readonly code: string,
      readonly message?: string,
    ) {}
  },
};

beforeEach(() => clearRollingCache());

test("three cells evaluated at once over the same column and arguments compute one run; a later call is a hit", async () => {
  const [v, e, p] = await Promise.all([
    rollingVarCell(col(x), 100, 0.99, null, "lmom", null, null, inv()),
    rollingEsCell(col(x), 100, 0.975, null, "lmom", null, null, inv()),
    rollingPitCell(col(x), 100, 0.99, "short", "lmom", null, null, inv()),
  ]);
  expect(rollingCacheStats().stored).toBe(1);
  // each column equals the law of a fresh core run
  const fresh = runToEnd(rollingForecasts(x, 100, createModel("iid", { method: "lmom" })));
  for (let t = 0; t < x.length; t++) {
    const law = fresh.laws[t];
    const want = law ? [law.valueAtRisk(0.99, "long"), law.expectedShortfall(0.975, "long"), 1 - law.cdf(x[t])] : ["", "", ""];
    expect({ t, got: [v[t][0], e[t][0], p[t][0]] }).toEqual({ t, got: want });
  }
  const again = await rollingVarCell(col(x), 100, 0.95, "short", "lmom", null, null, inv());
  expect(rollingCacheStats()).toMatchObject({ stored: 1, hits: 1 });
  expect(typeof again[150][0]).toBe("number");
});

test.each([
  ["another window", [101, "lmom", null, null]],
  ["another method", [100, "mle", null, null]],
  ["another model", [100, null, "hs", null]],
  ["a decay", [100, null, "hs", 0.99]],
])("%s computes a new run", async (_label, [w, method, model, decay]) => {
  await rollingVarCell(col(x), 100, 0.99, null, "lmom", null, null, inv());
  await rollingVarCell(col(x), w, 0.99, null, method, model, decay, inv());
  expect(rollingCacheStats().stored).toBe(2);
});

test("one changed value (or a blank) computes a new run, and its rows after the change differ", async () => {
  const a = await rollingVarCell(col(x), 100, 0.99, null, "lmom", null, null, inv());
  const y = Float64Array.from(x);
  y[200] = 0.05;
  const b = await rollingVarCell(col(y), 100, 0.99, null, "lmom", null, null, inv());
  const z: unknown[][] = col(x);
  z[200] = [""];
  await rollingVarCell(z, 100, 0.99, null, "lmom", null, null, inv());
  expect(rollingCacheStats().stored).toBe(3);
  expect(b[200][0]).toBe(a[200][0]);
  expect(b[201][0]).not.toBe(a[201][0]);
});

test("a hit is proven by content: same key, other numbers is a miss", () => {
  const run = runToEnd(rollingForecasts(x, 100, createModel("iid", { method: "lmom" })));
  const key = rollingCacheKey(x, 100, "iid", { method: "lmom" });
  storeRolling(key, x, run);
  expect(cachedRolling(key, x)).toBe(run);
  const forged = Float64Array.from(x);
  forged[150] = -forged[150];
  expect(cachedRolling(key, forged)).toBeUndefined(); // a forged collision: the key is trusted only with equal content
  expect(rollingCacheKey(x, 100, "iid", { method: "lmom", lambda: 0.9 })).not.toBe(key);
});

test("when the run a cell waits on is canceled, the waiting cell computes the run itself", async () => {
  const big = sample({ location: 0.0002, scale: 0.01, shape: -0.1 }, 3000, 58);
  const owner = inv();
  const first = rollingVarCell(col(big), 250, 0.99, null, "mle", null, null, owner);
  const second = rollingEsCell(col(big), 250, 0.99, null, "mle", null, null, inv());
  await new Promise((r) => setTimeout(r, 0));
  owner.onCanceled(); // the host cancels the first cell (edited); it stops at its next slice
  const [a, b] = await Promise.all([first, second]);
  expect(String((a[0][0] as { message?: string }).message ?? a[0][0])).toMatch(/Canceled/);
  expect(typeof b[2999][0]).toBe("number");
  expect(rollingCacheStats().stored).toBe(1);
});
