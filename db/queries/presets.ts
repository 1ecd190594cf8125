import "server-only";
import { and, asc, eq } from "drizzle-orm";
import type { DB } from "@/db/client";
import { importPreset } from "@/db/schema";
import type { ColumnMapping } from "@/geo";
import type { PresetDto } from "@/lib/api-types";

const cols = {
  id: importPreset.id,
  name: importPreset.name,
  kind: importPreset.kind,
  crs: importPreset.crs,
  mapping: importPreset.mapping,
  createdAt: importPreset.createdAt,
};

export async function listPresets(
  db: DB,
  { orgId, kind }: { orgId: string; kind?: "planted" | "survey" },
): Promise<PresetDto[]> {
  const where = kind ? and(eq(importPreset.orgId, orgId), eq(importPreset.kind, kind)) : eq(importPreset.orgId, orgId);
  const rows = await db.select(cols).from(importPreset).where(where).orderBy(asc(importPreset.name));
  return rows.map((r) => ({
    ...r,
    kind: r.kind as PresetDto["kind"],
    mapping: r.mapping as ColumnMapping,
    createdAt: r.createdAt.toISOString(),
  }));
}

/** Save or replace a named preset (same organisation, kind and name). */
export async function savePreset(
  db: Pick<DB, "insert">,
  p: {
    orgId: string;
    userId: string;
    name: string;
    kind: "planted" | "survey";
    crs: string | null;
    mapping: ColumnMapping;
  },
): Promise<void> {
  await db
    .insert(importPreset)
    .values({ orgId: p.orgId, name: p.name, kind: p.kind, crs: p.crs, mapping: p.mapping, createdBy: p.userId })
    .onConflictDoUpdate({
      target: [importPreset.orgId, importPreset.kind, importPreset.name],
      set: { crs: p.crs, mapping: p.mapping, createdBy: p.userId, createdAt: new Date() },
    });
}

export async function deletePreset(db: DB, { id, orgId }: { id: string; orgId: string }): Promise<boolean> {
  const rows = await db
    .delete(importPreset)
    .where(and(eq(importPreset.id, id), eq(importPreset.orgId, orgId)))
    .returning({ id: importPreset.id });
  return rows.length > 0;
}
