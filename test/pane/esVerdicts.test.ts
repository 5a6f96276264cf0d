/**
 * The pane's tail verdicts from core results on an invented, simulated series (seeded): outcomes follow the stated
 * p-value and zone rule, and every line exists for the tests that apply.
 */
import { backtestVar } from "../../src/core/risk/backtests/backtest";
import { shortfallZ, z2PValueMatchedTails } from "../../src/core/risk/backtests/shortfallZ";
import { exceedanceResiduals, exceedanceResidualTest } from "../../src/core/risk/backtests/exceedanceResiduals";
import { multinomialTest } from "../../src/core/risk/backtests/multinomial";
import { tailLikelihoodTest } from "../../src/core/risk/backtests/tailLikelihood";
import { shortfallTrafficLight } from "../../src/core/risk/backtests/shortfallLight";
import { uniformStream } from "../../src/core/random";
import { runToEnd } from "../../src/core/work";
import { outcomeOfP, outcomeOfZone, tailVerdicts } from "../../src/taskpane/esVerdicts";

function parts(T: number, tailStretch: number) {
  const next = uniformStream(17);
  const x: number[] = [];
  const v: number[] = [];
  const e: number[] = [];
  const pit: number[] = [];
  for (let t = 0; t < T; t++) {
    const u = next();
    // Laplace(0, 1) returns; tail beyond VaR stretched by `tailStretch` (1 = the forecast is right).
    const q = -Math.log(0.05);
    const base = u < 0.5 ? Math.log(2 * u) : -Math.log(2 * (1 - u));
    x.push(u < 0.025 ? -(q + tailStretch * (-base - q)) : base);
    v.push(q);
    e.push(q + 1);
    pit.push(u < 0.025 ? 0.5 * Math.exp(-(q + tailStretch * (-base - q))) : u);
  }
  const z = shortfallZ(x, v, e, 0.975)!;
  return {
    var: backtestVar(x, v, 0.975)!,
    es: {
      z,
      z2PValue: runToEnd(z2PValueMatchedTails(z.z2, v, e, 0.975, 999, 1)),
      residuals: runToEnd(exceedanceResidualTest(exceedanceResiduals(x, v, e).residuals, 199, 2)),
      pit: { multinomial: multinomialTest(pit, 0.975)!, tail: tailLikelihoodTest(pit, 0.975)!, light: shortfallTrafficLight(pit, 0.975)! },
    },
  };
}

describe("tail verdicts", () => {
  test("the stated rule: p < 1% fail, < 5% watch; zones green/yellow/amber/red", () => {
    expect([0.005, 0.01, 0.049, 0.05, NaN].map(outcomeOfP)).toEqual(["fail", "watch", "watch", "pass", "n/a"]);
    expect(["green", "yellow", "amber", "red", "?"].map(outcomeOfZone)).toEqual(["pass", "watch", "watch", "fail", "n/a"]);
  });
  test("correct forecasts on 2000 simulated days: no ES line fails; a tail three times as long fails Z2 and the PIT tests", () => {
    const ok = parts(2000, 1);
    const v = tailVerdicts(ok.var, ok.es);
    expect(v.length).toBe(9);
    expect(v.filter((x) => x.question.startsWith("Are tail") || x.question.startsWith("Is the tail")).map((x) => x.outcome)).not.toContain("fail");
    const bad = parts(2000, 3);
    const w = tailVerdicts(bad.var, bad.es);
    expect(w.find((x) => x.test === "Z2")!.outcome).toBe("fail");
    expect(w.find((x) => x.test === "Multinomial")!.outcome).toBe("fail");
    expect(w.find((x) => x.test === "Kupiec")!.outcome).toBe(tailVerdicts(ok.var, null).find((x) => x.test === "Kupiec")!.outcome);
  });
  test("without a PIT column the shape line says so", () => {
    const ok = parts(300, 1);
    const { pit: _omit, ...noPit } = ok.es;
    const v = tailVerdicts(null, noPit);
    expect(v.find((x) => x.test === "PIT tests")).toEqual({ question: "Is the tail beyond VaR shaped right?", test: "PIT tests", outcome: "n/a", detail: "no PIT column" });
  });
});
