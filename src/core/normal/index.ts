/**
 * Normal kernels: erf/erfc (Cody 1969/1993, erfc.ts), φ (pdf.ts), Φ, 1 − Φ and ln Φ (cdf.ts),
 * Φ⁻¹ (Wichura 1988, AS 241 PPND16, quantile.ts). Pure functions on doubles, total on their domain.
 */
export { erf, erfc, erfcx } from "./erfc";
export { normalPdf } from "./pdf";
export { normalCdf, normalSf, logNormalCdf } from "./cdf";
export { normalQuantile, normalQuantileUpper } from "./quantile";
