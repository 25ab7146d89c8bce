/** Points in the horizontal plane of the aquifer, coordinates in m. */

/** A point in the aquifer plane: x and y in m (any local grid, e.g. site coordinates). */
export interface Point {
  readonly x: number;
  readonly y: number;
}

/** A point with a name, e.g. an observation well. */
export interface NamedPoint extends Point {
  readonly name: string;
}

/** Euclidean distance between two points, m. */
export function distanceBetween(a: Point, b: Point): number {
  return Math.hypot(a.x - b.x, a.y - b.y);
}

/** True when x and y are finite numbers. */
export function isFinitePoint(p: Point | undefined): boolean {
  return p !== undefined && p !== null && Number.isFinite(p.x) && Number.isFinite(p.y);
}
