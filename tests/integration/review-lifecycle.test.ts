import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { ctx, req } from "./helpers";
import {
  ACTORS,
  PEOPLE,
  cloneAudit,
  returnBody,
  setUpReviewWorld,
  signoffBody,
  stateOf,
  type Actor,
  type ReviewWorld,
} from "./review-helpers";
import { captureMail, type MailCapture } from "@/lib/server/mail/testing";
import { findLink } from "@/lib/server/mail/mime";
import { sql } from "drizzle-orm";
import type { ReviewDto } from "@/lib/review/types";

let w: ReviewWorld;
let mail: MailCapture;
let routes: {
  submit: typeof import("@/app/api/audits/[id]/submit/route");
  signoff: typeof import("@/app/api/audits/[id]/signoff/route");
  ret: typeof import("@/app/api/audits/[id]/return/route");
  revise: typeof import("@/app/api/audits/[id]/revise/route");
  verify: typeof import("@/app/api/audits/[id]/verify/route");
  activity: typeof import("@/app/api/audits/[id]/activity/route");
  dataset: typeof import("@/app/api/datasets/[id]/route");
};

beforeAll(async () => {
  mail = await captureMail();
  w = await setUpReviewWorld();
  routes = {
    submit: await import("@/app/api/audits/[id]/submit/route"),
    signoff: await import("@/app/api/audits/[id]/signoff/route"),
    ret: await import("@/app/api/audits/[id]/return/route"),
    revise: await import("@/app/api/audits/[id]/revise/route"),
    verify: await import("@/app/api/audits/[id]/verify/route"),
    activity: await import("@/app/api/audits/[id]/activity/route"),
    dataset: await import("@/app/api/datasets/[id]/route"),
  };
}, 180_000);

afterAll(async () => {
  await mail?.stop();
});

type Action = "submit" | "sign_off" | "return" | "revise";

function call(action: Action, who: Actor, id: string, body?: unknown): Promise<Response> {
  const init = { method: "POST", cookie: w.cookies[who], body: body === undefined ? undefined : JSON.stringify(body) };
  switch (action) {
    case "submit":
      return routes.submit.POST(req(`/api/audits/${id}/submit`, init), ctx({ id }));
    case "sign_off":
      return routes.signoff.POST(req(`/api/audits/${id}/signoff`, init), ctx({ id }));
    case "return":
      return routes.ret.POST(req(`/api/audits/${id}/return`, init), ctx({ id }));
    case "revise":
      return routes.revise.POST(req(`/api/audits/${id}/revise?wait=1`, init), ctx({ id }));
  }
}

const bodyFor = (action: Action, who: Actor) =>
  action === "sign_off" ? signoffBody(who) : action === "return" ? returnBody : {};

// Who may take each step, from which state to which — the expected matrix, written out in full.
const MATRIX: { action: Action; from: string; to: string; status: number; expect: Record<Actor, number> }[] = [
  {
    action: "submit",
    from: "computed",
    to: "submitted",
    status: 200,
    expect: { owner: 200, qa_lead: 200, technician: 200, grower: 403, other: 404 },
  },
  {
    action: "sign_off",
    from: "submitted",
    to: "signed_off",
    status: 201,
    expect: { owner: 201, qa_lead: 201, technician: 403, grower: 403, other: 404 },
  },
  {
    action: "return",
    from: "submitted",
    to: "returned",
    status: 200,
    expect: { owner: 200, qa_lead: 200, technician: 403, grower: 403, other: 404 },
  },
  {
    action: "revise",
    from: "returned",
    to: "returned",
    status: 201,
    expect: { owner: 201, qa_lead: 201, technician: 201, grower: 403, other: 404 },
  },
];

describe("review -- role matrix over every lifecycle transition", () => {
  for (const m of MATRIX) {
    for (const who of ACTORS) {
      const code = m.expect[who];
      it(`${m.action} -- ${who} on a ${m.from} audit gets ${code}`, async () => {
        const id = await cloneAudit(w.db, w.base.id, m.from);
        const res = await call(m.action, who, id, bodyFor(m.action, who));
        expect(res.status, await res.clone().text()).toBe(code);
        if (code === m.status) {
          expect(await stateOf(w.db, id)).toBe(m.to);
          if (m.action === "revise") {
            const { audit } = await res.json();
            expect(audit.state).toBe("computed");
            const review: ReviewDto = (
              await (
                await routes.signoff.GET(
                  req(`/api/audits/${audit.id}/signoff`, { cookie: w.cookies[who] }),
                  ctx({ id: audit.id }),
                )
              ).json()
            ).review;
            expect(review).toMatchObject({ revision: 2, revisionOf: id });
            expect(review.revisions.map((r) => r.revision)).toEqual([1, 2]);
          }
        } else {
          expect(await stateOf(w.db, id)).toBe(m.from);
          expect((await res.json()).error.code).toBe(code === 403 ? "forbidden" : "not_found");
        }
      });
    }
    // Wrong state: an allowed role is refused with 409 and the reason, and nothing changes.
    for (const state of ["computing", "computed", "failed", "submitted", "returned", "signed_off"].filter(
      (s) => s !== m.from,
    )) {
      it(`${m.action} -- on a ${state} audit is 409 with the reason`, async () => {
        const who: Actor = m.action === "submit" || m.action === "revise" ? "technician" : "qa_lead";
        const id = await cloneAudit(w.db, w.base.id, state);
        const res = await call(m.action, who, id, bodyFor(m.action, who));
        expect(res.status).toBe(409);
        const { error } = await res.json();
        expect(error.code).toBe("conflict");
        expect(error.message).toMatch(
          state === "signed_off"
            ? /signed off\. A signed-off audit, its files and its results can no longer be changed/
            : /only possible when the audit is/,
        );
        expect(await stateOf(w.db, id)).toBe(state);
      });
    }
  }

  it("verify and activity -- every member may read them (200), another organisation gets 404", async () => {
    for (const who of ACTORS) {
      const v = await routes.verify.POST(
        req(`/api/audits/${w.base.id}/verify`, { method: "POST", cookie: w.cookies[who] }),
        ctx({ id: w.base.id }),
      );
      expect(v.status, who).toBe(who === "other" ? 404 : 200);
      const a = await routes.activity.GET(
        req(`/api/audits/${w.base.id}/activity`, { cookie: w.cookies[who] }),
        ctx({ id: w.base.id }),
      );
      expect(a.status, who).toBe(who === "other" ? 404 : 200);
    }
  });

  it("review -- no session is 401 for every step", async () => {
    for (const action of ["submit", "sign_off", "return", "revise"] as const) {
      const res = await call(action, "owner", w.base.id, {}).catch(() => null);
      expect(res).not.toBeNull();
      const anonymous = await (action === "submit"
        ? routes.submit.POST
        : action === "sign_off"
          ? routes.signoff.POST
          : action === "return"
            ? routes.ret.POST
            : routes.revise.POST)(
        req(`/api/audits/${w.base.id}/x`, { method: "POST", body: "{}" }),
        ctx({ id: w.base.id }),
      );
      expect(anonymous.status).toBe(401);
    }
  });
});

describe("review -- the whole path with e-mail, and nothing signed can change", () => {
  let id: string;

  it("submit -- the technician submits; the QA lead gets an e-mail with the review link", async () => {
    id = await cloneAudit(w.db, w.base.id, "computed");
    mail.clear();
    const res = await call("submit", "technician", id, { note: "Bed 3 had a float fix for a while." });
    expect(res.status).toBe(200);
    const review: ReviewDto = (await res.json()).review;
    expect(review).toMatchObject({
      state: "submitted",
      submitted: { by: PEOPLE.technician.name, note: "Bed 3 had a float fix for a while." },
    });
    const m = await mail.waitFor((x) => x.to.includes(PEOPLE.qa_lead.email));
    expect(m.subject).toBe(`Waiting for your sign-off: Long Acre spring check (computed)`);
    expect(findLink(m.text, "http://localhost:3000/audits/")).toBe(`http://localhost:3000/audits/${id}/review`);
    expect(m.text).toContain("Some criteria of its tolerance profile failed");
    expect(mail.messages.filter((x) => x.to.includes(PEOPLE.owner.email))).toHaveLength(0);
  });

  it("sign off -- refused without the deviation comment, an unticked item or the signer's own name (422 naming each)", async () => {
    const bad = {
      checklist: {
        checkpoints: true,
        instrument: true,
        instrumentPrecisionMm: 2,
        controlMark: false,
        profileFits: true,
      },
      comment: "",
      typedName: "Maren Holt",
    };
    const res = await call("sign_off", "qa_lead", id, bad);
    expect(res.status).toBe(422);
    const paths = (await res.json()).error.issues.map((i: { path: string[] }) => i.path.join("."));
    expect(paths).toEqual(["checklist.controlMark", "comment", "typedName"]);
    expect(await stateOf(w.db, id)).toBe("submitted");
  });

  it("sign off -- the QA lead signs with the checklist; the record holds the hash; submitter and grower are told", async () => {
    mail.clear();
    const res = await call("sign_off", "qa_lead", id, signoffBody("qa_lead"));
    expect(res.status).toBe(201);
    const review: ReviewDto = (await res.json()).review;
    expect(review.state).toBe("signed_off");
    expect(review.signoff).toMatchObject({
      signerName: PEOPLE.qa_lead.name,
      signerRole: "qa_lead",
      deviation: true,
      typedName: PEOPLE.qa_lead.name,
    });
    expect(review.signoff!.sha256).toMatch(/^[0-9a-f]{64}$/);
    // The demo survey states its precision in precision_m (2 mm), so it comes from the file, not the signer.
    expect(review.signoff!.checklist.instrument).toMatchObject({
      precisionMm: 2,
      source: "survey file",
      tightestLimitMm: 8,
      ratio: 4,
    });
    // The canonical JSON served is exactly what was hashed.
    const withCanonical: ReviewDto = (
      await (
        await routes.signoff.GET(
          req(`/api/audits/${id}/signoff?canonical=1`, { cookie: w.cookies.grower }),
          ctx({ id }),
        )
      ).json()
    ).review;
    const { createHash } = await import("node:crypto");
    expect(createHash("sha256").update(withCanonical.signoff!.canonical!).digest("hex")).toBe(review.signoff!.sha256);
    expect(JSON.parse(withCanonical.signoff!.canonical!).inputs.survey.sha256).toBe(w.survey.sha256);

    const toTech = await mail.waitFor((x) => x.to.includes(PEOPLE.technician.email));
    const toGrower = await mail.waitFor((x) => x.to.includes(PEOPLE.grower.email));
    expect(toTech.subject).toBe("Signed off: Long Acre spring check (computed)");
    expect(toGrower.text).toContain(review.signoff!.sha256);
    expect(toGrower.text).toContain("not that a machine is safe to run");
  });

  it("signed off -- every mutating call is 409 with the reason, and the input files cannot be deleted", async () => {
    for (const action of ["submit", "sign_off", "return", "revise"] as const) {
      const who: Actor = action === "submit" || action === "revise" ? "technician" : "owner";
      const res = await call(action, who, id, bodyFor(action, who));
      expect(res.status, action).toBe(409);
      expect((await res.json()).error.message).toContain("signed off");
    }
    for (const d of [w.survey, w.planted]) {
      const res = await routes.dataset.DELETE(
        req(`/api/datasets/${d.id}`, { method: "DELETE", cookie: w.cookies.owner }),
        ctx({ id: d.id }),
      );
      expect(res.status).toBe(409);
      expect((await res.json()).error.message).toContain("signed-off audit");
    }
    expect(await stateOf(w.db, id)).toBe("signed_off");
  });

  it("signed off -- the database itself refuses changes to the audit, its rows, its files and the sign-off", async () => {
    const attempts = [
      sql`update audit set title = 'renamed' where id = ${id}`,
      sql`delete from audit where id = ${id}`,
      sql`update audit_residual set de = de + 0.01 where audit_id = ${id} and seq = 0`,
      sql`delete from audit_unpaired where audit_id = ${id}`,
      sql`insert into audit_unpaired (audit_id, seq, kind, line, e, n) values (${id}, 999999, 'ambiguous', 1, 0, 0)`,
      sql`insert into audit_residual select audit_id, seq + 999999, plant_id, survey_id, crop, bed, row, arm, fix, day, planted_e, planted_n, survey_e, survey_n, de, dn, along, "cross", radial, within, outlier, paired_by, beyond_max_distance from audit_residual where audit_id = ${id}`,
      sql`update audit_report set bytes = '\\x00' where audit_id = ${id}`,
      sql`update dataset set file_name = 'x.csv' where id = ${w.survey.id}`,
      sql`update dataset_file set bytes = '\\x00' where dataset_id = ${w.survey.id}`,
      sql`update audit_signoff set comment = 'changed' where audit_id = ${id}`,
      sql`delete from audit_review_event where audit_id = ${id}`,
    ];
    for (const statement of attempts) {
      const err = await w.db.execute(statement).then(
        () => null,
        (e: Error & { cause?: Error }) => e,
      );
      expect(err, "the statement should have been refused").not.toBeNull();
      // drizzle wraps the database's error; the trigger's own message is its cause
      expect(String(err!.cause?.message ?? err!.message)).toMatch(
        /^plotproof: .*(signed-off audit|is signed off|never changed or deleted)/,
      );
    }
    expect(await stateOf(w.db, id)).toBe("signed_off");
  });

  it("return -- a returned audit e-mails the submitter and the growers with the reasons; a revision keeps the old one readable", async () => {
    const rid = await cloneAudit(w.db, w.base.id, "computed");
    expect((await call("submit", "technician", rid, {})).status).toBe(200);
    mail.clear();
    const res = await call("return", "owner", rid, returnBody);
    expect(res.status).toBe(200);
    const review: ReviewDto = (await res.json()).review;
    expect(review.returned).toMatchObject({
      by: PEOPLE.owner.name,
      reasons: ["too_few_checkpoints", "other"],
      comment: returnBody.comment,
    });
    const m = await mail.waitFor((x) => x.to.includes(PEOPLE.technician.email) && x.subject.startsWith("Returned"));
    expect(m.text).toContain("• Too few checkpoints for this profile");
    await mail.waitFor((x) => x.to.includes(PEOPLE.grower.email) && x.subject.startsWith("Returned"));

    const hoeing = w.profiles.find((p) => p.name === "Inter-row hoeing")!;
    const rev = await call("revise", "technician", rid, { profileId: hoeing.id });
    expect(rev.status).toBe(201);
    const { audit: second } = await rev.json();
    expect(second).toMatchObject({ state: "computed", profile: { name: "Inter-row hoeing" } });
    expect(second.verdict.passed).toBe(true);
    expect(await stateOf(w.db, rid)).toBe("returned");
    const again = await call("revise", "technician", rid, {});
    expect(again.status).toBe(409);
    expect((await again.json()).error.message).toContain("already has a corrected revision");

    const first: ReviewDto = (
      await (
        await routes.signoff.GET(req(`/api/audits/${rid}/signoff`, { cookie: w.cookies.grower }), ctx({ id: rid }))
      ).json()
    ).review;
    expect(first).toMatchObject({ state: "returned", revisedBy: second.id, allowed: ["verify"] });
  });

  it("activity -- the audit's log names who uploaded, computed, submitted, signed and verified it", async () => {
    await routes.verify.POST(
      req(`/api/audits/${id}/verify`, { method: "POST", cookie: w.cookies.grower }),
      ctx({ id }),
    );
    const res = await routes.activity.GET(req(`/api/audits/${id}/activity`, { cookie: w.cookies.grower }), ctx({ id }));
    const { activity } = await res.json();
    const actions = activity.map((a: { action: string }) => a.action);
    expect(actions).toEqual(
      expect.arrayContaining([
        "dataset.uploaded",
        "audit.submitted",
        "mail.sent",
        "audit.signed_off",
        "audit.verified",
      ]),
    );
    const texts = activity.map((a: { text: string }) => a.text);
    expect(texts).toContain(
      `${PEOPLE.technician.name} uploaded long-acre-survey.csv (survey, ${w.survey.rowCount} rows).`,
    );
    expect(
      texts.find((t: string) => t.startsWith(`${PEOPLE.qa_lead.name} signed off revision 1 with deviation`)),
    ).toBeTruthy();
    expect(texts).toContain(`${PEOPLE.grower.name} verified it: figures and hash match.`);
  });

  it("revise -- a revision of an audit without stored settings takes the field's time zone, as a new audit does", async () => {
    const rid = await cloneAudit(w.db, w.base.id, "returned");
    // An audit whose settings were never stored (e.g. one that failed before computing): nothing to carry over.
    await w.db.execute(sql`update "audit" set "settings" = null where "id" = ${rid}`);
    const rows = await w.db.execute(sql`select "time_zone" from "field" where "id" = ${w.fieldId}`);
    const fieldZone = (rows.rows[0] as { time_zone: string }).time_zone;
    expect(fieldZone).not.toBe("UTC");
    const rev = await call("revise", "technician", rid, {});
    expect(rev.status).toBe(201);
    const { audit: second } = await rev.json();
    expect(second.settings.timeZone).toBe(fieldZone);
  });
});
