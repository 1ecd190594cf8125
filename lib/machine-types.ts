/** Shapes of machines and alerts shared by the server, the route handlers and the pages (types only). */
import type { AlertKind } from "@/lib/audit/alerts";

/** A planting machine of the organisation. Working width in metres. */
export interface MachineDto {
  id: string;
  name: string;
  workingWidthM: number;
  toolArms: number;
  receiverNotes: string | null;
  cameraNotes: string | null;
  /** As-planted uploads that name it (a machine with uploads cannot be deleted). */
  uploads: number;
  updatedAt: string;
}

/** The organisation's alert thresholds; null (or false) = not checked. */
export interface AlertRulesDto {
  armCrossOffsetM: number | null;
  /** Share, 0.3 = 30 %. */
  rmseRise: number | null;
  failedVerdict: boolean;
  updatedBy: string | null;
  updatedAt: string | null;
}

/** A stored breach of a threshold by a computed audit. */
export interface AlertDto {
  id: string;
  kind: AlertKind;
  message: string;
  audit: { id: string; title: string; fieldId: string; fieldName: string };
  machine: { id: string; name: string } | null;
  createdAt: string;
  acknowledgedAt: string | null;
  acknowledgedBy: string | null;
}
