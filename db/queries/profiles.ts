import "server-only";
import { and, asc, eq } from "drizzle-orm";
import type { DB } from "@/db/client";
import { toleranceProfile } from "@/db/schema";
import type { ToleranceProfileDto } from "@/lib/api-types";
import type { ProfileInput } from "@/lib/validation/profile";

type Tx = Pick<DB, "insert" | "select" | "update" | "delete">;

/** Starting profiles for a new organisation: common practice, no source; NSSDA sets no thresholds (FGDC-STD-007.3-1998 §3.1). */
export const DEFAULT_PROFILES: Omit<ProfileInput, never>[] = [
  {
    name: "Inter-row hoeing",
    operation: "Hoe blades between rows, working a few centimetres beside the crop row",
    radialM: null,
    crossM: 0.02,
    alongM: null,
    requiredShare: 0.95,
    confidence: 0.95,
    minCheckpoints: 30,
    note: "Cross-row limit only: along the row the blades do not come near the plants.",
  },
  {
    name: "In-row weeding around plants",
    operation: "Tools that close between plants in the row",
    radialM: 0.01,
    crossM: 0.008,
    alongM: 0.01,
    requiredShare: 0.95,
    confidence: 0.95,
    minCheckpoints: 50,
    note: null,
  },
  {
    name: "Seed placement check",
    operation: "Checking the planting machine's own placement",
    radialM: 0.005,
    crossM: null,
    alongM: null,
    requiredShare: 0.9,
    confidence: 0.95,
    minCheckpoints: 30,
    note: null,
  },
];

const cols = {
  id: toleranceProfile.id,
  name: toleranceProfile.name,
  operation: toleranceProfile.operation,
  radialM: toleranceProfile.radialM,
  crossM: toleranceProfile.crossM,
  alongM: toleranceProfile.alongM,
  requiredShare: toleranceProfile.requiredShare,
  confidence: toleranceProfile.confidence,
  minCheckpoints: toleranceProfile.minCheckpoints,
  builtIn: toleranceProfile.builtIn,
  note: toleranceProfile.note,
  updatedAt: toleranceProfile.updatedAt,
};

const toDto = (r: { updatedAt: Date } & Omit<ToleranceProfileDto, "updatedAt">): ToleranceProfileDto => ({
  ...r,
  updatedAt: r.updatedAt.toISOString(),
});

export async function seedDefaultProfiles(db: Tx, { orgId }: { orgId: string }): Promise<void> {
  await db
    .insert(toleranceProfile)
    .values(DEFAULT_PROFILES.map((p) => ({ ...p, orgId, builtIn: true })))
    .onConflictDoNothing();
}

export async function listProfiles(db: DB, { orgId }: { orgId: string }): Promise<ToleranceProfileDto[]> {
  const rows = await db
    .select(cols)
    .from(toleranceProfile)
    .where(eq(toleranceProfile.orgId, orgId))
    .orderBy(asc(toleranceProfile.name));
  return rows.map(toDto);
}

export async function getProfileById(
  db: Tx,
  { id, orgId }: { id: string; orgId: string },
): Promise<ToleranceProfileDto | null> {
  const [row] = await db
    .select(cols)
    .from(toleranceProfile)
    .where(and(eq(toleranceProfile.id, id), eq(toleranceProfile.orgId, orgId)));
  return row ? toDto(row) : null;
}

export async function profileNameTaken(
  db: DB,
  { orgId, name, exceptId }: { orgId: string; name: string; exceptId?: string },
): Promise<boolean> {
  const rows = await db
    .select({ id: toleranceProfile.id })
    .from(toleranceProfile)
    .where(and(eq(toleranceProfile.orgId, orgId), eq(toleranceProfile.name, name)));
  return rows.some((r) => r.id !== exceptId);
}

export async function createProfile(
  db: DB,
  { orgId, userId, input }: { orgId: string; userId: string; input: ProfileInput },
): Promise<ToleranceProfileDto> {
  const [row] = await db
    .insert(toleranceProfile)
    .values({ ...input, orgId, updatedBy: userId })
    .returning(cols);
  return toDto(row);
}

/** Editing a built-in profile makes it the organisation's own (no longer "starting values"). */
export async function updateProfile(
  db: DB,
  { id, orgId, userId, input }: { id: string; orgId: string; userId: string; input: Partial<ProfileInput> },
): Promise<ToleranceProfileDto | null> {
  const [row] = await db
    .update(toleranceProfile)
    .set({ ...input, builtIn: false, updatedBy: userId, updatedAt: new Date() })
    .where(and(eq(toleranceProfile.id, id), eq(toleranceProfile.orgId, orgId)))
    .returning(cols);
  return row ? toDto(row) : null;
}

export async function deleteProfile(db: DB, { id, orgId }: { id: string; orgId: string }): Promise<boolean> {
  const rows = await db
    .delete(toleranceProfile)
    .where(and(eq(toleranceProfile.id, id), eq(toleranceProfile.orgId, orgId)))
    .returning({ id: toleranceProfile.id });
  return rows.length > 0;
}
