/**
 * Runs bench/lib/scipy_side.py on numbers written by the TypeScript side, so both sides time the very same data.
 * Returns null (and the bench prints "skipped") when python3 or scipy is not installed: the bench never needs them.
 */
import { spawnSync } from "node:child_process";
import * as fs from "node:fs";
import * as os from "node:os";
import * as path from "node:path";

let available: boolean | undefined;

/** scipy's version when python3 with scipy can be run here, else null. */
export function scipyVersion(): string | null {
  const r = spawnSync("python3", ["-c", "import scipy; print(scipy.__version__)"], { encoding: "utf8" });
  available = r.status === 0;
  return available ? r.stdout.trim() : null;
}

/** Runs one workload on `data`; the parsed JSON the script prints, or null when scipy is absent or failed. */
export function scipyRun<T = Record<string, unknown>>(workload: string, data: Float64Array, ...args: (string | number)[]): T | null {
  if (available === undefined) scipyVersion();
  if (!available) return null;
  const file = path.join(os.tmpdir(), `askew-bench-${process.pid}-${workload}.f64`);
  fs.writeFileSync(file, Buffer.from(data.buffer, data.byteOffset, data.byteLength));
  try {
    const r = spawnSync("python3", [path.join(__dirname, "scipy_side.py"), workload, file, ...args.map(String)], {
      encoding: "utf8",
      maxBuffer: 1 << 24,
    });
    if (r.status !== 0) {
      console.error(r.stderr);
      return null;
    }
    return JSON.parse(r.stdout) as T;
  } finally {
    fs.rmSync(file, { force: true });
  }
}
