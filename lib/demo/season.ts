import "server-only";
/**
 * The demo season: as-planted records and surveys of several planting dates on the demo fields, audited over the
 * months and taken through review — one signed off, one returned with reasons, one awaiting review, one computed,
 * one failing its profile with the reasons — so the diagnostics, comparison and season pages have something to show on first
 * start. Invented data for the demo only (error model: lib/demo/generate.ts; every planting has arm 3 off by +3 mm
 * cross-row and a float-fix stretch in bed 3, rows 2–3, plants 31–110; the June planting of Long Acre was recorded
 * with wrong base-station coordinates, a shift of the whole pass). Each as-planted upload names its machine
 * (DEMO_MACHINES), and the organisation starts with alert thresholds (DEMO_ALERT_RULES) the season's audits cross.
 */
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { user } from "@/db/schema";
import { listProfiles } from "@/db/queries/profiles";
import { getAuditForReview } from "@/db/queries/review";
import { createMachine } from "@/db/queries/machines";
import { saveAlertRules } from "@/db/queries/alerts";
import { settleAlertChecks } from "@/lib/server/alerts/check";
import type { Role } from "@/lib/roles";
import type { Viewer } from "@/lib/server/access";
import { startAudit } from "@/lib/server/audits/run-audit";
import { ingestDataset } from "@/lib/server/datasets/ingest-dataset";
import { returnAudit, signOff, submitAudit } from "@/lib/server/review/review-service";
import { DEMO_FIELDS, DEMO_ORG, DEMO_PEOPLE, type DemoFieldSpec } from "./farm";
import { DEMO_PLANTED_CRS, DEMO_SURVEY_CRS, generateDemoFiles } from "./generate";

/** Where an audit of the season ends up; "failed" is computed with a failed verdict (its reasons in the verdict). */
export type SeasonOutcome = "signed_off" | "returned" | "submitted" | "computed" | "failed";

export interface SeasonAuditSpec {
  field: "Long Acre" | "Willow Strip";
  title: string;
  /** Planting start, UTC. */
  startUtc: string;
  seed: number;
  profile: string;
  outcome: SeasonOutcome;
  shiftE?: number;
  shiftN?: number;
  /** The demo machine that planted it (DEMO_MACHINES). */
  machine: string;
}

/**
 * The demo farm's planting machines (invented). The five-arm transplanter plants Long Acre's five rows a bed and,
 * with four arms set to Willow Strip's rows, the May planting there; the four-arm one planted Willow Strip in June.
 */
export const DEMO_MACHINES = [
  {
    name: "Reedling 5-arm transplanter",
    workingWidthM: 2.5,
    toolArms: 5,
    receiverNotes: "Dual-frequency RTK receiver on the toolbar centre; corrections from the farm's own base station.",
    cameraNotes:
      "Row camera behind each arm corrects the recorded position to the plant; arm 3 camera refitted in March.",
  },
  {
    name: "Sedgeway 4-arm planter",
    workingWidthM: 1.6,
    toolArms: 4,
    receiverNotes: "Single RTK receiver over the rear axle; network corrections.",
    cameraNotes: null,
  },
] as const;

/** Alert thresholds the demo organisation starts with (Alerts page; the season's audits breach them). */
export const DEMO_ALERT_RULES = { armCrossOffsetM: 0.002, rmseRise: 0.3, failedVerdict: true };

/** The season, in planting order. Seeds differ from the files in public/demo, so no upload is a duplicate. */
export const DEMO_SEASON: SeasonAuditSpec[] = [
  {
    field: "Long Acre",
    title: "Long Acre April planting",
    machine: "Reedling 5-arm transplanter",
    startUtc: "2026-04-14T07:10:00Z",
    seed: 2026041401,
    profile: "Inter-row hoeing",
    outcome: "signed_off",
  },
  {
    field: "Willow Strip",
    title: "Willow Strip May planting",
    machine: "Reedling 5-arm transplanter",
    startUtc: "2026-05-05T06:30:00Z",
    seed: 2026050501,
    profile: "Inter-row hoeing",
    outcome: "computed",
  },
  {
    field: "Long Acre",
    title: "Long Acre May planting",
    machine: "Reedling 5-arm transplanter",
    startUtc: "2026-05-19T06:40:00Z",
    seed: 2026051901,
    profile: "In-row weeding around plants",
    outcome: "returned",
  },
  {
    field: "Long Acre",
    title: "Long Acre June planting",
    machine: "Reedling 5-arm transplanter",
    startUtc: "2026-06-16T05:50:00Z",
    seed: 2026061601,
    profile: "Inter-row hoeing",
    outcome: "submitted",
    shiftE: 0.015,
    shiftN: -0.008,
  },
  {
    field: "Willow Strip",
    title: "Willow Strip June planting",
    machine: "Sedgeway 4-arm planter",
    startUtc: "2026-06-23T06:15:00Z",
    seed: 2026062301,
    profile: "Inter-row hoeing",
    outcome: "failed",
  },
];

async function viewerFor(orgId: string, role: Role): Promise<Viewer> {
  const person = DEMO_PEOPLE.find((p) => p.role === role)!;
  const db = await getDb();
  const [row] = await db.select({ id: user.id }).from(user).where(eq(user.email, person.email));
  return { userId: row.id, name: person.name, email: person.email, orgId, orgName: DEMO_ORG.name, role };
}

const encoder = new TextEncoder();

/** ED50 / UTM zone 31N with the usual three-parameter shift to WGS 84 (from memory; demo only). */
const ED50_UTM31 = "+proj=utm +zone=31 +ellps=intl +towgs84=-87,-98,-121,0,0,0,0 +units=m +no_defs";

/**
 * Upload, audit and review the season's plantings as the demo people would (technician uploads and runs the audits,
 * QA lead reviews). The failed audit's survey was uploaded with the wrong reference frame.
 */
export async function seedDemoSeason(orgId: string, fieldIds: Record<string, string>): Promise<void> {
  const db = await getDb();
  const technician = await viewerFor(orgId, "technician");
  const lead = await viewerFor(orgId, "qa_lead");
  const profiles = await listProfiles(db, { orgId });
  const profileId = (name: string) => profiles.find((p) => p.name === name)!.id;
  const machineIds: Record<string, string> = {};
  for (const m of DEMO_MACHINES)
    machineIds[m.name] = (await createMachine(db, { orgId, userId: lead.userId, input: { ...m } })).id;
  await saveAlertRules(db, { orgId, userId: lead.userId, input: DEMO_ALERT_RULES });
  for (const s of DEMO_SEASON) {
    const base = DEMO_FIELDS.find((f) => f.name === s.field)!;
    const spec: DemoFieldSpec = { ...base, startUtc: s.startUtc, seed: s.seed, shiftE: s.shiftE, shiftN: s.shiftN };
    const files = generateDemoFiles(spec);
    const fieldId = fieldIds[s.field];
    const day = s.startUtc.slice(0, 10);
    const slug = s.field.toLowerCase().replace(/\s+/g, "-");
    const upload = (kind: "planted" | "survey", text: string, crs: string) =>
      ingestDataset({
        viewer: technician,
        fieldId,
        kind,
        fileName: `${slug}-${day}-${kind === "planted" ? "as-planted" : "survey"}.csv`,
        contentType: "text/csv",
        bytes: encoder.encode(text),
        crs,
        acceptWarnings: true,
        machineId: kind === "planted" ? machineIds[s.machine] : undefined,
      });
    const planted = await upload("planted", files.plantedCsv, DEMO_PLANTED_CRS);
    // The failed audit: the survey was uploaded as ED50 / UTM 31N although it is ETRS89, so the datum shift moves
    // every checkpoint about a hundred metres and the verdict fails (the upload warned about it; the diagnostics name
    // the reference frame as the likely cause).
    const survey = await upload("survey", files.surveyCsv, s.outcome === "failed" ? ED50_UTM31 : DEMO_SURVEY_CRS);
    const audit = await startAudit(
      technician,
      {
        fieldId,
        plantedDatasetId: planted.dataset.id,
        surveyDatasetId: survey.dataset.id,
        profileId: profileId(s.profile),
        title: s.title,
      } as Parameters<typeof startAudit>[1],
      { wait: true },
    );
    if (s.outcome === "failed" || s.outcome === "computed") continue;
    const row = async () => (await getAuditForReview(db, { id: audit.id, orgId }))!;
    await submitAudit(technician, db, await row(), {
      note: `${s.title}: survey by total station, control mark checked.`,
    });
    if (s.outcome === "returned")
      await returnAudit(lead, db, await row(), {
        reasons: ["wrong_profile", "control_mark"],
        comment:
          "In-row weeding is not planned on this planting; audit it against inter-row hoeing, and record the control mark check.",
      });
    if (s.outcome === "signed_off") {
      const r = await row();
      await signOff(lead, db, r, {
        checklist: {
          checkpoints: true,
          instrument: true,
          instrumentPrecisionMm: 2,
          controlMark: true,
          controlMarkNote: "KF-03 within 2 mm",
          profileFits: true,
        },
        comment: r.verdict?.passed
          ? "Arm 3 reads about 3 mm right of the plants; recalibration booked before the May planting."
          : "Bed 3 float stretch is known; hoeing there stays manual until the fix is restored.",
        typedName: lead.name,
      });
    }
  }
  // The alert checks run in the background after each computation; let them finish before the demo opens.
  await settleAlertChecks();
}
