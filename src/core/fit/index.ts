/** Fitting engine for the generalized normal law: estimators, likelihood, optimizer, report, cache. */
export { fitGno, fitGnoQuick, startForMaximumLikelihood, subsampleStart, LARGE_SAMPLE, START_SUBSAMPLE } from "./fit";
export type { FitMethod, FitOptions, GnoFit, QuickFit, MomentSummary, EdgeDiagnostics, ParameterIntervals } from "./fit";
export { fitGnoCached, clearFitCache, dataKey, sameContent, ContentCache, CACHE_SIZE, CACHE_MAX_NUMBERS } from "./cache";
export { logLikelihood, countOutsideSupport, likelihoodDerivatives, fusedPassCount } from "./likelihood";
export { sampleMoments, sampleLMoments, sampleLMomentsSorted } from "./sampleStats";
export type { SampleMoments, SampleLMoments } from "./sampleStats";
export { estimateFromLMoments, shapeFromLSkewness, MAX_ABS_LSKEW } from "./lmomentEstimator";
export { SHAPE_CAP, HUG_FRACTION, edgeHugsData } from "./maximise";
export { SlidingLMoments } from "./slidingLMoments";
