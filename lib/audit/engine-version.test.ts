import { describe, expect, it } from "vitest";
import { ENGINE_VERSION, engineVersionOf } from "./engine-version";

describe("engineVersionOf", () => {
  it("engineVersionOf -- a summary without the key is version 1; a stored number is kept", () => {
    expect(engineVersionOf({ pairs: 3 })).toBe(1);
    expect(engineVersionOf(null)).toBe(1);
    expect(engineVersionOf({ engineVersion: 2 })).toBe(2);
    expect(engineVersionOf({ engineVersion: "2" })).toBe(1);
    expect(ENGINE_VERSION).toBeGreaterThanOrEqual(2);
  });
});
