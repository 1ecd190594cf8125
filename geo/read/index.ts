import { readCsv, type ReadOptions, type ReadResult } from "./csv";
import { readGeoJson } from "./geojson";
import type { TextInput } from "./text";

export type { ReadOptions, ReadResult } from "./csv";
export type { ColumnGuess, ColumnMapping, ColumnRole, CoordinateKind } from "./columns";
export type { TextInput } from "./text";

/** File formats the readers understand. */
export type PointFileFormat = "csv" | "geojson";

/**
 * Guesses the format from the file name (.geojson/.json → GeoJSON, anything else → CSV).
 * @example formatFromName("survey.GeoJSON") // "geojson"
 */
export function formatFromName(name: string): PointFileFormat {
  return /\.(geo)?json$/i.test(name) ? "geojson" : "csv";
}

/**
 * Reads an as-planted record or survey file (CSV or GeoJSON) into a PointTable still in the file's
 * own coordinates, with the issues found and the column guess.
 * `format` defaults to a guess from `options.source`'s extension.
 *
 * @example
 * const { table, issues, columns } = await readPoints("id,lat,lon\nP1,52.1,9.2\n", { source: "planted.csv", role: "planted" });
 */
export function readPoints(input: TextInput, options: ReadOptions & { format?: PointFileFormat }): Promise<ReadResult> {
  const format = options.format ?? formatFromName(options.source);
  return format === "geojson" ? readGeoJson(input, options) : readCsv(input, options);
}
