import { describe, expect, it } from "vitest";
import {
  can,
  MAILED_ON_ALERT,
  MAILED_ON_DECISION,
  MAILED_ON_SUBMIT,
  PERMISSIONS,
  ROLES,
  type Permission,
  type Role,
} from "./roles";

// The permission table, written out by hand: a change to who may do what has to change this file too.
const EXPECTED: Record<Permission, Role[]> = {
  ANY_ROLE: ["owner", "qa_lead", "technician", "grower"],
  CAN_PREPARE: ["owner", "qa_lead", "technician"],
  CAN_REVIEW: ["owner", "qa_lead"],
  CAN_EDIT_PROFILES: ["owner", "qa_lead"],
  CAN_PLAN_SURVEYS: ["owner", "qa_lead"],
  CAN_MANAGE_TEAM: ["owner"],
  CAN_MANAGE_KEYS: ["owner"],
  CAN_READ_OUTBOX: ["owner"],
  CAN_MANAGE_MACHINES: ["owner", "qa_lead"],
  CAN_SET_ALERTS: ["owner", "qa_lead"],
};

describe("roles", () => {
  it("PERMISSIONS -- each permission names exactly its roles, and no permission is missing or extra", () => {
    expect(Object.keys(PERMISSIONS).sort()).toEqual(Object.keys(EXPECTED).sort());
    for (const [permission, roles] of Object.entries(EXPECTED)) {
      expect([...PERMISSIONS[permission as Permission]].sort(), permission).toEqual([...roles].sort());
    }
  });

  it("can -- every role against every permission agrees with the table", () => {
    for (const role of ROLES) {
      for (const [permission, roles] of Object.entries(EXPECTED)) {
        expect(can(role, permission as Permission), `${role} ${permission}`).toBe(roles.includes(role));
      }
    }
  });

  it("can -- a grower only reads", () => {
    const growerMay = (Object.keys(EXPECTED) as Permission[]).filter((p) => can("grower", p));
    expect(growerMay).toEqual(["ANY_ROLE"]);
  });

  it("MAILED_ON_SUBMIT -- QA leads first, owners when there are none; everyone mailed can sign off", () => {
    expect(MAILED_ON_SUBMIT).toEqual([["qa_lead"], ["owner"]]);
    for (const roles of MAILED_ON_SUBMIT) for (const role of roles) expect(can(role, "CAN_REVIEW"), role).toBe(true);
  });

  it("MAILED_ON_DECISION -- the growers hear of sign-offs and returns", () => {
    expect(MAILED_ON_DECISION).toEqual(["grower"]);
  });

  it("MAILED_ON_ALERT -- owners and QA leads hear of alerts; everyone mailed can set the thresholds", () => {
    expect(MAILED_ON_ALERT).toEqual(["owner", "qa_lead"]);
    for (const role of MAILED_ON_ALERT) expect(can(role, "CAN_SET_ALERTS"), role).toBe(true);
  });
});
