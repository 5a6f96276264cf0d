/**
 * Sharing the shape profile between a warm attempt and the cold search on the same sample (ProfileMemo) returns
 * exactly what two independent searches return: same end point, same regularity, same reason. Data: seeded
 * simulated 10-point windows (an invented scenario), where maximum likelihood is often irregular; the check is
 * against the same search run without the memo.
 */
import { sample } from "../../../src/core/gno";
import { fitGnoQuick, sampleMoments } from "../../../src/core/fit";
import { findMaximum, type ProfileMemo } from "../../../src/core/fit/maximise";

const x = sample({ location: 0.0004, scale: 0.011, shape: -0.12 }, 900, 2031);

function strip(r: ReturnType<typeof findMaximum>) {
  return { p: [r.result.location, r.result.scale, r.result.shape, r.result.value], regular: r.regular, reason: r.reason, usedProfile: r.usedProfile };
}

test("warm then cold with one memo = warm and cold searched separately, on every 10-point window", () => {
  let prev = fitGnoQuick(x.subarray(0, 10)).params;
  let profiled = 0;
  let irregular = 0;
  for (let j = 11; j < x.length; j++) {
    const w = x.subarray(j - 10, j);
    const s = sampleMoments(w);
    const cold = fitGnoQuick(w, { method: "lmom" }).params;
    const memo: ProfileMemo = {};
    const warmShared = findMaximum(w, s, prev, 1e-6, memo);
    const coldShared = findMaximum(w, s, cold, undefined, memo);
    const warmAlone = findMaximum(w, s, prev, 1e-6);
    const coldAlone = findMaximum(w, s, cold);
    if (warmAlone.usedProfile) profiled++;
    if (!coldAlone.regular) irregular++;
    const got = { warm: strip(warmShared), cold: strip(coldShared) };
    const want = { warm: strip(warmAlone), cold: strip(coldAlone) };
    if (JSON.stringify(got) !== JSON.stringify(want)) throw new Error(`window ending ${j}: got ${JSON.stringify(got)}, want ${JSON.stringify(want)}`);
    const f = fitGnoQuick(w, { start: prev, oneStepGain: 1e-6 });
    if (f.converged) prev = f.params;
  }
  // the memo was exercised: some windows needed the profile, some had no regular maximum
  expect(profiled).toBeGreaterThan(5);
  expect(irregular).toBeGreaterThan(5);
});
