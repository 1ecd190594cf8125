import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { eq, sql } from "drizzle-orm";
import { cookieFor, ctx, req, useMemoryDb } from "./helpers";
import type { DB } from "@/db/client";
import { invitation, member, user } from "@/db/schema";
import { DEMO_PASSWORD, DEMO_PEOPLE, OTHER_OWNER } from "@/lib/demo/farm";
import { captureMail, type MailCapture } from "@/lib/server/mail/testing";
import { findLink } from "@/lib/server/mail/mime";
import type { InvitationDto } from "@/lib/review/types";

let db: DB;
let mail: MailCapture;
const cookies: Record<string, string> = {};
let teamRoute: typeof import("@/app/api/team/route");
let invitationsRoute: typeof import("@/app/api/team/invitations/route");
let invitationRoute: typeof import("@/app/api/team/invitations/[id]/route");
let resendRoute: typeof import("@/app/api/team/invitations/[id]/resend/route");
let memberRoute: typeof import("@/app/api/team/members/[memberId]/route");
let meRoute: typeof import("@/app/api/me/route");
let accept: typeof import("@/lib/server/invites/accept");

const person = (role: string) => DEMO_PEOPLE.find((p) => p.role === role)!;
const invite = (cookie: string, body: unknown) =>
  invitationsRoute.POST(req("/api/team/invitations", { method: "POST", cookie, body: JSON.stringify(body) }), ctx({}));
const memberIdOf = async (email: string) =>
  (
    await db
      .select({ id: member.id })
      .from(member)
      .innerJoin(user, eq(user.id, member.userId))
      .where(eq(user.email, email))
  )[0]?.id;

beforeAll(async () => {
  mail = await captureMail();
  db = await useMemoryDb();
  const { seedDemo } = await import("@/lib/demo/seed");
  await seedDemo();
  for (const p of DEMO_PEOPLE) cookies[p.role] = await cookieFor(p.email, DEMO_PASSWORD);
  cookies.other = await cookieFor(OTHER_OWNER.email, DEMO_PASSWORD);
  teamRoute = await import("@/app/api/team/route");
  invitationsRoute = await import("@/app/api/team/invitations/route");
  invitationRoute = await import("@/app/api/team/invitations/[id]/route");
  resendRoute = await import("@/app/api/team/invitations/[id]/resend/route");
  memberRoute = await import("@/app/api/team/members/[memberId]/route");
  meRoute = await import("@/app/api/me/route");
  accept = await import("@/lib/server/invites/accept");
}, 120_000);

afterAll(async () => {
  await mail?.stop();
});

describe("team -- invitations by e-mail", () => {
  let inv: InvitationDto;

  it("invite -- only owners invite (403 for the other roles)", async () => {
    for (const role of ["qa_lead", "technician", "grower"]) {
      expect((await invite(cookies[role], { email: "wren@kestrelfen.example", role: "grower" })).status).toBe(403);
    }
    expect(mail.messages).toHaveLength(0);
  });

  it("invite -- an owner invites a grower; the e-mail carries the invitation link", async () => {
    const res = await invite(cookies.owner, { email: "Wren@Kestrelfen.example", role: "grower" });
    expect(res.status).toBe(201);
    const body = await res.json();
    inv = body.invitation;
    expect(body.mail).toBe("sent");
    expect(inv).toMatchObject({
      email: "wren@kestrelfen.example",
      role: "grower",
      status: "pending",
      invitedBy: person("owner").name,
    });
    expect(new Date(inv.expiresAt).getTime() - Date.now()).toBeGreaterThan(6.9 * 86_400_000);
    const m = await mail.waitFor((x) => x.to.includes("wren@kestrelfen.example"));
    expect(m.subject).toBe("Join Kestrel Fen Growers on Plotproof");
    expect(m.text).toContain(
      `${person("owner").name} has invited you to join Kestrel Fen Growers on Plotproof as Grower.`,
    );
    expect(findLink(m.text, "http://localhost:3000/invite/")).toBe(inv.link);
    expect(inv.link).toBe(`http://localhost:3000/invite/${inv.id}`);
  });

  it("invite -- the same address twice is 409; another organisation does not see the invitation", async () => {
    const again = await invite(cookies.owner, { email: "wren@kestrelfen.example", role: "technician" });
    expect(again.status).toBe(409);
    expect((await again.json()).error.message).toContain("already has a pending invitation");
    const theirs = await (await teamRoute.GET(req("/api/team", { cookie: cookies.other }), ctx({}))).json();
    expect(theirs.invitations).toEqual([]);
    expect(
      (
        await invitationRoute.DELETE(
          req(`/api/team/invitations/${inv.id}`, { method: "DELETE", cookie: cookies.other }),
          ctx({ id: inv.id }),
        )
      ).status,
    ).toBe(404);
  });

  it("invite -- an existing member's address is 409; a bad address or role is 422", async () => {
    expect((await invite(cookies.owner, { email: person("technician").email, role: "grower" })).status).toBe(409);
    expect((await invite(cookies.owner, { email: "not-an-address", role: "grower" })).status).toBe(422);
    expect((await invite(cookies.owner, { email: "x@kestrelfen.example", role: "admin" })).status).toBe(422);
  });

  it("accept -- the invitee sets a password; the account is created and joins as grower", async () => {
    const short = await accept.acceptWithNewAccount(inv.id, { name: "Wren Talbot", password: "short" }, new Headers());
    expect(short).toEqual({ ok: false, errors: { password: "Use 10 to 128 characters." } });
    expect(await memberIdOf("wren@kestrelfen.example")).toBeUndefined();

    const ok = await accept.acceptWithNewAccount(
      inv.id,
      { name: "Wren Talbot", password: "wren-fen-2026" },
      new Headers(),
    );
    expect(ok.ok).toBe(true);
    const me = await (
      await meRoute.GET(
        req("/api/me", { cookie: await cookieFor("wren@kestrelfen.example", "wren-fen-2026") }),
        ctx({}),
      )
    ).json();
    expect(me).toEqual({
      name: "Wren Talbot",
      email: "wren@kestrelfen.example",
      role: "grower",
      organisation: "Kestrel Fen Growers",
    });
    const list: InvitationDto[] = (
      await (await teamRoute.GET(req("/api/team", { cookie: cookies.owner }), ctx({}))).json()
    ).invitations;
    expect(list.find((i) => i.id === inv.id)!.status).toBe("accepted");
    const used = await accept.acceptWithNewAccount(
      inv.id,
      { name: "Someone", password: "another-pass-1" },
      new Headers(),
    );
    expect(used).toEqual({ ok: false, formError: "This invitation has already been accepted. Sign in instead." });
  });

  it("accept -- an existing account (another organisation's owner) is linked after signing in", async () => {
    const res = await invite(cookies.owner, { email: OTHER_OWNER.email, role: "technician" });
    expect(res.status).toBe(201);
    const { invitation: i } = await res.json();
    expect(await accept.acceptWithSignIn(i.id, { password: "wrong-password" }, new Headers())).toEqual({
      ok: false,
      errors: { password: "That password does not match the account." },
    });
    expect((await accept.acceptWithSignIn(i.id, { password: DEMO_PASSWORD }, new Headers())).ok).toBe(true);
    const rows = await db
      .select({ role: member.role })
      .from(member)
      .innerJoin(user, eq(user.id, member.userId))
      .where(eq(user.email, OTHER_OWNER.email));
    expect(rows.map((r) => r.role).sort()).toEqual(["owner", "technician"]);
  });

  it("accept -- an expired invitation is refused and creates no account", async () => {
    const res = await invite(cookies.owner, { email: "late@kestrelfen.example", role: "technician" });
    const { invitation: i } = await res.json();
    await db
      .update(invitation)
      .set({ expiresAt: new Date(Date.now() - 60_000) })
      .where(eq(invitation.id, i.id));
    const r = await accept.acceptWithNewAccount(
      i.id,
      { name: "Late Comer", password: "late-comer-2026" },
      new Headers(),
    );
    expect(r).toEqual({
      ok: false,
      formError: "This invitation to Kestrel Fen Growers has expired. Ask its owner to send you a new one.",
    });
    expect((await db.select().from(user).where(eq(user.email, "late@kestrelfen.example"))).length).toBe(0);
    const listed: InvitationDto[] = (
      await (await teamRoute.GET(req("/api/team", { cookie: cookies.owner }), ctx({}))).json()
    ).invitations;
    expect(listed.find((x) => x.id === i.id)!.status).toBe("expired");
    // Re-sending an expired invitation issues a fresh one that works.
    mail.clear();
    const again = await resendRoute.POST(
      req(`/api/team/invitations/${i.id}/resend`, { method: "POST", cookie: cookies.owner }),
      ctx({ id: i.id }),
    );
    expect(again.status).toBe(200);
    const fresh = (await again.json()).invitation as InvitationDto;
    expect(fresh.status).toBe("pending");
    await mail.waitFor((m) => m.to.includes("late@kestrelfen.example") && m.text.includes(fresh.link));
  });

  it("cancel -- a withdrawn invitation's link stops working", async () => {
    const { invitation: i } = await (
      await invite(cookies.owner, { email: "gone@kestrelfen.example", role: "grower" })
    ).json();
    expect(
      (
        await invitationRoute.DELETE(
          req(`/api/team/invitations/${i.id}`, { method: "DELETE", cookie: cookies.owner }),
          ctx({ id: i.id }),
        )
      ).status,
    ).toBe(204);
    const r = await accept.acceptWithNewAccount(i.id, { name: "Gone", password: "gone-gone-2026" }, new Headers());
    expect(r.ok).toBe(false);
  });
});

describe("team -- roles and removal", () => {
  it("change role -- an owner makes the technician a QA lead; others may not; another organisation's member is 404", async () => {
    const techMember = await memberIdOf(person("technician").email);
    const patch = (cookie: string, id: string, role: string) =>
      memberRoute.PATCH(
        req(`/api/team/members/${id}`, { method: "PATCH", cookie, body: JSON.stringify({ role }) }),
        ctx({ memberId: id }),
      );
    expect((await patch(cookies.qa_lead, techMember, "qa_lead")).status).toBe(403);
    const res = await patch(cookies.owner, techMember, "qa_lead");
    expect(res.status).toBe(200);
    expect((await res.json()).member).toMatchObject({ email: person("technician").email, role: "qa_lead" });
    expect((await (await meRoute.GET(req("/api/me", { cookie: cookies.technician }), ctx({}))).json()).role).toBe(
      "qa_lead",
    );
    expect((await patch(cookies.owner, techMember, "technician")).status).toBe(200);
    const corinsOwnMembership = (
      await db.execute<{ id: string }>(
        sql`select m.id from member m join "user" u on u.id = m.user_id join organization o on o.id = m.organization_id where u.email = ${OTHER_OWNER.email} and o.name = 'Saltings Field Services'`,
      )
    ).rows[0].id;
    expect((await patch(cookies.owner, corinsOwnMembership, "grower")).status).toBe(404);
  });

  it("change role -- the only owner cannot step down (409 with the reason)", async () => {
    const ownerMember = await memberIdOf(person("owner").email);
    const res = await memberRoute.PATCH(
      req(`/api/team/members/${ownerMember}`, {
        method: "PATCH",
        cookie: cookies.owner,
        body: JSON.stringify({ role: "grower" }),
      }),
      ctx({ memberId: ownerMember }),
    );
    expect(res.status).toBe(409);
    expect((await res.json()).error.message).toBe(
      "An organisation needs at least one owner: make someone else owner first.",
    );
  });

  it("remove -- an owner removes a member, who can then no longer use the organisation", async () => {
    const wren = await memberIdOf("wren@kestrelfen.example");
    const wrenCookie = await cookieFor("wren@kestrelfen.example", "wren-fen-2026");
    expect(
      (
        await memberRoute.DELETE(
          req(`/api/team/members/${wren}`, { method: "DELETE", cookie: cookies.grower }),
          ctx({ memberId: wren }),
        )
      ).status,
    ).toBe(403);
    expect(
      (
        await memberRoute.DELETE(
          req(`/api/team/members/${wren}`, { method: "DELETE", cookie: cookies.owner }),
          ctx({ memberId: wren }),
        )
      ).status,
    ).toBe(204);
    expect((await meRoute.GET(req("/api/me", { cookie: wrenCookie }), ctx({}))).status).toBe(401);
    const { members } = await (await teamRoute.GET(req("/api/team", { cookie: cookies.owner }), ctx({}))).json();
    expect(members.map((m: { email: string }) => m.email)).not.toContain("wren@kestrelfen.example");
  });

  it("team changes -- an API key cannot change the team (403)", async () => {
    const keysRoute = await import("@/app/api/keys/route");
    const { key } = await (
      await keysRoute.POST(
        req("/api/keys", { method: "POST", cookie: cookies.owner, body: JSON.stringify({ name: "Script" }) }),
        ctx({}),
      )
    ).json();
    const res = await invitationsRoute.POST(
      req("/api/team/invitations", {
        method: "POST",
        headers: { authorization: `Bearer ${key}` },
        body: JSON.stringify({ email: "k@kestrelfen.example", role: "grower" }),
      }),
      ctx({}),
    );
    expect(res.status).toBe(403);
    expect((await res.json()).error.message).toContain("API keys cannot change the team");
  });
});

describe("password reset by e-mail", () => {
  it("reset -- the link in the e-mail sets a new password once; the old one stops working", async () => {
    const { getAuth } = await import("@/lib/server/auth");
    const auth = await getAuth();
    mail.clear();
    await auth.api.requestPasswordReset({ body: { email: person("grower").email, redirectTo: "/reset-password" } });
    const m = await mail.waitFor((x) => x.to.includes(person("grower").email));
    expect(m.subject).toBe("Set a new Plotproof password");
    expect(m.text).toContain("The link works for 60 minutes and only once.");
    const link = findLink(m.text, "http://localhost:3000/api/auth/reset-password/")!;
    expect(link).toMatch(/\?callbackURL=%2Freset-password$/);
    const token = new URL(link).pathname.split("/").pop()!;
    await auth.api.resetPassword({ body: { newPassword: "ansel-new-password", token } });
    await expect(cookieFor(person("grower").email, DEMO_PASSWORD)).rejects.toThrow(/sign-in failed/);
    expect(await cookieFor(person("grower").email, "ansel-new-password")).toContain("session_token");
    await expect(auth.api.resetPassword({ body: { newPassword: "third-password-1", token } })).rejects.toThrow();
  });

  it("reset -- an unknown address sends nothing and says nothing", async () => {
    const { getAuth } = await import("@/lib/server/auth");
    mail.clear();
    const r = await (await getAuth()).api.requestPasswordReset({
      body: { email: "nobody@kestrelfen.example", redirectTo: "/reset-password" },
    });
    expect(r.status).toBe(true);
    await new Promise((res) => setTimeout(res, 300));
    expect(mail.messages).toHaveLength(0);
  });
});
