/**
 * Hosking's generalized normal (GNO) law, one file per quantity:
 * params.ts (GnoParams, isValidParams), reduced.ts (reduced variate y and its inverse), pdf.ts, cdf.ts,
 * quantile.ts, moments.ts, lmoments.ts, edge.ts, random.ts (seeded draws; re-exports uniformStream from
 * src/core/random.ts, the shared seeded uniform stream strictly inside (0, 1)).
 */
export type { GnoParams } from "./params";
export { isValidParams } from "./params";
export { reducedVariate, reducedQuantile } from "./reduced";
export { logPdf, pdf } from "./pdf";
export { cdf, sf, logCdf, logSf } from "./cdf";
export { quantile, quantileUpper } from "./quantile";
export type { GnoMoments } from "./moments";
export { moments } from "./moments";
export type { GnoLMoments } from "./lmoments";
export { lMoments, lRatios } from "./lmoments";
export type { EdgeSide, GnoEdge } from "./edge";
export { edge, inSupport } from "./edge";
export { sample, sampleSortedInto, sortedNormalsInto, sortNearlySorted, uniformStream } from "./random";
