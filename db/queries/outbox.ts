import "server-only";
import { and, desc, eq, inArray, isNull, or, sql } from "drizzle-orm";
import type { DB } from "@/db/client";
import { mailCapture, member, organization, user } from "@/db/schema";

export interface CapturedMailDto {
  id: number;
  receivedAt: string;
  to: string[];
  subject: string;
  kind: string | null;
  text: string;
}

/** Store a message the demo's fake SMTP server received. An unknown organisation id is dropped. */
export async function storeCapturedMail(
  db: DB,
  m: {
    orgId: string | null;
    envelopeFrom: string | null;
    envelopeTo: string[];
    subject: string;
    kind: string | null;
    text: string;
    raw: string;
  },
): Promise<void> {
  let orgId = m.orgId;
  if (orgId) {
    const [org] = await db.select({ id: organization.id }).from(organization).where(eq(organization.id, orgId));
    if (!org) orgId = null;
  }
  await db.insert(mailCapture).values({
    orgId,
    envelopeFrom: m.envelopeFrom,
    envelopeTo: m.envelopeTo,
    subject: m.subject.slice(0, 500),
    kind: m.kind,
    textBody: m.text.slice(0, 100_000),
    raw: m.raw.slice(0, 500_000),
  });
}

/**
 * Captured messages an owner of `orgId` may read: those sent on behalf of the organisation, and
 * account messages (password resets) addressed to one of its current members.
 */
export async function listCapturedMail(
  db: DB,
  { orgId, limit = 100 }: { orgId: string; limit?: number },
): Promise<CapturedMailDto[]> {
  const emails = (
    await db
      .select({ email: user.email })
      .from(member)
      .innerJoin(user, eq(user.id, member.userId))
      .where(eq(member.organizationId, orgId))
  ).map((r) => r.email.toLowerCase());
  const addressedToMember = emails.length
    ? sql`${mailCapture.envelopeTo} ?| array[${sql.join(
        emails.map((e) => sql`${e}`),
        sql`, `,
      )}]::text[]`
    : sql`false`;
  const rows = await db
    .select({
      id: mailCapture.id,
      receivedAt: mailCapture.receivedAt,
      to: mailCapture.envelopeTo,
      subject: mailCapture.subject,
      kind: mailCapture.kind,
      text: mailCapture.textBody,
    })
    .from(mailCapture)
    .where(or(eq(mailCapture.orgId, orgId), and(isNull(mailCapture.orgId), addressedToMember)))
    .orderBy(desc(mailCapture.id))
    .limit(limit);
  return rows.map((r) => ({ ...r, to: r.to as string[], receivedAt: r.receivedAt.toISOString() }));
}

export async function countCapturedMail(db: DB, { ids }: { ids: number[] }): Promise<number> {
  if (!ids.length) return 0;
  return (await db.select({ id: mailCapture.id }).from(mailCapture).where(inArray(mailCapture.id, ids))).length;
}
