/** Shared set-up of the review tests: the demo farm, signed-in cookies, the demo files and a computed audit. */
import fs from "node:fs";
import path from "node:path";
import { eq, getTableColumns, sql } from "drizzle-orm";
import { cookieFor, ctx, req, useMemoryDb } from "./helpers";
import type { DB } from "@/db/client";
import { audit, auditPlantedNotFound, auditReport, auditResidual, auditUnpaired } from "@/db/schema";
import { DEMO_PASSWORD, DEMO_PEOPLE, OTHER_OWNER } from "@/lib/demo/farm";
import type { AuditDto, DatasetDto, ToleranceProfileDto } from "@/lib/api-types";

type Person = { name: string; email: string };
export const PEOPLE: Record<"owner" | "qa_lead" | "technician" | "grower" | "other", Person> = {
  ...(Object.fromEntries(DEMO_PEOPLE.map((p) => [p.role, { name: p.name, email: p.email }])) as Record<
    "owner" | "qa_lead" | "technician" | "grower",
    Person
  >),
  other: { name: OTHER_OWNER.name, email: OTHER_OWNER.email },
};
export type Actor = keyof typeof PEOPLE;
export const ACTORS: Actor[] = ["owner", "qa_lead", "technician", "grower", "other"];

const demo = (name: string) => fs.readFileSync(path.join(import.meta.dirname, "../../public/demo", name));

export interface ReviewWorld {
  db: DB;
  cookies: Record<Actor, string>;
  fieldId: string;
  planted: DatasetDto;
  survey: DatasetDto;
  profiles: ToleranceProfileDto[];
  /** A computed audit of Long Acre with the in-row weeding profile (which it fails). */
  base: AuditDto;
}

export async function setUpReviewWorld(): Promise<ReviewWorld> {
  const db = await useMemoryDb();
  const { seedDemo } = await import("@/lib/demo/seed");
  await seedDemo();
  const cookies = {} as Record<Actor, string>;
  for (const p of DEMO_PEOPLE) cookies[p.role] = await cookieFor(p.email, DEMO_PASSWORD);
  cookies.other = await cookieFor(OTHER_OWNER.email, DEMO_PASSWORD);
  const fieldsRoute = await import("@/app/api/fields/route");
  const datasetsRoute = await import("@/app/api/fields/[fieldId]/datasets/route");
  const profilesRoute = await import("@/app/api/profiles/route");
  const fields = (await (await fieldsRoute.GET(req("/api/fields", { cookie: cookies.technician }), ctx({}))).json())
    .fields;
  const fieldId = fields.find((f: { name: string }) => f.name === "Long Acre").id as string;
  const upload = async (file: string, kind: string, crs: string) => {
    const form = new FormData();
    form.set("file", new File([new Uint8Array(demo(file))], file, { type: "text/csv" }));
    form.set("kind", kind);
    form.set("crs", crs);
    form.set("acceptWarnings", "true");
    const res = await datasetsRoute.POST(
      new Request(`http://localhost:3000/api/fields/${fieldId}/datasets`, {
        method: "POST",
        body: form,
        headers: { cookie: cookies.technician },
      }),
      ctx({ fieldId }),
    );
    if (res.status !== 201) throw new Error(`upload ${file}: ${res.status} ${await res.text()}`);
    return (await res.json()).dataset as DatasetDto;
  };
  const planted = await upload("long-acre-as-planted.csv", "planted", "EPSG:4326");
  const survey = await upload("long-acre-survey.csv", "survey", "EPSG:25831");
  const profiles: ToleranceProfileDto[] = (
    await (await profilesRoute.GET(req("/api/profiles", { cookie: cookies.technician }), ctx({}))).json()
  ).profiles;
  const base = await createAudit(
    { cookies, fieldId, planted, survey, profiles },
    "In-row weeding around plants",
    "Long Acre spring check",
  );
  return { db, cookies, fieldId, planted, survey, profiles, base };
}

export async function createAudit(
  w: Pick<ReviewWorld, "cookies" | "fieldId" | "planted" | "survey" | "profiles">,
  profileName: string,
  title: string,
): Promise<AuditDto> {
  const auditsRoute = await import("@/app/api/audits/route");
  const profile = w.profiles.find((p) => p.name === profileName)!;
  const res = await auditsRoute.POST(
    req("/api/audits?wait=1", {
      method: "POST",
      cookie: w.cookies.technician,
      body: JSON.stringify({
        fieldId: w.fieldId,
        plantedDatasetId: w.planted.id,
        surveyDatasetId: w.survey.id,
        profileId: profile.id,
        title,
      }),
    }),
    ctx({}),
  );
  if (res.status !== 201) throw new Error(`audit: ${res.status} ${await res.text()}`);
  const a = (await res.json()).audit as AuditDto;
  if (a.state !== "computed") throw new Error(`audit ended ${a.state}: ${a.error}`);
  return a;
}

/**
 * A copy of a computed audit (row, residuals, unpaired points, reports) put straight into `state`,
 * so each case of the role matrix starts from its own audit without re-running the engine.
 */
export async function cloneAudit(db: DB, baseId: string, state: string): Promise<string> {
  const [src] = await db.select().from(audit).where(eq(audit.id, baseId));
  const { id: _id, createdAt: _c, updatedAt: _u, revisionOf: _r, seriesId: _s, revision: _v, ...rest } = src;
  // Rows go in while the copy is still "computed"; a signed-off audit accepts no new rows.
  const [row] = await db
    .insert(audit)
    .values({ ...rest, state: "computed", title: `${src.title} (${state})` })
    .returning({ id: audit.id });
  for (const table of [auditResidual, auditUnpaired, auditPlantedNotFound, auditReport]) {
    const names = Object.values(getTableColumns(table))
      .map((c) => c.name)
      .filter((n) => n !== "audit_id");
    const list = sql.raw(names.map((n) => `"${n}"`).join(", "));
    await db.execute(
      sql`insert into ${table} ("audit_id", ${list}) select ${row.id}, ${list} from ${table} where "audit_id" = ${baseId}`,
    );
  }
  if (state !== "computed") await db.update(audit).set({ state }).where(eq(audit.id, row.id));
  return row.id;
}

export async function stateOf(db: DB, id: string): Promise<string> {
  const [row] = await db.select({ state: audit.state }).from(audit).where(eq(audit.id, id));
  return row.state;
}

/** A sign-off body that passes every check for `who` (the demo audit fails in-row weeding, so a comment is given). */
export function signoffBody(who: Actor) {
  return {
    // The demo survey's precision column is not one the reader recognises, so the signer states the instrument's 2 mm.
    checklist: {
      checkpoints: true,
      instrument: true,
      instrumentPrecisionMm: 2,
      controlMark: true,
      controlMarkNote: "KF-03 within 2 mm",
      profileFits: true,
    },
    comment: "Bed 3 float stretch is known; in-row weeding stays off bed 3 until replanting.",
    typedName: PEOPLE[who].name,
  };
}

export const returnBody = {
  reasons: ["too_few_checkpoints", "other"],
  comment: "Survey ten more plants in bed 3, rows 2 and 3.",
};
