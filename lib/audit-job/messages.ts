/** Messages between the server and the audit worker thread (structured-cloned; typed arrays transferred). */
import type { PointTable } from "@/geo";
import type { AuditSummary } from "@/lib/audit";
import type { Verdict } from "@/lib/audit/verdict";
import type { AuditSettingsDto, ProfileSnapshot } from "@/lib/api-types";
import type { ResidualRecordRow, RowsDigest, UnpairedRecordRow } from "@/lib/review/record";
import type { ComputeStage } from "./compute";

/** What the worker is given. The tables' arrays are moved to the worker, not copied. */
export interface AuditJobInput {
  planted: PointTable;
  plantedCrs: string;
  survey: PointTable;
  surveyCrs: string;
  settings: AuditSettingsDto;
  profile: ProfileSnapshot;
  /** Re-computation for verification: send the digests of the rows instead of the rows. */
  digestsOnly?: boolean;
}

/** The server asks for the next batch of rows. */
export type AuditJobRequest = { type: "more" };

/** Rows sent per message, so neither thread handles a million objects in one go. */
export const ROWS_PER_MESSAGE = 2000;

/**
 * What the worker sends back, in this order: `stage`s while computing; then `refused` (the inputs
 * cannot be audited) or `computed`; then, one per `AuditJobRequest`, the `residuals` batches, the
 * `unpaired` batches and `done`.
 * `error` (an exception) may come at any point and ends the job.
 */
export type AuditJobMessage =
  | { type: "stage"; stage: ComputeStage }
  | { type: "refused"; errors: { file: string; line?: number; message: string }[] }
  | {
      type: "computed";
      summary: AuditSummary;
      verdict: Verdict;
      settings: AuditSettingsDto;
      reports: { kind: "residuals" | "unpaired" | "summary"; bytes: Uint8Array }[];
      residualCount: number;
      unpairedCount: number;
      /** With `digestsOnly`. */
      digests?: { residuals: RowsDigest; unpaired: RowsDigest };
    }
  | { type: "residuals"; rows: ResidualRecordRow[] }
  | { type: "unpaired"; rows: UnpairedRecordRow[] }
  | { type: "done" }
  | { type: "error"; message: string };
