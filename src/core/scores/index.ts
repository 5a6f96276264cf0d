/** Forecast scores: tick and FZ0 losses of VaR/ES columns, and the Diebold–Mariano test of equal mean loss. */
export { fz0Loss, scoreForecasts, tickLoss, type ForecastScores } from "./losses";
export { dieboldMariano, longRunVariance, neweyWestLag, type DieboldMarianoTest } from "./dieboldMariano";
