/**
 * Risk-layer benchmark: rolling out-of-sample VaR over 2,500 windows of 250 returns, every maximum-likelihood
 * fit warm-started from the previous window's solution vs every window fitted cold, measured side by side in
 * one run. Data: an invented, simulated scenario (GNO draws, ξ = 0.0004, α = 0.011, k = 0.15, seed 2024).
 * Prints times and the warm/cold ratio (target ≤ 0.3); nothing is asserted.
 */
import { sample } from "../src/core/gno";
import { rollingVar } from "../src/core/risk";

export function run(print: (line: string) => void): void {
  const window = 250;
  const windows = 2500;
  const returns = sample({ location: 0.0004, scale: 0.011, shape: 0.15 }, window + windows, 2024);
  rollingVar(returns.subarray(0, window + 50), window, 0.99); // warm-up of the JIT
  rollingVar(returns.subarray(0, window + 50), window, 0.99, { warmStart: false });
  const t0 = performance.now();
  const warm = rollingVar(returns, window, 0.99);
  const t1 = performance.now();
  const cold = rollingVar(returns, window, 0.99, { warmStart: false });
  const t2 = performance.now();
  let maxDiff = 0;
  for (let i = 0; i < returns.length; i++) {
    const a = warm.values[i];
    const b = cold.values[i];
    if (Number.isFinite(a) && Number.isFinite(b)) maxDiff = Math.max(maxDiff, Math.abs(a - b) / Math.abs(b));
  }
  print(`risk: rolling VaR, ${windows} windows × ${window}`);
  print(`  warm-started: ${(t1 - t0).toFixed(0)} ms, ${warm.iterations} iterations, ${warm.unconverged} unconverged`);
  print(`  cold:         ${(t2 - t1).toFixed(0)} ms, ${cold.iterations} iterations, ${cold.unconverged} unconverged`);
  print(`  warm/cold time ratio: ${((t1 - t0) / (t2 - t1)).toFixed(3)} (target ≤ 0.3); max relative VaR difference ${maxDiff.toExponential(2)}`);
}

if (require.main === module) run(console.log);
