import { guardedRoute } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { deleteProfile, getProfileById, profileNameTaken, updateProfile } from "@/db/queries/profiles";
import { logActivity } from "@/db/queries/activity";
import { AppError, notFound } from "@/lib/errors";
import { ANY_ROLE, CAN_EDIT_PROFILES } from "@/lib/roles";
import { ProfileInput, ProfilePatch } from "@/lib/validation/profile";
import { parseInput, readJsonBody, routeId } from "@/lib/validation/request";

export const GET = guardedRoute<{ id: string }>(ANY_ROLE, async ({ viewer, params }) => {
  const id = routeId(params, "id", "Tolerance profile");
  const profile = await getProfileById(await getDb(), { id, orgId: viewer.orgId });
  if (!profile) throw notFound("Tolerance profile");
  return Response.json({ profile });
});

/** Edit a profile. Past audits keep the copy of the limits they were computed with. */
export const PATCH = guardedRoute<{ id: string }>(CAN_EDIT_PROFILES, async ({ req, viewer, params }) => {
  const id = routeId(params, "id", "Tolerance profile");
  const patch = await readJsonBody(req, ProfilePatch);
  const db = await getDb();
  const current = await getProfileById(db, { id, orgId: viewer.orgId });
  if (!current) throw notFound("Tolerance profile");
  // The merged profile must still be a valid profile (e.g. keep at least one limit).
  parseInput(ProfileInput, { ...current, ...patch }, "body");
  if (patch.name && (await profileNameTaken(db, { orgId: viewer.orgId, name: patch.name, exceptId: current.id }))) {
    throw new AppError("conflict", `A profile named "${patch.name}" already exists.`, [
      { path: ["name"], message: "Name already used" },
    ]);
  }
  const profile = await updateProfile(db, { id: current.id, orgId: viewer.orgId, userId: viewer.userId, input: patch });
  await logActivity(db, {
    orgId: viewer.orgId,
    actorId: viewer.userId,
    action: "profile.updated",
    subjectType: "profile",
    subjectId: current.id,
    detail: { before: current, after: profile },
  });
  return Response.json({ profile });
});

export const DELETE = guardedRoute<{ id: string }>(CAN_EDIT_PROFILES, async ({ viewer, params }) => {
  const id = routeId(params, "id", "Tolerance profile");
  const db = await getDb();
  if (!(await deleteProfile(db, { id, orgId: viewer.orgId }))) throw notFound("Tolerance profile");
  await logActivity(db, {
    orgId: viewer.orgId,
    actorId: viewer.userId,
    action: "profile.deleted",
    subjectType: "profile",
    subjectId: id,
  });
  return new Response(null, { status: 204 });
});
