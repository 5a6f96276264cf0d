/**
 * Goodness of fit: KS (ks.ts) and AD (ad.ts) statistics and exact laws, statistics against any law
 * (statistics.ts), a chunked parametric bootstrap (bootstrap.ts) and the generalized-normal front ends (gno.ts).
 */
export * from "./ks";
export * from "./ad";
export * from "./statistics";
export * from "./bootstrap";
export * from "./gno";
