import { describe, expect, it } from "vitest";
import { apiKeyInput, keyExpiryInstant } from "./api-key";

const NOW = new Date("2026-03-10T15:00:00Z");

describe("apiKeyInput", () => {
  it("apiKeyInput -- scope defaults to full and expiry to none, as for keys made before scopes", () => {
    expect(apiKeyInput(NOW).parse({ name: "Planter" })).toEqual({ name: "Planter", scope: "full", expiresOn: null });
  });

  it("apiKeyInput -- an expiry date becomes the start of that day, UTC", () => {
    const r = apiKeyInput(NOW).parse({ name: "Planter", scope: "upload", expiresOn: "2026-03-11" });
    expect(r.scope).toBe("upload");
    expect(r.expiresOn?.toISOString()).toBe("2026-03-11T00:00:00.000Z");
  });

  it("apiKeyInput -- refuses today, past days, impossible dates and unknown scopes", () => {
    for (const expiresOn of ["2026-03-10", "2025-12-31", "2026-02-30", "11/03/2026"])
      expect(apiKeyInput(NOW).safeParse({ name: "x", expiresOn }).success, expiresOn).toBe(false);
    expect(apiKeyInput(NOW).safeParse({ name: "x", scope: "admin" }).success).toBe(false);
  });
});

describe("keyExpiryInstant", () => {
  it("keyExpiryInstant -- null for anything but a real calendar day", () => {
    expect(keyExpiryInstant("2028-02-29")?.toISOString()).toBe("2028-02-29T00:00:00.000Z");
    expect(keyExpiryInstant("2027-02-29")).toBeNull();
    expect(keyExpiryInstant("2027-2-1")).toBeNull();
  });
});
