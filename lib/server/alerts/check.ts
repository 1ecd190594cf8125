import "server-only";
import type { DB } from "@/db/client";
import { getAlertRules, storeAlertBreaches } from "@/db/queries/alerts";
import { getAuditById } from "@/db/queries/audits";
import { logActivity } from "@/db/queries/activity";
import { getOrganisationName, listMembersWithRoles } from "@/db/queries/team";
import { type AlertFinding, type AlertThresholds, evaluateAlerts } from "@/lib/audit/alerts";
import { MAILED_ON_ALERT } from "@/lib/roles";
import { diagnosticsOf, previousAuditFor } from "@/lib/server/audits/diagnostics";
import { mailConfig } from "@/lib/server/mail/config";
import { deliver } from "@/lib/server/mail/send";
import { auditAlertMail } from "@/lib/server/mail/templates";

/**
 * Check a freshly computed audit against its organisation's alert thresholds: store the breaches (replacing any
 * found by an earlier computation of the same audit; one found again keeps its acknowledgement) and e-mail the new
 * ones to the owners and QA leads. Returns the new breaches. Throws on a database error; the caller
 * (scheduleAlertCheck) logs it.
 */
export async function checkAuditAlerts(db: DB, { id, orgId }: { id: string; orgId: string }): Promise<AlertFinding[]> {
  const rules = await getAlertRules(db, { orgId });
  const thresholds: AlertThresholds = {
    armCrossOffsetM: rules.armCrossOffsetM,
    rmseRise: rules.rmseRise,
    failedVerdict: rules.failedVerdict,
  };
  if (thresholds.armCrossOffsetM === null && thresholds.rmseRise === null && !thresholds.failedVerdict) return [];
  const audit = await getAuditById(db, { id, orgId });
  if (!audit?.summary) return [];
  const current = await diagnosticsOf(orgId, {
    id: audit.id,
    plantedDatasetId: audit.planted?.id ?? null,
    crs: audit.summary.crs,
    confidence: audit.summary.confidence,
  });
  let previous: Parameters<typeof evaluateAlerts>[2] = null;
  if (thresholds.rmseRise !== null) {
    const prev = await previousAuditFor(orgId, {
      id: audit.id,
      createdAt: audit.createdAt,
      fieldId: audit.field.id,
      plantedDatasetId: audit.planted?.id ?? null,
    });
    if (prev) {
      const before = await diagnosticsOf(orgId, {
        id: prev.row.id,
        plantedDatasetId: prev.row.plantedDatasetId,
        crs: prev.row.summary.crs,
        confidence: prev.row.summary.confidence,
      });
      previous = { auditId: prev.row.id, title: prev.row.title, basis: prev.basis, rmseR: before.headline.rmseR };
    }
  }
  const findings = evaluateAlerts(
    thresholds,
    {
      arms: current.arms.map((a) => ({
        arm: a.arm,
        crossMean: a.cross.mean,
        crossSignificant: a.cross.significant,
        n: a.cross.n,
        basis: a.basis,
      })),
      rmseR: current.headline.rmseR,
      passed: audit.verdict?.passed ?? null,
      failedCriteria: (audit.verdict?.criteria ?? []).filter((c) => !c.passed).map((c) => c.text),
    },
    previous,
  );
  const fresh = await storeAlertBreaches(db, { orgId, auditId: id, findings });
  if (!fresh.length) return fresh;
  await logActivity(db, {
    orgId,
    actorId: null,
    action: "alert.raised",
    subjectType: "audit",
    subjectId: id,
    detail: { kinds: fresh.map((f) => f.kind) },
  });
  const [to, orgName] = await Promise.all([
    listMembersWithRoles(db, { orgId, roles: MAILED_ON_ALERT }),
    getOrganisationName(db, { orgId }),
  ]);
  const base = mailConfig().appUrl;
  await deliver(
    auditAlertMail({
      title: audit.title,
      fieldName: audit.field.name,
      orgName: orgName ?? "your organisation",
      revision: audit.revision,
      link: `${base}/audits/${id}/diagnostics`,
      alertsLink: `${base}/alerts`,
      machineName: audit.machine?.name ?? null,
      breaches: fresh.map((f) => f.message),
    }),
    to.map((m) => m.email),
    { orgId, subject: { type: "audit", id } },
  );
  return fresh;
}

const pending = new Set<Promise<void>>();

/**
 * Run the alert check after an audit's results are stored, without holding up or failing the computation:
 * it starts on the next turn of the event loop, and an error is logged, never thrown.
 */
export function scheduleAlertCheck(db: DB, audit: { id: string; orgId: string }): void {
  const run = new Promise<void>((resolve) => setImmediate(resolve))
    .then(() => checkAuditAlerts(db, audit))
    .then(
      () => {},
      (err) => console.error(`[plotproof] alert check of audit ${audit.id} failed`, err),
    );
  pending.add(run);
  void run.finally(() => pending.delete(run));
}

/** Wait for the alert checks started so far (the demo seed and tests, before reading what they stored). */
export async function settleAlertChecks(): Promise<void> {
  while (pending.size) await Promise.all([...pending]);
}
