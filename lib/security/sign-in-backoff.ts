/**
 * Per-account backoff after failed sign-ins (pure). The first few mistakes cost nothing; from the
 * fifth in a row the account waits, twice as long after each further failure, at most 15 minutes.
 * Guessing stays slow wherever the attempts come from, while the real person is never locked out for
 * long (NIST SP 800-63B §5.2.2 asks for a limit on consecutive failed attempts and allows waits
 * between them instead of a permanent lock).
 */

/** Failures allowed before the first wait. */
export const FREE_FAILURES = 4;
/** The first wait, then doubled per failure. */
export const FIRST_WAIT_SECONDS = 30;
/** The longest wait. */
export const MAX_WAIT_SECONDS = 15 * 60;
/** A run of failures older than this starts again from zero. */
export const FAILURE_MEMORY_SECONDS = 24 * 60 * 60;

export interface FailureRecord {
  failures: number;
  lastFailedAt: Date;
  lockedUntil: Date | null;
}

/** Seconds to wait after `failures` consecutive failures (0 while within the free ones). */
export function waitAfter(failures: number): number {
  if (failures <= FREE_FAILURES) return 0;
  return Math.min(MAX_WAIT_SECONDS, FIRST_WAIT_SECONDS * 2 ** (failures - FREE_FAILURES - 1));
}

/** The record after one more failure at `now`. */
export function afterFailure(previous: FailureRecord | null, now: Date): FailureRecord {
  const stale = !previous || now.getTime() - previous.lastFailedAt.getTime() > FAILURE_MEMORY_SECONDS * 1000;
  const failures = stale ? 1 : previous.failures + 1;
  const wait = waitAfter(failures);
  return { failures, lastFailedAt: now, lockedUntil: wait ? new Date(now.getTime() + wait * 1000) : null };
}

/** Whole seconds still to wait at `now`, or 0. */
export function secondsLocked(record: FailureRecord | null, now: Date): number {
  if (!record?.lockedUntil) return 0;
  return Math.max(0, Math.ceil((record.lockedUntil.getTime() - now.getTime()) / 1000));
}
