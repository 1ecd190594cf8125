import { z } from "zod";
import { guardedRoute } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { listPresets, savePreset } from "@/db/queries/presets";
import { ANY_ROLE, CAN_PREPARE } from "@/lib/roles";
import { readJsonBody, readQuery } from "@/lib/validation/request";
import { ColumnMappingSchema } from "@/lib/validation/upload";

/** An unknown kind lists every preset, as if none was given. */
const Query = z.object({ kind: z.enum(["planted", "survey"]).optional().catch(undefined) });
const PresetInput = z.object({
  name: z.string().trim().min(1).max(80),
  kind: z.enum(["planted", "survey"]),
  crs: z.string().trim().min(1).nullable().default(null),
  mapping: ColumnMappingSchema,
});

export const GET = guardedRoute(ANY_ROLE, async ({ req, viewer }) => {
  const { kind } = readQuery(req, Query);
  return Response.json({ presets: await listPresets(await getDb(), { orgId: viewer.orgId, kind }) });
});

export const POST = guardedRoute(CAN_PREPARE, async ({ req, viewer }) => {
  const input = await readJsonBody(req, PresetInput);
  const db = await getDb();
  await savePreset(db, { ...input, orgId: viewer.orgId, userId: viewer.userId });
  const preset = (await listPresets(db, { orgId: viewer.orgId, kind: input.kind })).find((p) => p.name === input.name);
  return Response.json({ preset }, { status: 201 });
});
