import "server-only";
import type { DB } from "@/db/client";
import { getSignoff, recordVerification, type AuditReviewRow } from "@/db/queries/review";
import type { Viewer } from "@/lib/server/access";
import { sha256Hex } from "@/lib/review/hash";
import { hashRecord, type RecordSigner, type SignedRecord } from "@/lib/review/record";
import { jsonDifferences } from "@/lib/review/diff";
import type { VerificationCheckDto, VerificationDto } from "@/lib/review/types";
import { ENGINE_VERSION, engineVersionOf } from "@/lib/audit/engine-version";
import { recomputeRecordBody, storedRecordBody, withSigner, type RecordBody } from "./record-sources";
import { actorOf } from "./review-service";

/**
 * Verify an audit: re-read its raw files, compute it again, and compare with what is stored — and,
 * when it is signed off, with the record and hash stored at sign-off. Changes nothing but the log.
 */
export async function verifyAudit(viewer: Viewer, db: DB, audit: AuditReviewRow): Promise<VerificationDto> {
  const signoff = await getSignoff(db, { auditId: audit.id, orgId: audit.orgId });
  const checks: VerificationCheckDto[] = [];
  let signedRecord: SignedRecord | null = null;
  let signer: RecordSigner | null = null;

  if (signoff) {
    const recordHash = sha256Hex(signoff.canonicalText);
    const intact = recordHash === signoff.sha256;
    checks.push({
      id: "record",
      ok: intact,
      label: "Sign-off record intact",
      text: intact
        ? `The stored record hashes to the signed SHA-256 ${short(signoff.sha256)}.`
        : `The stored record hashes to ${short(recordHash)}, not to the signed ${short(signoff.sha256)}: the record itself was changed.`,
    });
    try {
      signedRecord = JSON.parse(signoff.canonicalText) as SignedRecord;
    } catch {
      signedRecord = null;
    }
    signer = signedRecord?.signoff ?? null;
  }

  const storeProblems: string[] = [];
  const stored = await storedRecordBody(db, audit, storeProblems);
  if (storeProblems.length)
    checks.push({
      id: "stored-files",
      ok: false,
      label: "Stored report files intact",
      text: storeProblems.join(" "),
    });
  const reference: RecordBody = signedRecord
    ? { audit: signedRecord.audit, inputs: signedRecord.inputs, results: signedRecord.results }
    : stored;
  const recomputed = await recomputeRecordBody(db, audit, stored);
  // Computed under older rules: a different re-computation says the engine changed, not the audit. The integrity
  // of what was signed rests on the hashes of the record, the raw files and the stored results.
  const computedBy = engineVersionOf(reference.results.summary);
  const olderEngine = computedBy !== ENGINE_VERSION;
  const engineNote = `This audit was computed by engine version ${computedBy}; today's engine (version ${ENGINE_VERSION}) has changed its rules since, so computing it again gives different results. That is not a change to the audit: its record, raw files and stored results are checked above.`;

  for (const f of recomputed.files) {
    const signedSha = signedRecord?.inputs[f.kind].sha256 ?? f.storedSha256;
    const same = f.rawSha256 !== null && f.rawSha256 === f.storedSha256 && f.rawSha256 === signedSha;
    checks.push({
      id: "raw-files",
      ok: same && !f.problem,
      label: `Raw ${f.kind === "planted" ? "as-planted" : "survey"} file unchanged`,
      text: f.problem
        ? `${f.fileName}: ${f.problem}.`
        : same
          ? `${f.fileName} still hashes to ${short(f.rawSha256!)}.`
          : `${f.fileName} now hashes to ${short(f.rawSha256 ?? "–")}; the upload recorded ${short(f.storedSha256)}${signedRecord ? ` and the sign-off ${short(signedSha)}` : ""}.`,
    });
    if (f.pointsMatch !== null) {
      checks.push({
        id: "stored-points",
        ok: f.pointsMatch,
        label: `Stored ${f.kind === "planted" ? "as-planted" : "survey"} points match the raw file`,
        text: f.pointsMatch
          ? "Reading the raw file again gives exactly the stored coordinates."
          : "The stored coordinates differ from what the raw file holds.",
      });
    }
  }

  if (signedRecord) {
    const diffs = jsonDifferences(reference, stored);
    checks.push({
      id: "stored-results",
      ok: diffs.length === 0,
      label: "Stored results as signed",
      text:
        diffs.length === 0
          ? "Figures, verdict, per-plant rows and reports in the database are exactly those that were signed."
          : `The database no longer holds what was signed: ${describeDiffs(diffs)}.`,
      differences: diffs,
    });
  }
  if (recomputed.body) {
    const diffs = jsonDifferences(reference, recomputed.body);
    const byOlderEngine = diffs.length > 0 && olderEngine;
    checks.push({
      id: "recomputed-results",
      ok: diffs.length === 0 || byOlderEngine,
      ...(byOlderEngine ? { informational: true } : {}),
      label: byOlderEngine
        ? `Re-computed with today's engine (version ${ENGINE_VERSION})`
        : signedRecord
          ? "Re-computed results as signed"
          : "Re-computed results as stored",
      text:
        diffs.length === 0
          ? "Computing the audit again from the raw files gives exactly the same figures, verdict, per-plant rows and reports."
          : byOlderEngine
            ? `${engineNote} Differences: ${describeDiffs(diffs)}.`
            : `Computing again from the raw files gives different results: ${describeDiffs(diffs)}.`,
      differences: diffs,
    });
  } else {
    checks.push({
      id: "recomputed-results",
      ok: false,
      label: "Re-computed from the raw files",
      text: recomputed.problem ?? "The audit could not be computed again.",
    });
  }

  let storedSha256: string | null = null;
  let recomputedSha256: string | null = null;
  if (signoff && signer) {
    storedSha256 = hashRecord(withSigner(stored, signer)).sha256;
    checks.push({
      id: "stored-hash",
      ok: storedSha256 === signoff.sha256,
      label: "Hash of the stored audit",
      text:
        storedSha256 === signoff.sha256
          ? `The audit as stored hashes to the signed ${short(signoff.sha256)}.`
          : `The audit as stored hashes to ${short(storedSha256)}, not to the signed ${short(signoff.sha256)}.`,
    });
    if (recomputed.body) {
      recomputedSha256 = hashRecord(withSigner(recomputed.body, signer)).sha256;
      const same = recomputedSha256 === signoff.sha256;
      checks.push({
        id: "recomputed-hash",
        ok: same || olderEngine,
        ...(!same && olderEngine ? { informational: true } : {}),
        label: "Hash of the re-computed audit",
        text: same
          ? `Re-computed from the raw files, the audit hashes to the signed ${short(signoff.sha256)}.`
          : olderEngine
            ? `Re-computed with today's engine, the audit hashes to ${short(recomputedSha256)}, not to the signed ${short(signoff.sha256)}: engine version ${computedBy} computed what was signed.`
            : `Re-computed from the raw files, the audit hashes to ${short(recomputedSha256)}, not to the signed ${short(signoff.sha256)}.`,
      });
    }
  }

  // A sentence that ends on a shortened hash ends on its ellipsis.
  for (const c of checks) c.text = c.text.replace(/…\.$/, "…");
  const ok = checks.every((c) => c.ok);
  const failed = checks.filter((c) => !c.ok).map((c) => c.label);
  await recordVerification(db, {
    auditId: audit.id,
    orgId: audit.orgId,
    revision: audit.revision,
    actor: actorOf(viewer),
    ok,
    failed,
    sha256: signoff?.sha256 ?? null,
  });
  return {
    auditId: audit.id,
    ok,
    signed: !!signoff,
    signedSha256: signoff?.sha256 ?? null,
    storedSha256,
    recomputedSha256,
    checks,
    verifiedAt: new Date().toISOString(),
    verifiedBy: viewer.name,
  };
}

const short = (sha: string) => (sha.length > 16 ? `${sha.slice(0, 16)}…` : sha);

function describeDiffs(diffs: { path: string; signed: unknown; now: unknown }[]): string {
  const shown = diffs.slice(0, 4).map((d) => `${d.path} was ${fmt(d.signed)}, is ${fmt(d.now)}`);
  return shown.join("; ") + (diffs.length > 4 ? ` and ${diffs.length - 4} more` : "");
}

function fmt(v: unknown): string {
  if (typeof v === "string") return v.length > 20 ? `${v.slice(0, 16)}…` : v;
  if (typeof v === "number") return String(Number(v.toPrecision(6)));
  if (v === undefined) return "missing";
  const s = JSON.stringify(v);
  return s.length > 40 ? `${s.slice(0, 37)}…` : s;
}
