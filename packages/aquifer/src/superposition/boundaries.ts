/**
 * Straight aquifer boundaries and their image wells.
 *
 * A boundary is a straight line x cos(theta) + y sin(theta) = c in the aquifer plane (m); its unit normal
 * n = (cos theta, sin theta) points out of the aquifer, so the aquifer is the side n . x < c.
 *
 * Method of images (Ferris, Knowles, Brown and Stallman 1962, USGS Water-Supply Paper 1536-E): the boundary is
 * replaced by a well at the mirror image of the real well in an infinite aquifer, pumping by the same schedule.
 *   - constant head (recharge boundary, e.g. a fully penetrating river): drawdown is 0 on the line, so the image
 *     injects (sign -1);
 *   - no flow (barrier, e.g. an impermeable fault): the normal gradient is 0 on the line, so the image pumps
 *     (sign +1).
 * With several boundaries the images are themselves reflected. Every image is the real well moved by a product
 * of reflections g = R_a R_b ... R_z; its sign is the product of the signs of those reflections
 * chi(g) = sigma_a sigma_b ... sigma_z. The image set is finite and exact only when the reflections generate a
 * finite group and chi is well defined on it:
 *   - one line: one image;
 *   - two lines meeting at interior angle pi/n (n = 2, 3, ...): the dihedral group of order 2n, so 2n - 1 images.
 *     chi must satisfy (sigma_1 sigma_2)^n = 1 because (R_1 R_2)^n = identity: boundaries of one kind work for
 *     every n, mixed kinds only for even n (90 deg, 45 deg, 30 deg, ...). For odd n the two reflections are
 *     conjugate and the image opposite the real well would need both signs.
 *   - two parallel lines (a strip of width a): the infinite dihedral group; the images lie in two chains,
 *     P -> R_1 P -> R_2 R_1 P -> ... and P -> R_2 P -> R_1 R_2 P -> ..., image m of each chain about m a farther
 *     away, its sign the product of the m reflection signs. Any mix of kinds is exact; the series is truncated.
 *   - three or four lines in two mutually perpendicular families (a strip closed at one end, a rectangle): each
 *     family is one line or two facing parallel lines. Reflections across perpendicular lines commute, so the
 *     group is the direct product G_A x G_B and every image is g_a g_b P with sign chi_A(g_a) chi_B(g_b); any mix
 *     of kinds is exact, since (R_a R_b)^2 = 1 puts no condition on the signs. The double series is truncated.
 * Source for the wedge and strip image systems: Ferris et al. (1962); the group-theoretic sign condition is
 * derived here from the relation above.
 */
import { SuperpositionInputError } from "./errors.js";
import { isFinitePoint, type Point } from "./plane.js";

/** Kind of straight boundary: constant head (recharge, image sign -1) or no flow (barrier, image sign +1). */
export type BoundaryKind = "constant-head" | "no-flow";

/** A straight boundary: the line x cos(normalAngle) + y sin(normalAngle) = offset (m), normal pointing out of the aquifer. */
export interface StraightBoundary {
  readonly kind: BoundaryKind;
  /** Direction of the outward unit normal, rad counter-clockwise from the +x axis. */
  readonly normalAngle: number;
  /** Signed distance of the line from the origin along the normal, m. */
  readonly offset: number;
}

/** An image well: position (m), sign (+1 pumps like the real well, -1 injects) and number of reflections. */
export interface ImageWell extends Point {
  readonly sign: 1 | -1;
  readonly order: number;
}

/** How the image set of a boundary configuration is organised. */
export type ImageLayout =
  | { readonly kind: "none" }
  | { readonly kind: "finite"; readonly description: string; readonly images: readonly ImageWell[] }
  | { readonly kind: "series"; readonly description: string; readonly families: readonly BoundaryFamily[] };

/**
 * Parallel boundaries of one direction: one line, or two facing lines (a strip). In a "series" layout there are
 * one or two families, mutually perpendicular, and at least one of them is a strip.
 */
export interface BoundaryFamily {
  readonly lines: readonly StraightBoundary[];
}

const DEGREE = 180 / Math.PI;

/**
 * The boundary at perpendicular distance `distance` (m, > 0) from the pumping well `well`, in the direction
 * `normalAngle` (rad counter-clockwise from +x, pointing from the well towards the line).
 */
export function boundaryFromWell(kind: BoundaryKind, well: Point, distance: number, normalAngle: number): StraightBoundary {
  const where = "boundaryFromWell";
  checkKind(where, kind);
  if (!isFinitePoint(well)) throw new SuperpositionInputError(`${where}: the well position must have finite x and y (m).`);
  if (!(Number.isFinite(distance) && distance > 0)) {
    throw new SuperpositionInputError(`${where}: distance ${distance} m from the well to the boundary must be finite and > 0.`);
  }
  if (!Number.isFinite(normalAngle)) throw new SuperpositionInputError(`${where}: normalAngle is ${normalAngle}; give a finite angle in rad.`);
  return { kind, normalAngle, offset: well.x * Math.cos(normalAngle) + well.y * Math.sin(normalAngle) + distance };
}

function checkKind(where: string, kind: unknown): void {
  if (kind !== "constant-head" && kind !== "no-flow") {
    throw new SuperpositionInputError(`${where}: boundary kind is ${JSON.stringify(kind)}; use "constant-head" (recharge) or "no-flow" (barrier).`);
  }
}

/** Image sign of a boundary kind: -1 for constant head, +1 for no flow. */
export function imageSign(kind: BoundaryKind): 1 | -1 {
  return kind === "constant-head" ? -1 : 1;
}

/** Signed distance of p from the line, m: negative on the aquifer side, 0 on the line. */
export function sideOf(b: StraightBoundary, p: Point): number {
  return p.x * Math.cos(b.normalAngle) + p.y * Math.sin(b.normalAngle) - b.offset;
}

/** Mirror image of p in the line. */
export function reflect(b: StraightBoundary, p: Point): Point {
  const d = sideOf(b, p);
  return { x: p.x - 2 * d * Math.cos(b.normalAngle), y: p.y - 2 * d * Math.sin(b.normalAngle) };
}

/** Checks the boundary list and that each point lies in the aquifer (strictly inside for pumping wells). */
export function checkBoundaries(
  where: string,
  boundaries: readonly StraightBoundary[],
  pumping: readonly { readonly name: string; readonly point: Point }[],
  observations: readonly { readonly name: string; readonly point: Point }[],
): void {
  if (boundaries.length > 4) {
    throw new SuperpositionInputError(
      `${where}: ${boundaries.length} boundaries given; the image method is exact here for one boundary, a strip, a wedge of ` +
        "180/n degrees, or three or four boundaries at right angles (a strip closed at one end, a rectangle). Keep the boundaries that matter most.",
    );
  }
  boundaries.forEach((b, i) => {
    checkKind(`${where}: boundary ${i}`, b?.kind);
    if (!Number.isFinite(b.normalAngle) || !Number.isFinite(b.offset)) {
      throw new SuperpositionInputError(`${where}: boundary ${i} needs a finite normalAngle (rad) and offset (m).`);
    }
    for (const w of pumping) {
      const d = sideOf(b, w.point);
      if (!(d < 0)) {
        throw new SuperpositionInputError(
          `${where}: pumping well "${w.name}" is ${d === 0 ? "on" : `${d.toPrecision(4)} m outside`} boundary ${i} (${b.kind}); ` +
            "pumping wells must lie inside the aquifer, on the side the normal points away from.",
        );
      }
    }
    for (const o of observations) {
      const d = sideOf(b, o.point);
      const scale = Math.max(1, Math.abs(b.offset), Math.hypot(o.point.x, o.point.y));
      if (d > 1e-9 * scale) {
        throw new SuperpositionInputError(
          `${where}: observation point "${o.name}" is ${d.toPrecision(4)} m outside boundary ${i} (${b.kind}); it must lie in the aquifer or on the boundary.`,
        );
      }
    }
  });
}

/**
 * Interior angle (rad) of the wedge between two boundaries with outward normals at angles a1, a2, and the
 * relation of the lines: "parallel-opposite" (a strip), "parallel-same" (one hides the other) or "intersecting".
 */
function relation(b1: StraightBoundary, b2: StraightBoundary): { kind: "intersecting" | "parallel-opposite" | "parallel-same"; angle: number } {
  const cross = Math.sin(b2.normalAngle - b1.normalAngle);
  const dot = Math.cos(b2.normalAngle - b1.normalAngle);
  if (Math.abs(cross) < 1e-12) return { kind: dot > 0 ? "parallel-same" : "parallel-opposite", angle: 0 };
  return { kind: "intersecting", angle: Math.PI - Math.acos(Math.max(-1, Math.min(1, dot))) };
}

/**
 * For two intersecting boundaries, n with interior angle pi/n, or a message explaining the refusal.
 * Accepts angles within 1e-6 relative of pi/n.
 */
export function wedgeOrder(b1: StraightBoundary, b2: StraightBoundary): { n: number } | { error: string } {
  const rel = relation(b1, b2);
  if (rel.kind !== "intersecting") return { error: "the boundaries are parallel" };
  const ratio = Math.PI / rel.angle;
  const n = Math.round(ratio);
  if (n < 2 || Math.abs(ratio - n) > 1e-6 * n) {
    return {
      error:
        `the boundaries meet at ${(rel.angle * DEGREE).toFixed(4)} degrees; images give an exact solution only for angles of 180/n degrees ` +
        "(90, 60, 45, 36, 30, ...). Adjust the boundary directions to the nearest such angle if that is defensible, or use a numerical model.",
    };
  }
  if (b1.kind !== b2.kind && n % 2 === 1) {
    return {
      error:
        `a ${b1.kind} and a ${b2.kind} boundary meet at ${(rel.angle * DEGREE).toFixed(4)} degrees (180/${n}); with mixed kinds the image ` +
        "system is consistent only for 180/n with n even (90, 45, 30, ... degrees), because the image opposite the well would need both signs.",
    };
  }
  return { n };
}

function samePlace(a: Point, b: Point, scale: number): boolean {
  return Math.hypot(a.x - b.x, a.y - b.y) <= 1e-9 * scale;
}

/**
 * The image system of the boundaries for a real well at `well`: none, finite (one line or a wedge of angle
 * pi/n) or a strip series. Throws SuperpositionInputError for configurations without an exact image system.
 */
export function imageLayout(where: string, well: Point, boundaries: readonly StraightBoundary[]): ImageLayout {
  if (boundaries.length === 0) return { kind: "none" };
  if (boundaries.length > 2) return rectangularLayout(where, boundaries);
  if (boundaries.length === 1) {
    const b = boundaries[0]!;
    const p = reflect(b, well);
    return { kind: "finite", description: `one ${b.kind} boundary: 1 image`, images: [{ ...p, sign: imageSign(b.kind), order: 1 }] };
  }
  const [b1, b2] = boundaries as readonly [StraightBoundary, StraightBoundary];
  const rel = relation(b1, b2);
  if (rel.kind === "parallel-same") {
    throw new SuperpositionInputError(
      `${where}: boundaries 0 and 1 are parallel with the aquifer on the same side of both, so the nearer one hides the farther; drop the farther one.`,
    );
  }
  if (rel.kind === "parallel-opposite") {
    const width = b1.offset + b2.offset;
    return {
      kind: "series",
      description: `strip of width ${Number(width.toPrecision(6))} m between a ${b1.kind} and a ${b2.kind} boundary`,
      families: [{ lines: [b1, b2] }],
    };
  }
  const order = wedgeOrder(b1, b2);
  if ("error" in order) throw new SuperpositionInputError(`${where}: ${order.error}`);
  const scale = Math.max(1, Math.hypot(well.x, well.y), Math.abs(b1.offset), Math.abs(b2.offset));
  const found: ImageWell[] = [{ ...well, sign: 1, order: 0 }];
  const queue: ImageWell[] = [found[0]!];
  while (queue.length > 0) {
    const current = queue.shift()!;
    for (const b of boundaries) {
      const p = reflect(b, current);
      const sign = (current.sign * imageSign(b.kind)) as 1 | -1;
      const existing = found.find((f) => samePlace(f, p, scale));
      if (existing) {
        if (existing.sign !== sign) {
          throw new SuperpositionInputError(`${where}: the image system is inconsistent (an image would need both signs); check the boundary kinds and angle.`);
        }
        continue;
      }
      const image: ImageWell = { ...p, sign, order: current.order + 1 };
      found.push(image);
      queue.push(image);
      if (found.length > 2 * order.n) {
        throw new SuperpositionInputError(`${where}: more than ${2 * order.n - 1} images arose for a wedge of 180/${order.n} degrees; the boundary angle is not exact.`);
      }
    }
  }
  return {
    kind: "finite",
    description: `wedge of 180/${order.n} degrees between a ${b1.kind} and a ${b2.kind} boundary: ${found.length - 1} images`,
    images: found.slice(1),
  };
}

/** Layout of three or four boundaries in two perpendicular families, or an error saying why not. */
function rectangularLayout(where: string, boundaries: readonly StraightBoundary[]): ImageLayout {
  const families: StraightBoundary[][] = [];
  for (const b of boundaries) {
    const family = families.find((f) => Math.abs(Math.sin(b.normalAngle - f[0]!.normalAngle)) < 1e-12);
    if (family) family.push(b);
    else families.push([b]);
  }
  const refuse = (why: string): never => {
    throw new SuperpositionInputError(
      `${where}: ${boundaries.length} boundaries ${why}; with three or four boundaries the image method is exact only for two perpendicular ` +
        "directions, each with one line or two facing lines (a strip closed at one end, a rectangle).",
    );
  };
  if (families.length !== 2) refuse(`run in ${families.length} different directions`);
  const [A, B] = families as [StraightBoundary[], StraightBoundary[]];
  if (Math.abs(Math.cos(A[0]!.normalAngle - B[0]!.normalAngle)) > 1e-12) {
    const angle = (Math.acos(Math.abs(Math.cos(A[0]!.normalAngle - B[0]!.normalAngle))) * 180) / Math.PI;
    refuse(`meet at ${angle.toFixed(4)} degrees, not 90`);
  }
  for (const f of [A, B]) {
    if (f.length > 2) refuse("include more than two parallel lines");
    if (f.length === 2 && Math.cos(f[1]!.normalAngle - f[0]!.normalAngle) > 0) {
      refuse("include two parallel lines with the aquifer on the same side (the nearer hides the farther)");
    }
  }
  const describe = (f: StraightBoundary[]) =>
    f.length === 1 ? `a ${f[0]!.kind} line` : `a strip of width ${Number((f[0]!.offset + f[1]!.offset).toPrecision(6))} m (${f[0]!.kind}, ${f[1]!.kind})`;
  return {
    kind: "series",
    description: `${describe(A)} closed at right angles by ${describe(B)}`,
    families: [{ lines: A }, { lines: B }],
  };
}

/**
 * The images of order m >= 1 of a family of parallel lines, from those of order m - 1 (`previous`; for m = 1 the
 * real well alone). One line: its mirror image at order 1, none after. Two lines: chain c (c = 0, 1) starts by
 * reflecting in line c and then alternates, so order m holds two images.
 */
export function nextFamilyImages(family: BoundaryFamily, m: number, previous: readonly ImageWell[]): ImageWell[] {
  const lines = family.lines;
  if (lines.length === 1) {
    if (m > 1) return [];
    const b = lines[0]!;
    return [{ ...reflect(b, previous[0]!), sign: (previous[0]!.sign * imageSign(b.kind)) as 1 | -1, order: 1 }];
  }
  return [0, 1].map((c) => {
    const from = m === 1 ? previous[0]! : previous[c]!;
    const b = lines[(c + m - 1) % 2]!;
    return { ...reflect(b, from), sign: (from.sign * imageSign(b.kind)) as 1 | -1, order: m };
  });
}
