import "server-only";
import type { DB } from "@/db/client";
import {
  failAudit,
  listInterruptedAudits,
  removeAuditRows,
  resumeInterruptedAudit,
  type InterruptedAudit,
} from "@/db/queries/audits";
import { computeStoredAudit } from "@/lib/server/audits/run-audit";

/** How often an interrupted audit is started again before it is marked failed instead. */
export const RESUME_LIMIT = 2;

/** The progress stages in plain words, for the failure reason a person reads. */
const STAGE_WORDS: Record<string, string> = {
  queued: "waiting to start",
  loading: "loading the files",
  computing: "starting the engine",
  pairing: "pairing",
  statistics: "statistics",
  saving: "saving the results",
};

export type RecoveryDecision = { kind: "resume"; resumption: number } | { kind: "fail"; times: number; error: string };

/**
 * What to do with an audit found "computing" at start-up: start it again, unless it was already started again
 * `RESUME_LIMIT` times and died each time — then it fails with a reason, and a person may compute it again.
 */
export function recoveryDecision(a: Pick<InterruptedAudit, "stage" | "resumptions">): RecoveryDecision {
  if (a.resumptions < RESUME_LIMIT) return { kind: "resume", resumption: a.resumptions + 1 };
  const times = a.resumptions + 1;
  return {
    kind: "fail",
    times,
    error:
      `The server stopped while this audit was computing (stage: ${STAGE_WORDS[a.stage] ?? a.stage}), ${times} times; ` +
      "it was not started again. Very large files can need more memory than the server has: check the two files, " +
      "then compute it again.",
  };
}

export interface RecoveryReport {
  resumed: { id: string; stage: string; resumption: number }[];
  failed: { id: string; stage: string; times: number }[];
  /** Resolves when every resumed audit has finished computing (or failed). */
  done: Promise<void>;
}

/**
 * At start-up, before any request: every audit still "computing" was interrupted (PGlite runs in this one
 * process, so no other process can be computing it). Each is started again from its stored inputs, one after
 * another in the background, or marked failed after `RESUME_LIMIT` resumptions. One console line per audit.
 */
export async function recoverInterruptedAudits(
  db: DB,
  opts: { log?: (line: string) => void } = {},
): Promise<RecoveryReport> {
  const log = opts.log ?? ((line: string) => console.log(line));
  const found = await listInterruptedAudits(db);
  const report: RecoveryReport = { resumed: [], failed: [], done: Promise.resolve() };
  const queue: InterruptedAudit[] = [];
  for (const a of found) {
    const decision = recoveryDecision(a);
    if (decision.kind === "fail") {
      await removeAuditRows(db, { id: a.id });
      await failAudit(db, { id: a.id, orgId: a.orgId, error: decision.error });
      report.failed.push({ id: a.id, stage: a.stage, times: decision.times });
      log(
        `[plotproof] audit ${a.id} (${a.title}) was interrupted at stage ${a.stage} for the ${ordinal(decision.times)} time: marked failed.`,
      );
    } else {
      queue.push(a);
      report.resumed.push({ id: a.id, stage: a.stage, resumption: decision.resumption });
      log(
        `[plotproof] audit ${a.id} (${a.title}) was interrupted at stage ${a.stage}: computing it again (resumption ${decision.resumption} of ${RESUME_LIMIT}).`,
      );
    }
  }
  // One at a time: several large audits at once may be what stopped the server.
  report.done = (async () => {
    for (const a of queue) {
      const started = await resumeInterruptedAudit(db, {
        id: a.id,
        orgId: a.orgId,
        stage: a.stage,
        resumption: a.resumptions + 1,
        limit: RESUME_LIMIT,
      });
      if (started) await computeStoredAudit(db, { id: a.id, orgId: a.orgId });
    }
  })().catch((err) => console.error("[plotproof] resuming interrupted audits failed", err));
  return report;
}

function ordinal(n: number): string {
  return n === 1 ? "first" : n === 2 ? "second" : n === 3 ? "third" : `${n}th`;
}
