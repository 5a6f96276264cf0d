/** Fitting engine for the generalized normal law: estimators, likelihood, optimizer, report, cache. */
export { fitGno, fitGnoWork, fitGnoQuick, startForMaximumLikelihood, subsampleStart, LARGE_SAMPLE, START_SUBSAMPLE } from "./fit";
export type { FitMethod, FitOptions, GnoFit, QuickFit, MomentSummary, EdgeDiagnostics, ParameterIntervals } from "./fit";
export { fitGnoCached, fitGnoCachedWork, rememberFit, clearFitCache, dataKey, sameContent, ContentCache, CACHE_SIZE, CACHE_MAX_NUMBERS } from "./cache";
export { logLikelihood, countOutsideSupport, likelihoodDerivatives, likelihoodDerivativesWork, PASS_CHUNK, fusedPassCount } from "./likelihood";
export { sampleMoments, sampleLMoments, sampleLMomentsSorted } from "./sampleStats";
export type { SampleMoments, SampleLMoments } from "./sampleStats";
export { estimateFromLMoments, shapeFromLSkewness, MAX_ABS_LSKEW } from "./lmomentEstimator";
export { SHAPE_CAP, HUG_FRACTION, SEARCH_WORK_BOUND, edgeHugsData, findMaximum, findMaximumWork } from "./maximise";
export { SlidingLMoments } from "./slidingLMoments";
export { slideStart } from "./slideStart";
export type { SlideFrom } from "./slideStart";
