import { linearAxis, logAxis, pointRecords, positiveExtent, VEGA_LITE_SCHEMA } from "./log-axis.js";

/** Input of the residual plot: observed minus modelled drawdown at each time. */
export interface ResidualsInput {
  t: ArrayLike<number>;
  residual: ArrayLike<number>;
  timeUnit?: string;
  lengthUnit?: string;
  title?: string;
}

/**
 * Residuals (observed - modelled drawdown) against log time with a zero line; a trend in them shows a model
 * that does not fit (common practice, no source). Points with t <= 0 are left out.
 */
export function residualsChart(input: ResidualsInput): Record<string, unknown> {
  const points = pointRecords(input.t, input.residual, ["t", "residual"], [true, false]);
  const x = { field: "t", type: "quantitative", ...logAxis(`time (${input.timeUnit ?? "d"})`, positiveExtent(points.map((p) => p.t as number))) };
  const y = { field: "residual", type: "quantitative", ...linearAxis(`residual (${input.lengthUnit ?? "m"})`, true) };
  return {
    $schema: VEGA_LITE_SCHEMA,
    title: input.title ?? "Residuals",
    width: 480,
    height: 240,
    layer: [
      { data: { values: points }, mark: { type: "point", filled: true }, encoding: { x, y } },
      { data: { values: [{ zero: 0 }] }, mark: { type: "rule", strokeDash: [4, 4] }, encoding: { y: { field: "zero", type: "quantitative" } } },
    ],
  };
}
