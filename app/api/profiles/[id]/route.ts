import { guardedRoute } from "@/lib/access";
import { getDb } from "@/db/client";
import { deleteProfile, getProfileById, profileNameTaken, updateProfile } from "@/db/queries/profiles";
import { logActivity } from "@/db/queries/activity";
import { AppError, notFound } from "@/lib/errors";
import { ANY_ROLE, CAN_REVIEW } from "@/lib/roles";
import { IdParam, ProfileInput, ProfilePatch } from "@/lib/validation/profile";
import { parseJsonBody } from "@/lib/validation/request";

export const GET = guardedRoute<{ id: string }>(ANY_ROLE, async ({ viewer, params }) => {
  const p = IdParam.safeParse(params);
  const profile = p.success ? await getProfileById(await getDb(), { id: p.data.id, orgId: viewer.orgId }) : null;
  if (!profile) throw notFound("Tolerance profile");
  return Response.json({ profile });
});

/** Edit a profile. Past audits keep the copy of the limits they were computed with. */
export const PATCH = guardedRoute<{ id: string }>(CAN_REVIEW, async ({ req, viewer, params }) => {
  const p = IdParam.safeParse(params);
  if (!p.success) throw notFound("Tolerance profile");
  const patch = await parseJsonBody(req, ProfilePatch);
  const db = await getDb();
  const current = await getProfileById(db, { id: p.data.id, orgId: viewer.orgId });
  if (!current) throw notFound("Tolerance profile");
  // The merged profile must still be a valid profile (e.g. keep at least one limit).
  const merged = ProfileInput.safeParse({ ...current, ...patch });
  if (!merged.success) {
    const issues = merged.error.issues.map((i) => ({ path: i.path, message: i.message }));
    throw new AppError("invalid_input", issues[0].message, issues);
  }
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

export const DELETE = guardedRoute<{ id: string }>(CAN_REVIEW, async ({ viewer, params }) => {
  const p = IdParam.safeParse(params);
  const db = await getDb();
  if (!p.success || !(await deleteProfile(db, { id: p.data.id, orgId: viewer.orgId })))
    throw notFound("Tolerance profile");
  await logActivity(db, {
    orgId: viewer.orgId,
    actorId: viewer.userId,
    action: "profile.deleted",
    subjectType: "profile",
    subjectId: p.data.id,
  });
  return new Response(null, { status: 204 });
});
