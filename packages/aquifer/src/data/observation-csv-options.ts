/**
 * Options of the observation CSV importer, and the result it returns.
 */

import type { CsvSeparator } from "./csv-records.js";
import type { ObservationSeries, PumpingRate, ValueWithUnit } from "./series.js";

/** What a value column holds: drawdown, hydraulic head (level elevation) or depth to water. */
export type LevelKind = "drawdown" | "head" | "depth-to-water";

/** How a time column is written: elapsed time since pumping started, or ISO 8601 timestamps. */
export type TimeFormat = "elapsed" | "timestamp";

/** What to do with a problem that has a safe remedy: refuse the file, or apply the remedy and report it. */
export type RowPolicy = "refuse" | "exclude";

/** Options of `parseObservationCsv`. Units are unit strings of the units module. */
export interface ObservationCsvOptions {
  /** Id of the observation point; defaults to the value column's header. */
  readonly name?: string;
  /** Header of the time column (matched exactly after trimming spaces, else ignoring case). */
  readonly timeColumn: string;
  /** Header of the level column (drawdown, head or depth to water). */
  readonly valueColumn: string;
  /** "elapsed" (default): numbers in timeUnit since pumping started; "timestamp": ISO 8601 date-times. */
  readonly timeFormat?: TimeFormat;
  /**
   * For elapsed times: the unit of the time column (required). For timestamps: the unit the series'
   * elapsed times are expressed in (default "min"). Schedule step starts are in this unit too.
   */
  readonly timeUnit?: string;
  /** For timestamps: when pumping started, an ISO 8601 date-time such as "2026-03-04T08:00:00+01:00". */
  readonly pumpingStart?: string;
  /**
   * For timestamps written without an offset (a local clock reading): the UTC offset of that clock, "Z" or
   * "±hh:mm". Required when any timestamp, pumpingStart included, has no offset; the host's time zone is
   * never used.
   */
  readonly assumedUtcOffset?: string;
  /** What the value column holds; default "drawdown". */
  readonly kind?: LevelKind;
  /** Unit of the value column and of staticLevel, e.g. "m". */
  readonly lengthUnit: string;
  /** For kind "head": the static head; for "depth-to-water": the static depth to water; in lengthUnit. */
  readonly staticLevel?: number;
  /** Distance from the pumping well. */
  readonly radius: ValueWithUnit;
  /** Pumping rate of the pumping well. */
  readonly pumpingRate: PumpingRate;
  /** Field separator; by default detected from the header row (',' ';' or tab). */
  readonly separator?: CsvSeparator;
  /**
   * True when numbers use a decimal comma ("0,45"). Default: for ';'-separated files, true unless the
   * numbers of the chosen columns show only decimal points; otherwise false.
   */
  readonly decimalComma?: boolean;
  /** 1-based line of the header row; lines before it (a logger preamble) are skipped. Default: first non-blank line. */
  readonly headerLine?: number;
  /** Times not increasing down the file: "refuse" (default) or "sort" (sorted, and reported in notes). */
  readonly outOfOrder?: "refuse" | "sort";
  /** Rows lacking a time or a value: "refuse" (default) or "exclude" (listed in the series' excluded). */
  readonly missing?: RowPolicy;
  /** Field texts that mean "no reading" (compared ignoring case and spaces). Default: "", NA, N/A, NaN, null, -. */
  readonly missingMarkers?: readonly string[];
  /** Readings before pumping started (negative elapsed time): "refuse" (default) or "exclude". */
  readonly beforeStart?: RowPolicy;
  /** Check that the value column looks like the stated kind (default true); see level-kind-check. */
  readonly checkLevelKind?: boolean;
  /** Free notes copied into the series' metadata. */
  readonly metadata?: Readonly<Record<string, string>>;
}

/** Result of a successful import: the series, and notes on every remedy applied (sorting, exclusions). */
export interface ObservationCsvImport {
  readonly series: ObservationSeries;
  readonly notes: readonly string[];
}
