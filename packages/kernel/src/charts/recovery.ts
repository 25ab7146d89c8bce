import { linearAxis, logAxis, pointRecords, positiveExtent, VEGA_LITE_SCHEMA } from "./log-axis.js";
import { straightLineRecords } from "./semilog-drawdown.js";

/** Input of the recovery plot: residual drawdown against t/t' (time since pumping started over time since it stopped). */
export interface RecoveryInput {
  timeRatio: ArrayLike<number>;
  residualDrawdown: ArrayLike<number>;
  /** Straight line s' = slope log10(t/t'), slope in length unit per log cycle (through t/t' = 1). */
  line?: { slope: number };
  lengthUnit?: string;
  title?: string;
}

/**
 * Theis recovery plot: residual drawdown against log(t/t'), where the late points fall on a line through
 * t/t' = 1 with slope 2.303 Q / (4 pi T) per log cycle (Theis 1935). Points with t/t' <= 0 are left out.
 */
export function recoveryChart(input: RecoveryInput): Record<string, unknown> {
  const points = pointRecords(input.timeRatio, input.residualDrawdown, ["timeRatio", "s"], [true, false], { series: "residual drawdown" });
  const extent = positiveExtent(points.map((p) => p.timeRatio as number), [1]);
  const x = { field: "timeRatio", type: "quantitative", ...logAxis("t / t' (1)", extent) };
  const y = { field: "s", type: "quantitative", ...linearAxis(`residual drawdown (${input.lengthUnit ?? "m"})`, true) };
  const color = { field: "series", type: "nominal", title: null };
  const layer: unknown[] = [{ data: { values: points }, mark: { type: "point", filled: true }, encoding: { x, y, color } }];
  if (input.line && extent) {
    layer.push({ data: { values: straightLineRecords(input.line.slope, 1, 1, extent[1], ["timeRatio", "s"]) }, mark: "line", encoding: { x, y, color } });
  }
  return { $schema: VEGA_LITE_SCHEMA, title: input.title ?? "Recovery", width: 480, height: 360, layer };
}
