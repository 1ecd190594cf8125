/** Messages between the upload page and its preview worker. */

export const PREVIEW_ROWS = 20;

export interface PreviewRequest {
  id: number;
  file: File;
  rows: number;
}

interface PreviewBase {
  id: number;
  ok: true;
  /** Header names as read (BOM and surrounding spaces removed). */
  header: string[];
  /** First rows: cells by header position. */
  rows: { line: number; cells: string[] }[];
}

export interface CsvPreview extends PreviewBase {
  format: "csv";
  delimiter: "," | ";" | "\t" | "|";
  /** Decimal commas are read as decimal points (the file is not comma-delimited). */
  decimalCommaAccepted: boolean;
  /** A number with a decimal comma was seen in the previewed rows. */
  decimalCommaSeen: boolean;
  lineEnding: "LF" | "CRLF" | "CR";
  /** Data rows in the file: exact when the whole file was read for the preview, else estimated from the first part. */
  rowCount: number;
  rowCountExact: boolean;
}

export interface GeoJsonPreview extends PreviewBase {
  format: "geojson";
  featureCount: number;
  /** Position of each previewed feature's point, as written ("x, y"). */
  positions: string[];
  /** "projected" when the file's crs member names a projected system or any |x| > 180 / |y| > 90. */
  coordinateKind: "geographic" | "projected";
  /** CRS named in the file's legacy crs member, e.g. "EPSG:25831". */
  crsHint: string | null;
  /** Some features carry a top-level id (used as plant id when no property is one). */
  featureIds: boolean;
  /** Geometry types other than Point, with counts. */
  otherGeometries: Record<string, number>;
}

export interface PreviewFailure {
  id: number;
  ok: false;
  message: string;
}

export type PreviewResult = CsvPreview | GeoJsonPreview | PreviewFailure;
