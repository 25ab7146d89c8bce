/**
 * Drawdown from water-level readings. Definition (common practice, no source): drawdown is the fall of
 * the water level below its static (pre-pumping) level, positive when the level is lower.
 */

/**
 * Drawdown s = h0 - h from hydraulic heads h (water-level elevations, rising upwards) and the static
 * head h0. Heads and static head in one length unit; the result is in that unit.
 */
export function drawdownFromHead(heads: ArrayLike<number>, staticHead: number): Float64Array {
  const s = new Float64Array(heads.length);
  for (let i = 0; i < heads.length; i++) s[i] = staticHead - heads[i]!;
  return s;
}

/**
 * Drawdown s = d - d0 from depths to water d (measured downwards from a fixed reference point such as the
 * top of casing) and the static depth d0. Depths and static depth in one length unit; the result is in
 * that unit.
 */
export function drawdownFromDepthToWater(depths: ArrayLike<number>, staticDepth: number): Float64Array {
  const s = new Float64Array(depths.length);
  for (let i = 0; i < depths.length; i++) s[i] = depths[i]! - staticDepth;
  return s;
}
