/**
 * Typed view of the parts of jstat 1.9.6 the risk tests use as an outside reference (the package ships no
 * type declarations): the chi-square CDF (regularised lower incomplete gamma; accurate, DEVELOPERS.md).
 */
interface JStatRiskSubset {
  chisquare: { cdf(x: number, dof: number): number };
}
// eslint-disable-next-line @typescript-eslint/no-require-imports
export const jStat = (require("jstat") as { jStat: JStatRiskSubset }).jStat;
