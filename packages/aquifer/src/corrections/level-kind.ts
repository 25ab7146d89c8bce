/**
 * What a water-level number measures, and which way it moves when the water level falls.
 * Conventions (common practice, no source): depth to water is measured downwards from a fixed reference
 * point and grows when the level falls; drawdown (depth minus static depth) grows the same way; head
 * (level elevation) falls when the level falls.
 */

/** The three kinds of water-level numbers the corrections accept. */
export type WaterLevelKind = "depth-to-water" | "drawdown" | "head";

/** +1 when the number grows as the water level falls (depth to water, drawdown), -1 for head. */
export function fallSign(kind: WaterLevelKind): 1 | -1 {
  return kind === "head" ? -1 : 1;
}

/** True when `kind` is one of the accepted kinds. */
export function isWaterLevelKind(kind: string): kind is WaterLevelKind {
  return kind === "depth-to-water" || kind === "drawdown" || kind === "head";
}
