import { describe, expect, it } from "vitest";
import { AUDIT_STATES, allowedActions, canTransition, refusal, stateName, type LifecycleState } from "./lifecycle";
import { ROLES, type Role } from "@/lib/roles";

// The whole table, written out by hand: [from, to, roles that may].
const EXPECTED: [LifecycleState, LifecycleState, Role[]][] = [
  ["computed", "submitted", ["owner", "qa_lead", "technician"]],
  ["submitted", "signed_off", ["owner", "qa_lead"]],
  ["submitted", "returned", ["owner", "qa_lead"]],
  ["returned", "computing", ["owner", "qa_lead", "technician"]],
  ["failed", "computing", ["owner", "qa_lead", "technician"]],
];

describe("lifecycle", () => {
  it("canTransition -- every role, every pair of states: only the listed moves are allowed", () => {
    for (const role of ROLES) {
      for (const from of AUDIT_STATES) {
        for (const to of AUDIT_STATES) {
          const listed = EXPECTED.some(([f, t, roles]) => f === from && t === to && roles.includes(role));
          expect(canTransition(role, from, to), `${role}: ${from} → ${to}`).toBe(listed);
        }
      }
    }
  });

  it("canTransition -- nothing ever leaves signed_off, for any role", () => {
    for (const role of ROLES) for (const to of AUDIT_STATES) expect(canTransition(role, "signed_off", to)).toBe(false);
  });

  it("canTransition -- a grower never changes anything", () => {
    for (const from of AUDIT_STATES)
      for (const to of AUDIT_STATES) expect(canTransition("grower", from, to)).toBe(false);
  });

  it("allowedActions -- what each role sees on a submitted audit", () => {
    expect(allowedActions("qa_lead", "submitted")).toEqual(["sign_off", "return"]);
    expect(allowedActions("owner", "submitted")).toEqual(["sign_off", "return"]);
    expect(allowedActions("technician", "submitted")).toEqual([]);
    expect(allowedActions("technician", "computed")).toEqual(["submit"]);
    expect(allowedActions("technician", "failed")).toEqual(["recompute"]);
    expect(allowedActions("grower", "failed")).toEqual([]);
  });

  it("refusal -- the role is judged before the state (403), then the state (409)", () => {
    expect(refusal("technician", "signed_off", "sign_off")?.status).toBe(403);
    expect(refusal("grower", "computed", "submit")?.status).toBe(403);
    expect(refusal("qa_lead", "computed", "sign_off")).toEqual({
      status: 409,
      message: "Sign off is only possible when the audit is waiting for sign-off; it is computed, not yet submitted.",
    });
    expect(refusal("owner", "signed_off", "return")?.message).toMatch(/signed off.*can no longer be changed/);
    expect(refusal("technician", "returned", "revise", { hasRevision: true })?.status).toBe(409);
    expect(refusal("technician", "returned", "revise")).toBeNull();
    expect(refusal("grower", "failed", "recompute")?.status).toBe(403);
    expect(refusal("technician", "computing", "recompute")).toEqual({
      status: 409,
      message: "Compute again is only possible for an audit that failed to compute; it is computing.",
    });
    expect(refusal("technician", "failed", "recompute")).toBeNull();
  });
});

describe("stateName", () => {
  it("stateName -- a stored code reads as its plain name; an unknown text never shows as a code", () => {
    expect(stateName("signed_off")).toBe("Signed off");
    expect(stateName("returned")).toBe("Returned for correction");
    expect(stateName("archived")).toBe("Unknown state");
  });
});
