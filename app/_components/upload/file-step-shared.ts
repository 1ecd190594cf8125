/** Types, words and small formatters shared by the parts of the file step (file-step.tsx and its pieces). */
import type { CsvPreview, GeoJsonPreview } from "./preview-types";
import type { FileKind } from "./mapping-schema";
import type { ServerStage } from "./send-upload";

export interface UploadField {
  id: string;
  name: string;
  crs: string;
}

export type Preview = CsvPreview | GeoJsonPreview;

export const STAGES: { stage: ServerStage; label: string }[] = [
  { stage: "reading", label: "Reading the rows" },
  { stage: "checking", label: "Checking positions and values" },
  { stage: "saving", label: "Saving the file and its points" },
];

export const KIND_NOUN: Record<FileKind, string> = { planted: "as-planted records", survey: "survey checkpoints" };
export const GEOGRAPHIC_DEFAULT = "EPSG:4326";

export function formatBytes(n: number): string {
  if (n < 1024) return `${n} bytes`;
  if (n < 1024 * 1024) return `${(n / 1024).toFixed(1)} kB`;
  return `${(n / 1024 / 1024).toFixed(1)} MB`;
}

/** UTM zone number of a WGS 84 or ETRS89 UTM code, for comparing a suggestion with the field's CRS. */
export function utmZone(code: string): string | null {
  const m = /^EPSG:(?:326|327|258)(\d\d)$/.exec(code);
  return m ? m[1] : null;
}
