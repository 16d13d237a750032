/** The results components: `ResultsView` for one run; chart pieces reused by the compare page. */
export { ResultsView, type ResultsRun } from "./results-view";
export { ConfidenceChart, cdfPoints, type Curve } from "./confidence-chart";
export { seriesStyle } from "./chart-style";
export { LineSwatch } from "./legend-swatch";
