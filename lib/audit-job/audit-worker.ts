/**
 * Worker-thread entry: runs one audit through the engine's entry (lib/audit/run.ts) and posts the outcome, then the rows to
 * store, one batch each time the server asks ("more"), so the server's own thread stays free for
 * other requests meanwhile.
 */
import { parentPort } from "node:worker_threads";
import { IdColumn } from "@/geo/ids";
import { residualDigest, unpairedDigest } from "@/lib/review/record";
import { residualRecordRows, unpairedRecordRows, unpairedSurveyRows } from "@/lib/review/result-rows";
import { encodePlantedNotFound, plantedNotFoundPart } from "@/lib/review/planted-not-found";
import { auditReports, runAudit } from "@/lib/audit/run";
import { ROWS_PER_MESSAGE, type AuditJobInput, type AuditJobMessage } from "./messages";

const port = parentPort!;
const post = (m: AuditJobMessage, transfer: ArrayBuffer[] = []) => port.postMessage(m, transfer);

port.once("message", (job: AuditJobInput) => {
  try {
    // Structured cloning keeps an IdColumn's arrays but not its class.
    job.planted.id = IdColumn.revive(job.planted.id);
    job.survey.id = IdColumn.revive(job.survey.id);
    const outcome = runAudit({
      planted: { table: job.planted, crs: job.plantedCrs },
      survey: { table: job.survey, crs: job.surveyCrs },
      settings: job.settings,
      profile: job.profile,
      onStage: (stage) => post({ type: "stage", stage }),
    });
    if (!outcome.ok) {
      post({
        type: "refused",
        errors: outcome.issues
          .filter((i) => i.severity === "error")
          .map((i) => ({ file: i.file, line: i.line, message: i.message })),
      });
      return;
    }
    // The web app always audits against a profile, so a computed audit always has its verdict.
    if (!outcome.verdict) throw new Error("the audit has no verdict: no tolerance profile was given");
    const reports = auditReports(outcome);
    const residuals = residualRecordRows(outcome.result, outcome.planted, outcome.survey, outcome.settings.timeZone);
    // Stored: the planted records nobody surveyed as one compact value, only the survey-side unpaired points as rows.
    // Verification digests every row, as the readers rebuild them.
    const unpaired = job.digestsOnly
      ? unpairedRecordRows(outcome.pairing, outcome.planted, outcome.survey)
      : unpairedSurveyRows(outcome.pairing, outcome.survey);
    const digests = job.digestsOnly
      ? { residuals: residualDigest(residuals), unpaired: unpairedDigest(unpaired) }
      : undefined;
    const part = job.digestsOnly
      ? null
      : plantedNotFoundPart(outcome.pairing.unmatchedPlanted, job.planted, outcome.planted);
    const plantedNotFound = part
      ? { plants: part.plants, count: part.indices.length, bytes: encodePlantedNotFound(part) }
      : undefined;
    post(
      {
        type: "computed",
        summary: outcome.result.summary,
        verdict: outcome.verdict,
        settings: outcome.settings,
        reports,
        residualCount: residuals.length,
        unpairedCount: unpaired.length,
        digests,
        plantedNotFound,
      },
      [
        ...reports.map((r) => r.bytes.buffer as ArrayBuffer),
        ...(plantedNotFound ? [plantedNotFound.bytes.buffer as ArrayBuffer] : []),
      ],
    );
    // One batch per request: the server asks for the next when it has stored the last, so a million
    // rows never wait as messages on its thread (nor are turned back into objects there all at once).
    function* batches(): Generator<AuditJobMessage> {
      if (job.digestsOnly) return;
      for (let i = 0; i < residuals.length; i += ROWS_PER_MESSAGE)
        yield { type: "residuals", rows: residuals.slice(i, i + ROWS_PER_MESSAGE) };
      for (let i = 0; i < unpaired.length; i += ROWS_PER_MESSAGE)
        yield { type: "unpaired", rows: unpaired.slice(i, i + ROWS_PER_MESSAGE) };
    }
    const next = batches();
    port.on("message", (m: { type: "more" }) => {
      if (m.type !== "more") return;
      const b = next.next();
      post(b.done ? { type: "done" } : b.value);
    });
  } catch (err) {
    post({ type: "error", message: err instanceof Error ? err.message : String(err) });
  }
});
