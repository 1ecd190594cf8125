import "server-only";
import type { DB } from "@/db/client";
import { activity } from "@/db/schema";

export async function logActivity(
  db: Pick<DB, "insert">,
  entry: { orgId: string; actorId: string | null; action: string; subjectType: string; subjectId?: string; detail?: unknown },
): Promise<void> {
  await db.insert(activity).values({ ...entry, detail: entry.detail ?? null });
}
