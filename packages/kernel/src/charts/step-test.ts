import { ChartInputError, linearAxis, VEGA_LITE_SCHEMA } from "./log-axis.js";

/** Input of the step-test plot: the rate and the drawdown in the pumped well at the end of each step. */
export interface StepTestInput {
  Q: ArrayLike<number>;
  sw: ArrayLike<number>;
  /** Line sw/Q = B + C Q: B in (length unit)/(rate unit), C in (length unit)/(rate unit)^2. */
  line?: { B: number; C: number };
  rateUnit?: string;
  lengthUnit?: string;
  title?: string;
}

/**
 * Step-drawdown plot of specific drawdown sw/Q against Q, on which sw = B Q + C Q^2 is the straight line
 * sw/Q = B + C Q (Jacob 1947: B aquifer loss, C well loss). Steps with Q = 0 or non-finite values are left out.
 */
export function stepTestChart(input: StepTestInput): Record<string, unknown> {
  if (input.Q.length !== input.sw.length) {
    throw new ChartInputError(`Q has ${input.Q.length} values but sw has ${input.sw.length}; give one drawdown per step`);
  }
  const ru = input.rateUnit ?? "m3/d";
  const lu = input.lengthUnit ?? "m";
  const points: Record<string, number | string>[] = [];
  for (let i = 0; i < input.Q.length; i++) {
    const q = input.Q[i]!;
    const s = input.sw[i]!;
    if (Number.isFinite(q) && Number.isFinite(s) && q !== 0) points.push({ Q: q, specific: s / q, series: "steps" });
  }
  const x = { field: "Q", type: "quantitative", ...linearAxis(`pumping rate (${ru})`, true) };
  const y = { field: "specific", type: "quantitative", ...linearAxis(`specific drawdown sw/Q (${lu}/(${ru}))`, true) };
  const color = { field: "series", type: "nominal", title: null };
  const layer: unknown[] = [{ data: { values: points }, mark: { type: "point", filled: true }, encoding: { x, y, color } }];
  if (input.line && points.length) {
    const qMax = Math.max(...points.map((p) => p.Q as number));
    const values = [0, qMax].map((q) => ({ Q: q, specific: input.line!.B + input.line!.C * q, series: "B + C Q" }));
    layer.push({ data: { values }, mark: "line", encoding: { x, y, color } });
  }
  return { $schema: VEGA_LITE_SCHEMA, title: input.title ?? "Step-drawdown test", width: 480, height: 360, layer };
}
