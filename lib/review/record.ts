/**
 * The signed record of an audit: the canonical document a sign-off hashes, and the digests of the
 * per-plant result rows it contains. Pure (hashing through ./hash).
 *
 * The same builder is fed twice when verifying: once from what is stored now, once from a fresh
 * computation from the raw files. Both must give the hash stored at sign-off.
 */
import type { ResidualRowDto, UnpairedRowDto } from "@/lib/api-types";
import { canonicalJson } from "./canonical";
import { sha256Hex, sha256Stream } from "./hash";

export const RECORD_SCHEMA = "plotproof.signoff.v1";

/**
 * One per-plant residual, columns as stored (metres, work CRS): the API's row, with the text columns
 * the database returns as plain strings.
 */
export type ResidualRecordRow = Omit<ResidualRowDto, "pairedBy"> & { pairedBy: string };

/** One unpaired point, as stored. */
export type UnpairedRecordRow = Omit<UnpairedRowDto, "kind"> & { kind: string };

const RESIDUAL_COLUMNS = [
  "seq",
  "plantId",
  "surveyId",
  "crop",
  "bed",
  "row",
  "arm",
  "fix",
  "day",
  "plantedE",
  "plantedN",
  "surveyE",
  "surveyN",
  "dE",
  "dN",
  "along",
  "cross",
  "radial",
  "within",
  "outlier",
  "pairedBy",
  "beyondMaxDistance",
] as const satisfies readonly (keyof ResidualRecordRow)[];

const UNPAIRED_COLUMNS = [
  "seq",
  "kind",
  "pointId",
  "line",
  "e",
  "n",
  "crop",
  "bed",
  "row",
] as const satisfies readonly (keyof UnpairedRecordRow)[];

export interface RowsDigest {
  count: number;
  /** SHA-256 over one canonical JSON array per row, in `seq` order, each followed by "\n". */
  sha256: string;
  /** The columns, in the order they are hashed. */
  columns: string[];
}

function digestRows<T extends { seq: number }>(rows: readonly T[], columns: readonly (keyof T & string)[]): RowsDigest {
  const sorted = [...rows].sort((a, b) => a.seq - b.seq);
  const h = sha256Stream();
  for (const r of sorted) h.update(canonicalJson(columns.map((c) => r[c])) + "\n");
  return { count: sorted.length, sha256: h.hex(), columns: [...columns] };
}

/** Digest of the per-plant residual rows. @example residualDigest([]) // { count: 0, sha256: "e3b0…b855", … } */
export function residualDigest(rows: readonly ResidualRecordRow[]): RowsDigest {
  return digestRows(rows, RESIDUAL_COLUMNS);
}

/** Digest of the unpaired points. */
export function unpairedDigest(rows: readonly UnpairedRecordRow[]): RowsDigest {
  return digestRows(rows, UNPAIRED_COLUMNS);
}

export interface RecordDataset {
  datasetId: string;
  kind: string;
  fileName: string;
  /** SHA-256 of the raw file bytes. */
  sha256: string;
  sizeBytes: number;
  rowCount: number;
  crs: string;
  format: string;
  mapping: unknown;
}

export interface RecordSigner {
  signerId: string | null;
  signerName: string;
  signerRole: string;
  typedName: string;
  checklist: unknown;
  comment: string | null;
  deviation: boolean;
  /** ISO 8601 UTC. */
  signedAt: string;
}

/** Everything the sign-off hash covers. */
export interface SignedRecord {
  schema: typeof RECORD_SCHEMA;
  audit: { id: string; revision: number; revisionOf: string | null; title: string; fieldId: string };
  inputs: { planted: RecordDataset; survey: RecordDataset; settings: unknown; profile: unknown };
  results: {
    summary: unknown;
    verdict: unknown;
    residuals: RowsDigest;
    unpaired: RowsDigest;
    /** SHA-256 of the stored CSV reports (what a download returns). */
    reports: Record<string, string | null>;
  };
  signoff: RecordSigner;
}

export function buildRecord(parts: Omit<SignedRecord, "schema">): SignedRecord {
  return { schema: RECORD_SCHEMA, ...parts };
}

/** The canonical text and its SHA-256. */
export function hashRecord(record: SignedRecord): { canonical: string; sha256: string } {
  const canonical = canonicalJson(record);
  return { canonical, sha256: sha256Hex(canonical) };
}

export function reportHashes(
  reports: Partial<Record<"residuals" | "unpaired" | "summary", Uint8Array | null>>,
): Record<string, string | null> {
  const out: Record<string, string | null> = {};
  for (const kind of ["residuals", "unpaired", "summary"] as const)
    out[kind] = reports[kind] ? sha256Hex(reports[kind]!) : null;
  return out;
}
