import { describe, expect, it } from "vitest";
import { ROLES, isRole } from "@/lib/roles";
import { isStoredRole } from "./roles";

describe("isStoredRole", () => {
  it("isStoredRole -- agrees with lib/roles on our four roles", () => {
    for (const role of ROLES) expect(isStoredRole(role)).toBe(true);
  });

  it("isStoredRole -- refuses other values, inherited keys included", () => {
    for (const value of ["admin", "member", "Owner", "", "toString", "__proto__", "constructor", null, 3, undefined]) {
      expect(isStoredRole(value)).toBe(false);
      expect(isStoredRole(value)).toBe(isRole(value));
    }
  });
});
