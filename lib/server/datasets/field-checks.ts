import "server-only";
import {
  checkAgainstField,
  checkFileKind,
  lonLatBox,
  resolveCrs,
  type ColumnGuess,
  type CrsEntry,
  type FieldReference,
  type InputIssue,
  type PointTable,
} from "@/geo";
import type { DB } from "@/db/client";
import { fieldRowCounts, findDatasetsBySha, listFieldPoints } from "@/db/queries/datasets";
import type { FieldDto } from "@/lib/api-types";

/** How many of the field's other files give the extent a new file is compared with (when it has no boundary). */
const FILES_COMPARED = 5;

const KIND_NAMES: Record<string, string> = { planted: "as-planted records", survey: "survey file" };

/** "2026-04-20 21:40 UTC" */
function when(iso: string): string {
  return `${iso.slice(0, 10)} ${iso.slice(11, 16)} UTC`;
}

/** What the field holds to compare a new file with: its boundary, else the extent of its latest files. */
async function fieldReference(db: DB, orgId: string, field: FieldDto): Promise<FieldReference | null> {
  const ring = field.boundary?.coordinates[0];
  if (ring && ring.length >= 4) return { kind: "boundary", ring };
  const others = await listFieldPoints(db, { orgId, fieldId: field.id, limit: FILES_COMPARED });
  const files: { name: string; box: NonNullable<ReturnType<typeof lonLatBox>> }[] = [];
  for (const o of others) {
    let crs: CrsEntry;
    try {
      crs = resolveCrs(o.crs);
    } catch {
      continue;
    }
    const box = lonLatBox(o.table, crs);
    if (box) files.push({ name: o.fileName, box });
  }
  return files.length ? { kind: "files", files } : null;
}

/**
 * Checks of a new file against what its field already holds: where its points lie (boundary or other files),
 * whether it looks like the other kind of file, and whether the same bytes were uploaded before.
 */
export async function checkFileInField(
  db: DB,
  r: {
    orgId: string;
    field: FieldDto;
    kind: "planted" | "survey";
    fileName: string;
    table: PointTable;
    crs: CrsEntry;
    columns: ColumnGuess;
    sha256: string;
  },
): Promise<InputIssue[]> {
  const issues: InputIssue[] = [];
  const reference = await fieldReference(db, r.orgId, r.field);
  if (reference) issues.push(...checkAgainstField(r.table, r.crs, reference));
  const counts = await fieldRowCounts(db, { orgId: r.orgId, fieldId: r.field.id });
  issues.push(...checkFileKind(r.kind, r.columns, r.table.length, counts, r.fileName));
  const earlier = await findDatasetsBySha(db, { orgId: r.orgId, fieldId: r.field.id, sha256: r.sha256 });
  if (earlier.length > 0) {
    const first = earlier[0];
    issues.push({
      severity: "warning",
      code: "file-uploaded-before",
      file: r.fileName,
      value: first.fileName,
      message: `this exact file (same SHA-256) was already uploaded to this field as "${first.fileName}" (${KIND_NAMES[first.kind] ?? first.kind}) on ${when(first.uploadedAt)}${earlier.length > 1 ? `, and ${earlier.length - 1} more time(s) since` : ""}`,
    });
  }
  return issues;
}
