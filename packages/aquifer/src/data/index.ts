/**
 * Observation data: the series type, drawdown from water levels, CSV import and log-time thinning.
 */
export { SeriesError, createObservationSeries, isRateSchedule } from "./series.js";
export type {
  ExcludedPoint,
  ObservationSeries,
  ObservationSeriesInput,
  PumpingRate,
  ValueWithUnit,
  RateSchedule,
  RateStep,
} from "./series.js";
export { toBaseUnits } from "./base-units.js";
export type { SeriesInBaseUnits } from "./base-units.js";
export { drawdownFromDepthToWater, drawdownFromHead } from "./levels.js";
export { parseObservationCsv } from "./observation-csv.js";
export type { ImportHostOptions } from "./observation-csv.js";
export type {
  LevelKind,
  ObservationCsvImport,
  ObservationCsvOptions,
  RowPolicy,
  TimeFormat,
} from "./observation-csv-options.js";
export { CsvError, CsvProblemCode } from "./csv-problems.js";
export type { CsvColumnRef, CsvProblem } from "./csv-problems.js";
export { CSV_CHECKPOINT_RECORDS, readCsvRecords, scanCsvRecords } from "./csv-records.js";
export type { CsvRecord, CsvRecords, CsvSeparator, CsvSyntaxProblem } from "./csv-records.js";
export { readIsoTimestamp, readUtcOffset } from "./iso-timestamp.js";
export type { IsoTimestamp } from "./iso-timestamp.js";
export { logResample } from "./log-resample.js";
export type { LogResampleMethod, LogResampleOptions, LogResampleResult } from "./log-resample.js";
