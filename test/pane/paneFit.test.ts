/**
 * The pane's fit no longer blocks the page: analyse() runs fitGnoCachedWork in page slices (or hands it to the
 * worker through RunControl.fit), returning to the event loop many times on a large sample with a wild outlier,
 * and a cancel during the fit stops it, rejects with Cancelled and leaves nothing in the fit cache.
 *
 * No wall-clock assertion: Date.now() is a counter (1 per call; the slice driver reads it once per unit of work,
 * so a 20 ms slice is 20 units) and setTimeout is wrapped to count the returns to the event loop. The numbers
 * are checked against fitGno run to the end on the same data (the function behind ASKEW.FIT), compared with
 * Object.is per field by toEqual. Data: the core sampler (seeded), one value replaced by 1e10 (a pasted-price
 * mistake), so the search walks the irregular-fit shape profile (hundreds of passes over the data).
 */
import { clearFitCache, fitGno, fitGnoCachedWork, type GnoFit } from "../../src/core/fit";
import { sample } from "../../src/core/gno";
import { analyse, Cancelled, type Progress } from "../../src/taskpane/analysis";
import { ComparisonRunner } from "../../src/taskpane/worker";

const law = { location: 0.0003, scale: 0.011, shape: -0.12 }; // invented desk returns, simulated
const data = sample(law, 30_000, 91);
data[15_000] = 1e10;

let tick = 0;
let yields = 0;
const realSetTimeout = global.setTimeout;

beforeEach(() => {
  clearFitCache();
  tick = 0;
  yields = 0;
  jest.spyOn(Date, "now").mockImplementation(() => ++tick);
  global.setTimeout = ((fn: () => void, ms?: number) => {
    yields++;
    return realSetTimeout(fn, ms);
  }) as typeof setTimeout;
});

afterEach(() => {
  global.setTimeout = realSetTimeout;
  jest.restoreAllMocks();
});

/** The fit cached for these numbers, or undefined (a cached fit comes back without a single step). */
function cached(x: Float64Array): GnoFit | undefined {
  const r = fitGnoCachedWork(x, "mle").next();
  return r.done ? r.value : undefined;
}

const settle = (): Promise<void> => new Promise((resolve) => realSetTimeout(resolve, 5));

describe("the pane's fit on 30,000 simulated returns with one 1e10", () => {
  test("runs in many page slices and gives ASKEW.FIT's numbers exactly", async () => {
    const steps: string[] = [];
    let yieldsInFit = -1;
    // stop right after the fit: the later steps are not under test here
    const run = analyse(data, "mle", {
      pause: () => Promise.resolve(),
      onProgress: (p: Progress) => {
        steps.push(p.step);
        if (p.step === "normal benchmark") yieldsInFit = yields;
      },
      isCancelled: () => yieldsInFit >= 0,
    });
    await expect(run).rejects.toBeInstanceOf(Cancelled);
    expect(steps).toEqual(["fitting the law", "normal benchmark"]);
    // before this change the fit ran as one block between two pauses: 0 returns to the event loop inside it
    expect(yieldsInFit).toBeGreaterThanOrEqual(5);
    const fit = cached(data);
    expect(fit).toBeDefined();
    jest.restoreAllMocks();
    const want = fitGno(data, { method: "mle" });
    expect(fit).toEqual(want);
    expect(fit!.regular).toBe(false); // the outlier makes the fit irregular: the long path was exercised
  });

  test("Cancel during the fit stops it, rejects with Cancelled and caches nothing", async () => {
    const steps: string[] = [];
    const run = analyse(data, "mle", {
      pause: () => Promise.resolve(),
      onProgress: (p: Progress) => steps.push(p.step),
      isCancelled: () => yields >= 3,
    });
    await expect(run).rejects.toBeInstanceOf(Cancelled);
    expect(steps).toEqual(["fitting the law"]);
    expect(yields).toBe(3);
    const stoppedAt = tick;
    await settle();
    await settle();
    expect(tick).toBe(stoppedAt); // no unit of the fit ran after the cancel
    expect(cached(data)).toBeUndefined();
  });

  test("without a worker the runner fits in page slices; runner.cancel stops it", async () => {
    const runner = new ComparisonRunner(null);
    const pending = runner.fit(data, "mle");
    pending.catch(() => undefined);
    while (yields < 3) await settle();
    runner.cancel(new Cancelled());
    await expect(pending).rejects.toBeInstanceOf(Cancelled);
    expect(runner.ranInPage).toBe(true);
    expect(cached(data)).toBeUndefined();
  });
});
