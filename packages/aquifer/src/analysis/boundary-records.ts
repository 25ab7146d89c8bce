/**
 * Straight boundaries described from the pumping well as plain records { kind, distance, angle }: the distance to
 * the line and the direction (in degrees) from the well to it, the way a site plan is read.
 */
import { boundaryFromWell, type BoundaryKind, type Point, type StraightBoundary } from "../superposition/index.js";
import { AnalysisInputError } from "./errors.js";

/** A boundary seen from a well: its kind, perpendicular distance (m) and direction of the normal from the well. */
export interface BoundaryRecord {
  readonly kind: BoundaryKind;
  /** Perpendicular distance from the well to the line, m, > 0. */
  readonly distance: number;
  /** Direction from the well to the nearest point of the line, degrees counter-clockwise from the +x axis. */
  readonly angle: number;
}

/**
 * The boundaries as lines in the plane (boundaryFromWell), seen from `well` (m); angle in degrees, converted to rad
 * as angle × π/180.
 * @throws AnalysisInputError for a record that is not { kind, distance, angle }; SuperpositionInputError from
 *   boundaryFromWell for a bad kind, distance or angle.
 */
export function boundariesFromRecords(well: Point, records: readonly BoundaryRecord[]): StraightBoundary[] {
  if (!Array.isArray(records)) throw new AnalysisInputError("boundariesFromRecords: boundaries must be a list of { kind, distance, angle }.");
  return records.map((b, i) => {
    if (!b || typeof b !== "object") throw new AnalysisInputError(`boundariesFromRecords: boundary ${i} must be { kind, distance (m), angle (degrees) }.`);
    return boundaryFromWell(b.kind, well, b.distance, (b.angle * Math.PI) / 180);
  });
}
