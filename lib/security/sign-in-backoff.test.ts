import { describe, expect, it } from "vitest";
import { afterFailure, FAILURE_MEMORY_SECONDS, MAX_WAIT_SECONDS, secondsLocked, waitAfter } from "./sign-in-backoff";

const t0 = new Date("2026-12-03T08:00:00Z");
const later = (s: number) => new Date(t0.getTime() + s * 1000);

describe("sign-in backoff", () => {
  it("waitAfter -- four free failures, then 30 s doubling to a 15-minute ceiling", () => {
    expect([1, 2, 3, 4].map(waitAfter)).toEqual([0, 0, 0, 0]);
    expect([5, 6, 7, 8].map(waitAfter)).toEqual([30, 60, 120, 240]);
    expect(waitAfter(30)).toBe(MAX_WAIT_SECONDS);
  });

  it("afterFailure -- counts a run and locks from the fifth failure", () => {
    let r = null;
    for (let i = 0; i < 5; i++) r = afterFailure(r, later(i));
    expect(r!.failures).toBe(5);
    expect(secondsLocked(r, later(4))).toBe(30);
    expect(secondsLocked(r, later(20))).toBe(14);
    expect(secondsLocked(r, later(40))).toBe(0);
  });

  it("afterFailure -- a run older than a day starts again", () => {
    let r = null;
    for (let i = 0; i < 6; i++) r = afterFailure(r, later(i));
    const fresh = afterFailure(r, later(FAILURE_MEMORY_SECONDS + 10));
    expect(fresh.failures).toBe(1);
    expect(fresh.lockedUntil).toBeNull();
  });

  it("secondsLocked -- nothing recorded, nothing to wait", () => {
    expect(secondsLocked(null, t0)).toBe(0);
  });
});
