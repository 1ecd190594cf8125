/** Messages between the server and the audit worker thread (structured-cloned; typed arrays transferred). */
import type { PointTable } from "@/geo";
import type { AuditSummary } from "@/lib/audit";
import type { ToleranceProfile } from "@/lib/audit/profile";
import type { AuditReportKind, AuditStage } from "@/lib/audit/run";
import type { AuditSettings } from "@/lib/audit/settings";
import type { Verdict } from "@/lib/audit/verdict";
import type { ResidualRecordRow, RowsDigest, UnpairedRecordRow } from "@/lib/review/record";

/** What the worker is given. The tables' arrays are moved to the worker, not copied. */
export interface AuditJobInput {
  planted: PointTable;
  plantedCrs: string;
  survey: PointTable;
  surveyCrs: string;
  settings: AuditSettings;
  profile: ToleranceProfile;
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
  | { type: "stage"; stage: AuditStage }
  | { type: "refused"; errors: { file: string; line?: number; message: string }[] }
  | {
      type: "computed";
      summary: AuditSummary;
      verdict: Verdict;
      settings: AuditSettings;
      reports: { kind: AuditReportKind; bytes: Uint8Array }[];
      residualCount: number;
      /** Unpaired rows that follow as `unpaired` batches (without `digestsOnly`: the survey-side ones only). */
      unpairedCount: number;
      /**
       * Without `digestsOnly`: the planted records nobody surveyed, encoded by lib/review/planted-not-found.ts
       * (unpaired seq 0…count−1), stored as one value instead of a row each.
       */
      plantedNotFound?: { plants: number; count: number; bytes: Uint8Array };
      /** With `digestsOnly`. */
      digests?: { residuals: RowsDigest; unpaired: RowsDigest };
    }
  | { type: "residuals"; rows: ResidualRecordRow[] }
  | { type: "unpaired"; rows: UnpairedRecordRow[] }
  | { type: "done" }
  | { type: "error"; message: string };
