import { guardedRoute } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { createProfile, listProfiles, profileNameTaken } from "@/db/queries/profiles";
import { logActivity } from "@/db/queries/activity";
import { AppError } from "@/lib/errors";
import { ANY_ROLE, CAN_EDIT_PROFILES } from "@/lib/roles";
import { ProfileInput } from "@/lib/validation/profile";
import { readJsonBody } from "@/lib/validation/request";

export const GET = guardedRoute(ANY_ROLE, async ({ viewer }) =>
  Response.json({ profiles: await listProfiles(await getDb(), { orgId: viewer.orgId }) }),
);

export const POST = guardedRoute(CAN_EDIT_PROFILES, async ({ req, viewer }) => {
  const input = await readJsonBody(req, ProfileInput);
  const db = await getDb();
  if (await profileNameTaken(db, { orgId: viewer.orgId, name: input.name })) {
    throw new AppError("conflict", `A profile named "${input.name}" already exists.`, [
      { path: ["name"], message: "Name already used" },
    ]);
  }
  const profile = await createProfile(db, { orgId: viewer.orgId, userId: viewer.userId, input });
  await logActivity(db, {
    orgId: viewer.orgId,
    actorId: viewer.userId,
    action: "profile.created",
    subjectType: "profile",
    subjectId: profile.id,
    detail: { name: profile.name },
  });
  return Response.json({ profile }, { status: 201 });
});
