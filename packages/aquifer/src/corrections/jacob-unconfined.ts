/**
 * Jacob (1944) correction of drawdown in an unconfined aquifer for the decrease of saturated thickness:
 *
 *   s' = s - s^2 / (2 b),
 *
 * b the initial saturated thickness, s the observed drawdown, s' the drawdown a confined aquifer of
 * thickness b would show; s' may then be analysed with confined-aquifer methods (after delayed yield has
 * ended). The identity s - s^2/(2b) = (b^2 - h^2)/(2b) with h = b - s shows where it comes from.
 * Source: Jacob, C.E. (1944). Notes on determining permeability by pumping tests under water-table
 * conditions. U.S. Geological Survey, mimeographed report (from memory).
 */
import { convert, requireDimension } from "../units/index.js";
import { CorrectionError, formatNumber, requireFinite } from "./record.js";
import type { CorrectionResult } from "./record.js";

/** The citation is from memory (not checked against the report itself). */
const JACOB_1944 =
  "Jacob, C.E. (1944). Notes on determining permeability by pumping tests under water-table conditions. U.S. Geological Survey, mimeographed report.";

/** Drawdown beyond which the correction is flagged, as a fraction of b (common practice, no source). */
export const JACOB_WARNING_FRACTION = 0.25;

/** Options of `correctJacobUnconfined`. */
export interface JacobUnconfinedOptions {
  /** Observed drawdowns, in lengthUnit. */
  readonly drawdowns: ArrayLike<number>;
  readonly lengthUnit: string;
  /** Initial saturated thickness b of the aquifer, > 0, in any length unit. */
  readonly saturatedThickness: { readonly value: number; readonly unit: string };
}

/**
 * Corrected drawdowns s' = s - s²/(2b) in lengthUnit (Jacob 1944). Warns (in record.warnings) when any
 * s > 0.25 b (common practice, no source).
 * @throws CorrectionError when b <= 0, a drawdown is not finite, or any s >= b (the aquifer would be
 *   dewatered at the observation point and the correction has no meaning).
 */
export function correctJacobUnconfined(options: JacobUnconfinedOptions): CorrectionResult {
  requireDimension(options.lengthUnit, "length", "the drawdowns");
  requireDimension(options.saturatedThickness.unit, "length", "the saturated thickness");
  requireFinite(options.drawdowns, "drawdowns");
  const b = convert(options.saturatedThickness.value, options.saturatedThickness.unit, options.lengthUnit);
  if (!(b > 0) || !Number.isFinite(b)) {
    throw new CorrectionError(
      `saturated thickness is ${options.saturatedThickness.value} ${options.saturatedThickness.unit}; give the initial saturated thickness, > 0`,
    );
  }
  const values = new Float64Array(options.drawdowns.length);
  let over = 0;
  let firstOver = -1;
  let largest = -Infinity;
  for (let i = 0; i < values.length; i++) {
    const s = options.drawdowns[i]!;
    if (s >= b) {
      throw new CorrectionError(
        `drawdowns[${i}] = ${formatNumber(s)} ${options.lengthUnit} is not less than the saturated thickness b = ${formatNumber(b)} ${options.lengthUnit}: ` +
          `the aquifer would be dewatered at the observation point and s - s²/(2b) has no meaning there; check b and the drawdowns, or leave these readings out`,
      );
    }
    if (s > JACOB_WARNING_FRACTION * b) {
      over++;
      if (firstOver < 0) firstOver = i;
    }
    largest = Math.max(largest, s);
    values[i] = s - (s * s) / (2 * b);
  }
  const warnings: string[] = [];
  if (over > 0) {
    warnings.push(
      `${over} drawdowns exceed ${JACOB_WARNING_FRACTION} b = ${formatNumber(JACOB_WARNING_FRACTION * b)} ${options.lengthUnit} ` +
        `(first at index ${firstOver}); at such drawdowns vertical flow near the well makes the correction unreliable ` +
        `(limit: common practice, no source): treat results with caution or use a model for unconfined flow`,
    );
  }
  return {
    values,
    record: {
      method: "Jacob (1944) unconfined drawdown correction",
      source: JACOB_1944,
      parameters: {
        saturatedThickness: { value: b, unit: options.lengthUnit },
        warningFraction: JACOB_WARNING_FRACTION,
        readingsAboveWarningFraction: over,
      },
      summary:
        `s' = s - s²/(2b) with b = ${formatNumber(b)} ${options.lengthUnit} applied to ${values.length} drawdowns; ` +
        `largest drawdown ${values.length > 0 ? formatNumber(largest) : "none"} ${options.lengthUnit} (${values.length > 0 ? formatNumber((100 * largest) / b) : 0} % of b).`,
      warnings,
    },
  };
}
