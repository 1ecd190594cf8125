import "server-only";
import { getDb, type DB } from "@/db/client";
import { getDatasetById, loadDatasetPoints } from "@/db/queries/datasets";
import { getProfileById } from "@/db/queries/profiles";
import { getAuditById } from "@/db/queries/audits";
import {
  createRevisionRow,
  getAuditForReview,
  getRevisionOf,
  getSignoff,
  listReviewEvents,
  listRevisions,
  signOffAudit as storeSignoff,
  transitionAudit,
  type Actor,
  type AuditReviewRow,
} from "@/db/queries/review";
import { computeStoredAudit } from "@/lib/server/audits/run-audit";
import { dispatchComputation } from "@/lib/server/jobs/queue";
import { notifyDecision, notifySubmitted } from "@/lib/server/mail/notify";
import { AppError, notFound } from "@/lib/errors";
import type { Viewer } from "@/lib/server/access";
import type { AuditDto } from "@/lib/api-types";
import { buildAuditSettings } from "@/lib/audit/settings";
import { routeId } from "@/lib/validation/request";
import { allowedActions, refusal, STATE_NAME, type ReviewAction } from "@/lib/review/lifecycle";
import { evaluateChecklist, medianFinite, namesMatch, tightestLimit } from "@/lib/review/checklist";
import { hashRecord } from "@/lib/review/record";
import type { ReviewDto } from "@/lib/review/types";
import {
  DEVIATION_COMMENT_MIN,
  type ReturnInput,
  type ReviseInput,
  type SignoffInput,
  type SubmitInput,
} from "@/lib/review/validation";
import { requireResults, storedRecordBody, withSigner } from "./record-sources";

const HAS_RESULTS = new Set(["computed", "submitted", "signed_off", "returned"]);

export function actorOf(viewer: Viewer): Actor {
  return { userId: viewer.userId, name: viewer.name, role: viewer.role };
}

/** The audit of this id in the viewer's organisation, else 404 (also for another organisation's audit). */
export async function reviewAuditFor(
  viewer: Viewer,
  params: { id: string },
): Promise<{ db: DB; audit: AuditReviewRow }> {
  const id = routeId(params, "id", "Audit");
  const db = await getDb();
  const audit = await getAuditForReview(db, { id, orgId: viewer.orgId });
  if (!audit) throw notFound("Audit");
  return { db, audit };
}

/** 403 / 409 with the reason when the viewer may not take `action` on the audit now. */
export async function assertMay(db: DB, viewer: Viewer, audit: AuditReviewRow, action: ReviewAction): Promise<void> {
  const hasRevision =
    action === "revise" ? !!(await getRevisionOf(db, { auditId: audit.id, orgId: audit.orgId })) : false;
  const no = refusal(viewer.role, audit.state, action, { hasRevision });
  if (no) throw new AppError(no.status === 403 ? "forbidden" : "conflict", no.message);
}

/** Where the audit stands in review and what the viewer may do next. */
export async function buildReview(
  db: DB,
  viewer: Viewer,
  audit: AuditReviewRow,
  opts: { withCanonical?: boolean } = {},
): Promise<ReviewDto> {
  const [events, signoff, revisedBy, revisions] = await Promise.all([
    listReviewEvents(db, { auditId: audit.id, orgId: audit.orgId }),
    getSignoff(db, { auditId: audit.id, orgId: audit.orgId, withCanonical: opts.withCanonical }),
    getRevisionOf(db, { auditId: audit.id, orgId: audit.orgId }),
    listRevisions(db, { orgId: audit.orgId, seriesId: audit.seriesId ?? audit.id }),
  ]);
  const last = <K extends ReviewDto["events"][number]["kind"]>(kind: K) =>
    [...events].reverse().find((e) => e.kind === kind) ?? null;
  const sub = last("submitted");
  const ret = last("returned");
  const allowed: ReviewDto["allowed"] = allowedActions(viewer.role, audit.state).filter(
    (a) => !(a === "revise" && revisedBy),
  );
  if (HAS_RESULTS.has(audit.state)) allowed.push("verify");
  let signoffDto: ReviewDto["signoff"] = null;
  if (signoff) {
    const { canonicalText: _c, signerId: _s, ...rest } = signoff;
    signoffDto = rest;
  }
  return {
    auditId: audit.id,
    title: audit.title,
    state: audit.state,
    revision: audit.revision,
    revisionOf: audit.revisionOf,
    revisedBy: revisedBy?.id ?? null,
    revisions,
    submitted: sub ? { by: sub.actorName, at: sub.at, note: sub.note } : null,
    returned: ret ? { by: ret.actorName, at: ret.at, reasons: ret.reasons ?? [], comment: ret.note } : null,
    signoff: signoffDto,
    events,
    viewerRole: viewer.role,
    allowed,
  };
}

async function reload(db: DB, viewer: Viewer, id: string): Promise<ReviewDto> {
  const audit = await getAuditForReview(db, { id, orgId: viewer.orgId });
  if (!audit) throw notFound("Audit");
  return buildReview(db, viewer, audit);
}

async function raced(db: DB, viewer: Viewer, id: string, action: ReviewAction): Promise<never> {
  const now = await getAuditForReview(db, { id, orgId: viewer.orgId });
  throw new AppError(
    "conflict",
    now
      ? `Someone else acted first: the audit is now ${STATE_NAME[now.state].toLowerCase()}, so it could not be ${action === "sign_off" ? "signed off" : action === "return" ? "returned" : "submitted"}.`
      : "The audit no longer exists.",
  );
}

export async function submitAudit(
  viewer: Viewer,
  db: DB,
  audit: AuditReviewRow,
  input: SubmitInput,
): Promise<ReviewDto> {
  const note = input.note?.trim() || null;
  const ok = await transitionAudit(db, {
    id: audit.id,
    orgId: viewer.orgId,
    revision: audit.revision,
    from: "computed",
    to: "submitted",
    actor: actorOf(viewer),
    event: { kind: "submitted", note },
    activity: { action: "audit.submitted", detail: { revision: audit.revision, note } },
  });
  if (!ok) await raced(db, viewer, audit.id, "submit");
  await notifySubmitted({ auditId: audit.id, orgId: viewer.orgId, submitterName: viewer.name, note });
  return reload(db, viewer, audit.id);
}

export async function returnAudit(
  viewer: Viewer,
  db: DB,
  audit: AuditReviewRow,
  input: ReturnInput,
): Promise<ReviewDto> {
  const reasons = [...new Set(input.reasons)];
  const ok = await transitionAudit(db, {
    id: audit.id,
    orgId: viewer.orgId,
    revision: audit.revision,
    from: "submitted",
    to: "returned",
    actor: actorOf(viewer),
    event: { kind: "returned", note: input.comment, reasons },
    activity: { action: "audit.returned", detail: { revision: audit.revision, reasons, comment: input.comment } },
  });
  if (!ok) await raced(db, viewer, audit.id, "return");
  await notifyDecision({
    auditId: audit.id,
    orgId: viewer.orgId,
    decision: "returned",
    returnerName: viewer.name,
    reasons,
    comment: input.comment,
  });
  return reload(db, viewer, audit.id);
}

/** The median stated precision of the audit's survey file, metres, or null when it states none. */
export async function surveyPrecision(db: DB, audit: AuditReviewRow): Promise<number | null> {
  if (!audit.surveyDatasetId) return null;
  const survey = await loadDatasetPoints(db, { id: audit.surveyDatasetId, orgId: audit.orgId });
  return medianFinite(survey?.table.precision ?? null);
}

export async function signOff(viewer: Viewer, db: DB, audit: AuditReviewRow, input: SignoffInput): Promise<ReviewDto> {
  requireResults(audit);
  const issues: { path: string[]; message: string }[] = [];
  const checked = evaluateChecklist(
    {
      pairs: audit.summary.pairs,
      minCheckpoints: audit.profile.minCheckpoints,
      tightestLimitM: tightestLimit(audit.profile),
      filePrecisionM: await surveyPrecision(db, audit),
      profileName: audit.profile.name,
      operation: audit.profile.operation,
    },
    input.checklist,
  );
  if (!checked.ok) issues.push(...checked.issues);
  const deviation = !audit.verdict.passed;
  const comment = input.comment?.trim() || null;
  if (deviation && (!comment || comment.length < DEVIATION_COMMENT_MIN)) {
    const failed = audit.verdict.criteria
      .filter((c) => !c.passed)
      .map((c) => c.id)
      .join(", ");
    issues.push({
      path: ["comment"],
      message: `Some criteria failed (${failed}). Signing off accepts the audit with deviation: say why (at least ${DEVIATION_COMMENT_MIN} characters).`,
    });
  }
  if (!namesMatch(input.typedName, viewer.name))
    issues.push({ path: ["typedName"], message: `Type your name as it is on your account (${viewer.name}) to sign.` });
  if (issues.length || !checked.ok) throw new AppError("invalid_input", issues.map((i) => i.message).join(" "), issues);

  const signedAt = new Date();
  const body = await storedRecordBody(db, audit);
  const record = withSigner(body, {
    signerId: viewer.userId,
    signerName: viewer.name,
    signerRole: viewer.role,
    typedName: input.typedName.trim(),
    checklist: checked.record,
    comment,
    deviation,
    signedAt: signedAt.toISOString(),
  });
  const { canonical, sha256 } = hashRecord(record);
  const ok = await storeSignoff(db, {
    auditId: audit.id,
    orgId: viewer.orgId,
    revision: audit.revision,
    actor: actorOf(viewer),
    typedName: input.typedName.trim(),
    checklist: checked.record,
    comment,
    deviation,
    sha256,
    canonical,
    signedAt,
  });
  if (!ok) await raced(db, viewer, audit.id, "sign_off");
  await notifyDecision({ auditId: audit.id, orgId: viewer.orgId, decision: "signed_off" });
  return reload(db, viewer, audit.id);
}

/**
 * Re-run a returned audit as a new revision with the corrections given (other files of the same field,
 * another profile, other pairing settings). The returned audit stays as it is, readable.
 */
export async function reviseAudit(
  viewer: Viewer,
  db: DB,
  previous: AuditReviewRow,
  input: ReviseInput,
  opts: { wait?: boolean } = {},
): Promise<AuditDto> {
  const orgId = viewer.orgId;
  const issues: { path: string[]; message: string }[] = [];
  const plantedId = input.plantedDatasetId ?? previous.plantedDatasetId;
  const surveyId = input.surveyDatasetId ?? previous.surveyDatasetId;
  const profileId = input.profileId ?? previous.profileId;
  const [planted, survey, profile] = await Promise.all([
    plantedId ? getDatasetById(db, { id: plantedId, orgId }) : null,
    surveyId ? getDatasetById(db, { id: surveyId, orgId }) : null,
    profileId ? getProfileById(db, { id: profileId, orgId }) : null,
  ]);
  if (!planted || planted.fieldId !== previous.fieldId || planted.kind !== "planted")
    issues.push({ path: ["plantedDatasetId"], message: "Choose as-planted records of this field." });
  if (!survey || survey.fieldId !== previous.fieldId || survey.kind !== "survey")
    issues.push({ path: ["surveyDatasetId"], message: "Choose a survey of this field." });
  if (!profile)
    issues.push({ path: ["profileId"], message: "Choose a tolerance profile (the one used before no longer exists)." });
  if (issues.length) throw new AppError("invalid_input", issues.map((i) => i.message).join(" "), issues);

  const settings = buildAuditSettings({
    field: { crs: previous.fieldCrs, timeZone: previous.fieldTimeZone },
    chosen: { match: input.match, maxDistanceM: input.maxDistanceM, rowBearingDeg: input.rowBearingDeg },
    previous: { settings: previous.settings, rowBearingDerived: previous.summary?.rowBearingSource === "derived" },
  });
  const { builtIn: _b, note: _n, updatedAt: _u, ...snapshot } = profile!;
  const title = input.title ?? previous.title;
  const id = await createRevisionRow(db, {
    previous,
    actor: actorOf(viewer),
    plantedDatasetId: planted!.id,
    surveyDatasetId: survey!.id,
    profileId: profile!.id,
    profileSnapshot: snapshot,
    settings,
    title,
  });
  if (!id)
    throw new AppError("conflict", "This returned audit already has a corrected revision; continue with that one.");
  await dispatchComputation(db, { auditId: id, orgId, plants: planted!.rowCount }, computeStoredAudit, opts);
  return (await getAuditById(db, { id, orgId }))!;
}
