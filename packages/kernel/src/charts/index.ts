/** Vega-Lite spec builders for the standard aquifer-test plots: pure functions of plain data. */
export { DECADE_TEST, ChartInputError, decadeDomain, logAxis, logTickValues, positiveExtent, VEGA_LITE_SCHEMA } from "./log-axis.js";
export { logLogDrawdownChart, type LogLogDrawdownInput } from "./loglog-drawdown.js";
export { semilogDrawdownChart, type SemilogDrawdownInput } from "./semilog-drawdown.js";
export { residualsChart, type ResidualsInput } from "./residuals.js";
export { recoveryChart, type RecoveryInput } from "./recovery.js";
export { distanceDrawdownChart, type DistanceDrawdownInput } from "./distance-drawdown.js";
export { stepTestChart, type StepTestInput } from "./step-test.js";
export { specialisedPlotChart, type SpecialisedPlotInput } from "./specialised-plot.js";
export { slugResponseChart, type SlugResponseInput } from "./slug-response.js";
export { anisotropyEllipseChart, type AnisotropyEllipseInput } from "./anisotropy-ellipse.js";
export { curvesChart, type CurveSeries, type CurvesInput } from "./curves.js";
