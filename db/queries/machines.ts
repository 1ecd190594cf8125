import "server-only";
import { and, asc, count, eq, ne } from "drizzle-orm";
import type { DB } from "@/db/client";
import { dataset, datasetMachine, machine } from "@/db/schema";
import type { MachineDto } from "@/lib/machine-types";
import type { MachineInput, MachinePatch } from "@/lib/validation/machines";

type Tx = Pick<DB, "insert" | "select" | "update" | "delete">;

const cols = {
  id: machine.id,
  name: machine.name,
  workingWidthM: machine.workingWidthM,
  toolArms: machine.toolArms,
  receiverNotes: machine.receiverNotes,
  cameraNotes: machine.cameraNotes,
  updatedAt: machine.updatedAt,
};
type Row = Omit<MachineDto, "uploads" | "updatedAt"> & { updatedAt: Date };

function toDto(r: Row, uploads: number): MachineDto {
  return { ...r, uploads, updatedAt: r.updatedAt.toISOString() };
}

async function uploadCounts(db: Tx, orgId: string): Promise<Map<string, number>> {
  const rows = await db
    .select({ machineId: datasetMachine.machineId, n: count() })
    .from(datasetMachine)
    .where(eq(datasetMachine.orgId, orgId))
    .groupBy(datasetMachine.machineId);
  return new Map(rows.map((r) => [r.machineId, Number(r.n)]));
}

/** The organisation's machines by name. */
export async function listMachines(db: DB, { orgId }: { orgId: string }): Promise<MachineDto[]> {
  const [rows, counts] = await Promise.all([
    db.select(cols).from(machine).where(eq(machine.orgId, orgId)).orderBy(asc(machine.name)),
    uploadCounts(db, orgId),
  ]);
  return rows.map((r) => toDto(r, counts.get(r.id) ?? 0));
}

export async function getMachineById(db: DB, { id, orgId }: { id: string; orgId: string }): Promise<MachineDto | null> {
  const [row] = await db
    .select(cols)
    .from(machine)
    .where(and(eq(machine.id, id), eq(machine.orgId, orgId)));
  if (!row) return null;
  const [{ n }] = await db
    .select({ n: count() })
    .from(datasetMachine)
    .where(and(eq(datasetMachine.machineId, id), eq(datasetMachine.orgId, orgId)));
  return toDto(row, Number(n));
}

export async function machineNameTaken(
  db: DB,
  { orgId, name, exceptId }: { orgId: string; name: string; exceptId?: string },
): Promise<boolean> {
  const [row] = await db
    .select({ id: machine.id })
    .from(machine)
    .where(and(eq(machine.orgId, orgId), eq(machine.name, name), exceptId ? ne(machine.id, exceptId) : undefined));
  return !!row;
}

export async function createMachine(
  db: DB,
  { orgId, userId, input }: { orgId: string; userId: string | null; input: MachineInput },
): Promise<MachineDto> {
  const [row] = await db
    .insert(machine)
    .values({ orgId, createdBy: userId, ...input })
    .returning(cols);
  return toDto(row, 0);
}

export async function updateMachine(
  db: DB,
  { id, orgId, input }: { id: string; orgId: string; input: MachinePatch },
): Promise<MachineDto | null> {
  const [row] = await db
    .update(machine)
    .set({ ...input, updatedAt: new Date() })
    .where(and(eq(machine.id, id), eq(machine.orgId, orgId)))
    .returning({ id: machine.id });
  return row ? getMachineById(db, { id, orgId }) : null;
}

/** Delete a machine no upload names. "deleted", "missing" or "in-use". */
export async function deleteMachine(
  db: DB,
  { id, orgId }: { id: string; orgId: string },
): Promise<"deleted" | "missing" | "in-use"> {
  return db.transaction(async (tx) => {
    const [used] = await tx
      .select({ id: datasetMachine.datasetId })
      .from(datasetMachine)
      .where(and(eq(datasetMachine.machineId, id), eq(datasetMachine.orgId, orgId)))
      .limit(1);
    if (used) return "in-use" as const;
    const gone = await tx
      .delete(machine)
      .where(and(eq(machine.id, id), eq(machine.orgId, orgId)))
      .returning({ id: machine.id });
    return gone.length ? ("deleted" as const) : ("missing" as const);
  });
}

/** Record which machine recorded an as-planted upload (inside the upload's own transaction). */
export async function linkDatasetMachine(
  tx: Tx,
  { datasetId, machineId, orgId }: { datasetId: string; machineId: string; orgId: string },
): Promise<void> {
  await tx.insert(datasetMachine).values({ datasetId, machineId, orgId });
}

/** The machine that recorded a dataset, or null. */
export async function getDatasetMachine(
  db: DB,
  { datasetId, orgId }: { datasetId: string; orgId: string },
): Promise<{ id: string; name: string } | null> {
  const [row] = await db
    .select({ id: machine.id, name: machine.name })
    .from(datasetMachine)
    .innerJoin(machine, eq(machine.id, datasetMachine.machineId))
    .innerJoin(dataset, eq(dataset.id, datasetMachine.datasetId))
    .where(and(eq(datasetMachine.datasetId, datasetId), eq(datasetMachine.orgId, orgId), eq(dataset.orgId, orgId)));
  return row ?? null;
}
