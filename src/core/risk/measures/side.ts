/**
 * Which tail a risk figure looks at. "long": a holder of the asset loses when returns fall, so the loss tail
 * is the left tail of returns. "short": the loss tail is the right tail.
 */
export type RiskSide = "long" | "short";

export const RISK_SIDES: readonly RiskSide[] = ["long", "short"];
