import "server-only";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { user } from "@/db/schema";
import { createField } from "@/db/queries/fields";
import { addMember, createAccountWithOrganisation } from "@/lib/server/onboarding";
import { getAuth } from "@/lib/server/auth";
import {
  DEMO_CRS,
  DEMO_FIELDS,
  DEMO_ORG,
  DEMO_PASSWORD,
  DEMO_PEOPLE,
  DEMO_TIME_ZONE,
  OTHER_FIELD,
  OTHER_ORG,
  OTHER_OWNER,
} from "./farm";
import { seedPlanDemo } from "./plan-seed";
import { seedDemoSeason } from "./season";

async function userExists(email: string): Promise<boolean> {
  const db = await getDb();
  const [row] = await db.select({ id: user.id }).from(user).where(eq(user.email, email));
  return !!row;
}

/**
 * Create the demo organisations, accounts and fields once. Safe to call at every start:
 * it does nothing when the demo owner already exists.
 */
export async function seedDemo(opts: { season?: boolean } = {}): Promise<"created" | "present"> {
  const [owner, ...others] = DEMO_PEOPLE;
  if (await userExists(owner.email)) return "present";
  const db = await getDb();
  const auth = await getAuth();

  const { userId: ownerId, orgId } = await createAccountWithOrganisation({
    name: owner.name,
    email: owner.email,
    password: DEMO_PASSWORD,
    organisation: DEMO_ORG.name,
    kind: DEMO_ORG.kind,
  });
  for (const p of others) {
    const { user: u } = await auth.api.signUpEmail({ body: { name: p.name, email: p.email, password: DEMO_PASSWORD } });
    await addMember(orgId, u.id, p.role);
  }
  const fieldIds: Record<string, string> = {};
  for (const f of DEMO_FIELDS) {
    const created = await createField(db, {
      orgId,
      userId: ownerId,
      input: {
        name: f.name,
        farm: f.farm,
        crs: DEMO_CRS,
        timeZone: DEMO_TIME_ZONE,
        rowBearingDeg: f.bearingDeg,
        bedSpacingM: f.bedSpacingM,
        rowsPerBed: f.rowsPerBed,
        rowSpacingM: f.rowSpacingM,
        boundary: null,
      },
    });
    fieldIds[f.name] = created.id;
  }

  await seedPlanDemo(orgId); // a survey plan and a survey made from it (Willow Strip)

  const other = await createAccountWithOrganisation({
    name: OTHER_OWNER.name,
    email: OTHER_OWNER.email,
    password: DEMO_PASSWORD,
    organisation: OTHER_ORG.name,
    kind: OTHER_ORG.kind,
  });
  await createField(db, {
    orgId: other.orgId,
    userId: other.userId,
    input: {
      ...OTHER_FIELD,
      rowBearingDeg: null,
      bedSpacingM: null,
      rowsPerBed: null,
      rowSpacingM: null,
      boundary: null,
    },
  });
  // The demo season (lib/demo/season.ts): plantings audited over the months. On by default in demo mode; tests that
  // seed the demo ask for it when they need it.
  if (opts.season ?? process.env.PLOTPROOF_DEMO === "1") await seedDemoSeason(orgId, fieldIds);
  return "created";
}

export function demoCredentialsText(): string {
  const lines = [...DEMO_PEOPLE, OTHER_OWNER].map(
    (p) => `  ${p.role.padEnd(11)} ${p.email.padEnd(28)} ${DEMO_PASSWORD}`,
  );
  return [`Demo accounts (${DEMO_ORG.name}; the last one belongs to ${OTHER_ORG.name}):`, ...lines].join("\n");
}
