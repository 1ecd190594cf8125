import "server-only";
import crypto from "node:crypto";
import { getAuth } from "@/lib/server/auth";
import { getDb } from "@/db/client";
import { anyAccountExists, deleteUserById, slugFor } from "@/db/queries/organisations";
import { env } from "@/lib/server/env";
import { logActivity } from "@/db/queries/activity";
import { seedDefaultProfiles } from "@/db/queries/profiles";
import type { SignUpInput } from "@/lib/validation/account";

/**
 * Whether /signup may set up a new organisation: always for the first account of an empty install,
 * afterwards only with OPEN_SIGNUP=1. Everyone else joins through an invitation from an owner.
 */
export async function signUpOpen(): Promise<boolean> {
  return env().OPEN_SIGNUP === "1" || !(await anyAccountExists(await getDb()));
}

/**
 * Create an account and the organisation it owns. If the organisation cannot be created the
 * account is removed again, so a sign-up never leaves a user without an organisation.
 * Pass `headers` to sign the new user in (browser sign-up); omit it for seeding.
 */
export async function createAccountWithOrganisation(
  input: SignUpInput,
  headers?: Headers,
): Promise<{ userId: string; orgId: string }> {
  const auth = await getAuth();
  const { user } = await auth.api.signUpEmail({
    body: { name: input.name, email: input.email, password: input.password },
    headers,
  });
  try {
    const org = await auth.api.createOrganization({
      body: {
        name: input.organisation,
        slug: slugFor(input.organisation, crypto.randomBytes(3).toString("hex")),
        userId: user.id,
        metadata: { kind: input.kind },
      },
    });
    if (!org) throw new Error("organisation was not created");
    await seedDefaultProfiles(await getDb(), { orgId: org.id });
    await logActivity(await getDb(), {
      orgId: org.id,
      actorId: user.id,
      action: "organisation.created",
      subjectType: "organisation",
      subjectId: org.id,
      detail: { name: org.name },
    });
    return { userId: user.id, orgId: org.id };
  } catch (err) {
    await deleteUserById(await getDb(), { userId: user.id });
    throw err;
  }
}

/** Add an existing account to an organisation with a role (used by the demo seed). */
export async function addMember(orgId: string, userId: string, role: string): Promise<void> {
  const auth = await getAuth();
  await auth.api.addMember({ body: { organizationId: orgId, userId, role: role as "owner" } });
}
