/**
 * HISTVAR, CFVAR, SCORE and DMTEST through the BUILT bundle, called as the host calls them. References: hand
 * computation from the stated definitions (historical simulation order statistics; tick and FZ0 losses), the
 * Cornish–Fisher expansion written out here with two-pass sample moments (Zangari 1996, from memory), the core
 * Diebold–Mariano test (itself checked against numpy/scipy in test/core/scores). Data are invented and simulated.
 */
import { dieboldMariano, fz0Loss, tickLoss } from "../../src/core/scores";
import { normalQuantile } from "../../src/core/normal";
import { cellProblems } from "../hardening/checker";
import { normalDraws } from "../core/scores/draws";
import { Bundle, col, loadBundle } from "./harness";

let b: Bundle;
beforeAll(async () => {
  b = await loadBundle();
});

const closeTo = (label: string, got: unknown, want: number, rel: number, abs = 0) => {
  if (typeof got !== "number" || !(Math.abs(got - want) <= abs + rel * Math.abs(want))) {
    throw new Error(`${label}: got ${JSON.stringify(got)}, want ${want} (rel ${rel}, abs ${abs})`);
  }
};

// Invented returns with ties (0.03 twice among the long losses), and two blank rows that must be skipped.
const X = [0.02, -0.05, null, 0.01, -0.03, -0.03, 0.04, -0.01, "", 0.0, -0.02, 0.03];

describe("HISTVAR", () => {
  test("hand-computed order statistics (blanks skipped): both sides, fractional index, ties", () => {
    const long = b.call("HISTVAR", col(X), 0.85, null, null) as unknown[][];
    closeTo("VaR long 85%", long[0][0], 0.03, 1e-14);
    closeTo("ES long 85%", long[1][0], (0.05 + 0.5 * 0.03) / 1.5, 1e-14);
    const tie = b.call("HISTVAR", col(X), 0.75, "long", null) as unknown[][];
    closeTo("VaR in the tie", tie[0][0], 0.03, 1e-14);
    closeTo("ES in the tie", tie[1][0], (0.05 + 0.03 + 0.5 * 0.03) / 2.5, 1e-14);
    const short = b.call("HISTVAR", [X], 0.7, "short", null) as unknown[][];
    closeTo("VaR short 70% (row input)", short[0][0], 0.02, 1e-14);
    closeTo("ES short 70%", short[1][0], 0.03, 1e-14);
  });

  test("age weights: a decay close to 1 tends to the plain result; λ = 0.1 matches a hand walk over 0.1^age weights", () => {
    const plain = b.call("HISTVAR", col(X), 0.8, null, null) as unknown[][];
    const near = b.call("HISTVAR", col(X), 0.8, null, 0.999999) as unknown[][];
    closeTo("near-1 VaR", near[0][0], plain[0][0] as number, 1e-9);
    closeTo("near-1 ES", near[1][0], plain[1][0] as number, 1e-5);
    // λ = 0.1: the weights are 0.1^age (age 0 = the newest usable return). Hand walk written here: sort the returns,
    // accumulate weights from the worst until 5% of the total is reached; that return's loss is the VaR.
    const w = [9, 8, 7, 6, 5, 4, 3, 2, 1, 0].map((a) => Math.pow(0.1, a));
    const xs = [0.02, -0.05, 0.01, -0.03, -0.03, 0.04, -0.01, 0.0, -0.02, 0.03];
    const total = w.reduce((s, v) => s + v, 0);
    const order = xs.map((x, i) => i).sort((i, j) => xs[i] - xs[j]);
    let seen = 0;
    let want = NaN;
    for (const i of order) {
      seen += w[i];
      if (seen >= 0.05 * total) {
        want = -xs[i];
        break;
      }
    }
    const small = b.call("HISTVAR", col(X), 0.95, null, 0.1) as unknown[][];
    closeTo("λ = 0.1 VaR", small[0][0], want, 1e-14);
  });

  test("decay of 1 or more, text in the data, or too few numbers are #VALUE! with a message", () => {
    expect(b.errorOf(b.call("HISTVAR", col(X), 0.99, null, 1))?.message).toMatch(/decay/);
    expect(b.errorOf(b.call("HISTVAR", col([...X, "x"]), 0.99, null, null))?.message).toMatch(/row 13/);
    expect(b.errorOf(b.call("HISTVAR", col([0.01, 0.02]), 0.99, null, null))?.message).toMatch(/at least 10/);
    expect(b.errorOf(b.call("HISTVAR", [[0.01, 0.02], [0.03, 0.04]], 0.99, null, null))?.message).toMatch(/single column/);
    // The stated bound: 100,000 usable returns (blanks do not count).
    const many = Array.from({ length: 100_001 }, (_, i) => [((i * 7919) % 1000) / 1e5 - 0.005]);
    expect(b.errorOf(b.call("HISTVAR", many, 0.99, null, null))?.message).toMatch(/at most 100,000/);
    expect(b.errorOf(b.call("HISTVAR", many.slice(1), 0.99, null, null))).toBeNull();
  });
});

/** Two-pass moment estimators g1, g2 and the n − 1 standard deviation (textbook forms, not core's one-pass update). */
function moments(xs: number[]) {
  const n = xs.length;
  const mean = xs.reduce((s, v) => s + v, 0) / n;
  const m2 = xs.reduce((s, v) => s + (v - mean) ** 2, 0) / n;
  const m3 = xs.reduce((s, v) => s + (v - mean) ** 3, 0) / n;
  const m4 = xs.reduce((s, v) => s + (v - mean) ** 4, 0) / n;
  return { mean, sd: Math.sqrt((m2 * n) / (n - 1)), S: m3 / m2 ** 1.5, K: m4 / (m2 * m2) - 3 };
}

describe("CFVAR", () => {
  test("VaR is μ + σ·g(z) from the expansion written out with two-pass moments (long and short)", () => {
    // Invented: normal draws with a few fat-tail days, so (S, K) lands inside the valid domain.
    const xs = Array.from(normalDraws(500, 42, 0.01), (x, i) => (i % 50 === 0 ? 2.5 * x : x));
    const m = moments(xs);
    const z = normalQuantile(0.01);
    const g = (S: number) => z + ((z * z - 1) * S) / 6 + ((z ** 3 - 3 * z) * m.K) / 24 - ((2 * z ** 3 - 5 * z) * S * S) / 36;
    const long = b.call("CFVAR", col(xs), 0.99, null) as unknown[][];
    expect(cellProblems(long)).toEqual([]);
    closeTo("VaR long", long[0][0], -(m.mean + m.sd * g(m.S)), 1e-11);
    const short = b.call("CFVAR", col(xs), 0.99, "short") as unknown[][];
    closeTo("VaR short", short[0][0], m.mean - m.sd * g(-m.S), 1e-11);
    expect(long[1][0] as number).toBeGreaterThan(long[0][0] as number);
  });

  test("outside the valid domain: #N/A naming the reason", () => {
    // Invented exponential-like losses: skewness ≈ 2 with excess kurtosis ≈ 6 lies outside the domain.
    const xs = Array.from({ length: 200 }, (_, i) => Math.log((i + 0.5) / 200) * 0.01);
    const e = b.errorOf(b.call("CFVAR", col(xs), 0.99, null));
    expect(e?.code).toBe("#N/A");
    expect(e?.message).toMatch(/Maillard/);
  });
});

describe("SCORE and DMTEST", () => {
  test("SCORE: 3×2 table with the hand-computed mean tick and FZ0 losses; gap rows skipped", () => {
    const r = [-0.03, 0.01, null, 0.004];
    const v = [0.02, 0.02, 0.02, 0.02];
    const e = [0.025, 0.025, 0.025, 0.025];
    const out = b.call("SCORE", col(r), col(v), col(e), 0.975, null) as unknown[][];
    expect(out.map((row) => row[0])).toEqual(["Observations scored", "Mean tick loss", "Mean FZ0 loss"]);
    expect(out[0][1]).toBe(3);
    // Tick: (0.025 − 1)(−0.03 + 0.02) = 0.00975; 0.025·0.03 = 0.00075; 0.025·0.024 = 0.0006.
    closeTo("tick", out[1][1], (0.00975 + 0.00075 + 0.0006) / 3, 1e-13);
    // FZ0: 16 + 0.8 + ln 0.025 − 1 on the exception, 0.8 + ln 0.025 − 1 on the quiet days.
    closeTo("FZ0", out[2][1], (16 + 3 * (0.8 + Math.log(0.025) - 1)) / 3, 1e-13);
    expect(b.errorOf(b.call("SCORE", col(r), col(v), col([0.025, 0, 0.025, 0.025]), 0.975, null))?.message).toMatch(/row 2/);
  });

  test("DMTEST: a clearly worse column B is flagged, the statistic matches the core test on the kept rows", () => {
    const n = 600;
    const r = Array.from(normalDraws(n, 314, 0.01), (x) => x as number | null);
    r[10] = null; // a gap
    const c = 0.975;
    const z = normalQuantile(1 - c);
    const va = -0.01 * z;
    const ea = (0.01 * Math.exp(-(z * z) / 2)) / Math.sqrt(2 * Math.PI) / (1 - c);
    const A = col(r.map(() => va));
    const EA = col(r.map(() => ea));
    const B = col(r.map(() => 0.6 * va));
    const EB = col(r.map(() => 0.6 * ea));
    const out = b.call("DMTEST", col(r), A, EA, B, EB, c, null) as unknown[][];
    expect(cellProblems(out)).toEqual([]);
    expect(out.length).toBe(14);
    expect(out[0][1]).toBe(n - 1);
    expect(out[7][1]).toBe("A");
    const kept = r.filter((x): x is number => x !== null);
    const ref = dieboldMariano(
      kept.map((x) => fz0Loss(x, va, ea, c)),
      kept.map((x) => fz0Loss(x, 0.6 * va, 0.6 * ea, c)),
    );
    closeTo("DM FZ0", out[4][1], ref.statistic, 1e-12);
    const refTick = dieboldMariano(
      kept.map((x) => tickLoss(x, va, c)),
      kept.map((x) => tickLoss(x, 0.6 * va, c)),
    );
    closeTo("DM tick", out[10][1], refTick.statistic, 1e-12);
  });

  test("DMTEST on identical columns says there is no test instead of a NaN", () => {
    const r = Array.from(normalDraws(50, 3, 0.01));
    const v = col(r.map(() => 0.02));
    const e = col(r.map(() => 0.025));
    const out = b.call("DMTEST", col(r), v, e, v, e, 0.975, null) as unknown[][];
    expect(cellProblems(out)).toEqual([]);
    expect(out[7][1]).toMatch(/no test/);
  });
});

describe("ROLLVAR / ROLLES / ROLLPIT with the reference models", () => {
  // Invented: simulated returns with a fat-tail day every 17th row and one blank row.
  const sim: Array<number | null> = Array.from(normalDraws(200, 21, 0.01), (x, i) => (i % 17 === 0 ? 3 * x : x));
  sim[70] = null;
  const W = 80;
  /** The W usable returns before row t. */
  const before = (t: number) => {
    const out: number[] = [];
    for (let i = t - 1; i >= 0 && out.length < W; i--) if (sim[i] !== null) out.unshift(sim[i] as number);
    return out;
  };

  test("hs: each row equals HISTVAR on the window before it; ROLLPIT is the share of that window at or below the return", async () => {
    const v = (await b.run("ROLLVAR", col(sim), W, 0.95, null, null, "hs")) as unknown[][];
    const e = (await b.run("ROLLES", col(sim), W, 0.95, "short", null, "hs")) as unknown[][];
    const u = (await b.run("ROLLPIT", col(sim), W, 0.95, null, null, "hs")) as unknown[][];
    for (const out of [v, e, u]) expect(cellProblems(out)).toEqual([]);
    expect([v[W - 1][0], v[70][0]]).toEqual(["", ""]);
    for (const t of [W + 1, 120, 199]) {
      const w = before(t);
      const long = b.call("HISTVAR", col(w), 0.95, null, null) as number[][];
      const short = b.call("HISTVAR", col(w), 0.95, "short", null) as number[][];
      expect(v[t][0]).toBe(long[0][0]);
      expect(e[t][0]).toBe(short[1][0]);
      expect(u[t][0]).toBe(w.filter((x) => x <= (sim[t] as number)).length / W);
    }
  });

  test("cf: a row inside the domain equals CFVAR on its window; a row outside shows the reason", async () => {
    // Milder invented tails (every 15th return doubled) so that some windows fall inside the domain and some outside.
    const mild = Array.from(normalDraws(200, 23, 0.01), (x, i) => (i % 15 === 0 ? 2 * x : x));
    const v = (await b.run("ROLLVAR", col(mild), W, 0.99, null, null, "cf")) as unknown[][];
    expect(cellProblems(v)).toEqual([]);
    let checked = 0;
    let refused = 0;
    for (let t = W; t < mild.length; t++) {
      const direct = b.call("CFVAR", col(mild.slice(t - W, t)), 0.99, null) as unknown[][];
      const err = b.errorOf(v[t][0]);
      if (b.errorOf(direct[0][0]) !== null) {
        expect(err?.message).toMatch(/domain of validity/);
        refused++;
      } else {
        expect(v[t][0]).toBe(direct[0][0]);
        checked++;
      }
    }
    expect({ checked: checked > 0, all: checked + refused }).toEqual({ checked: true, all: 200 - W });
  });

  test("normal and fhs: VaR below ES on every forecast row, PIT inside [0, 1]", async () => {
    for (const model of ["normal", "fhs"]) {
      const v = (await b.run("ROLLVAR", col(sim), W, 0.975, null, null, model)) as unknown[][];
      const e = (await b.run("ROLLES", col(sim), W, 0.975, null, null, model)) as unknown[][];
      const u = (await b.run("ROLLPIT", col(sim), W, 0.975, null, null, model)) as unknown[][];
      for (const out of [v, e, u]) expect(cellProblems(out)).toEqual([]);
      for (let t = W + 1; t < sim.length; t++) {
        if (sim[t] === null) continue;
        expect(`${model} row ${t}: ${(e[t][0] as number) > (v[t][0] as number)}`).toBe(`${model} row ${t}: true`);
        expect((u[t][0] as number) >= 0 && (u[t][0] as number) <= 1).toBe(true);
      }
    }
  });

  test("normal: a row equals −(μ + σ z) from the window's two-pass moments", async () => {
    const v = (await b.run("ROLLVAR", col(sim), W, 0.99, null, null, "normal")) as unknown[][];
    const m = moments(before(150));
    closeTo("normal row 150", v[150][0], -(m.mean + m.sd * normalQuantile(0.01)), 1e-12);
  });
});
