import { describe, expect, it } from "vitest";
import { API_KEY_SCOPES, keyScopeAllows, scopeRefusal } from "./key-scope";

const FIELD = "0b6f3c1e-8d1a-4c55-9a51-2f3e4d5c6b7a";

describe("keyScopeAllows", () => {
  it("keyScopeAllows -- a full key may do anything its role allows", () => {
    for (const method of ["GET", "POST", "PATCH", "DELETE"])
      for (const path of ["/api/audits", "/api/team", "/api/keys", `/api/fields/${FIELD}`])
        expect(keyScopeAllows("full", method, path)).toBe(true);
  });

  it("keyScopeAllows -- a read key may send GET and HEAD only", () => {
    expect(keyScopeAllows("read", "GET", "/api/audits")).toBe(true);
    expect(keyScopeAllows("read", "get", "/api/team")).toBe(true);
    expect(keyScopeAllows("read", "HEAD", `/api/fields/${FIELD}`)).toBe(true);
    expect(keyScopeAllows("read", "GET", "/fields")).toBe(true); // a page
    for (const method of ["POST", "PUT", "PATCH", "DELETE", "OPTIONS"])
      expect(keyScopeAllows("read", method, "/api/audits")).toBe(false);
    expect(keyScopeAllows("read", "POST", "/fields")).toBe(false); // a server action
  });

  it("keyScopeAllows -- an upload key may list and read fields, upload and read datasets", () => {
    expect(keyScopeAllows("upload", "GET", "/api/fields")).toBe(true);
    expect(keyScopeAllows("upload", "GET", `/api/fields/${FIELD}`)).toBe(true);
    expect(keyScopeAllows("upload", "POST", `/api/fields/${FIELD}/datasets`)).toBe(true);
    expect(keyScopeAllows("upload", "GET", `/api/fields/${FIELD}/datasets`)).toBe(true);
    expect(keyScopeAllows("upload", "GET", "/api/datasets/d1")).toBe(true);
    expect(keyScopeAllows("upload", "GET", "/api/datasets/d1/file")).toBe(true);
    expect(keyScopeAllows("upload", "GET", "/api/fields/")).toBe(true); // trailing slash, same route
    expect(keyScopeAllows("upload", "GET", "/api/machines")).toBe(true); // to name the machine in the upload
  });

  it("keyScopeAllows -- an upload key may do nothing else", () => {
    const refused: [string, string][] = [
      ["POST", "/api/audits"],
      ["GET", "/api/audits"],
      ["POST", "/api/fields"], // creating a field
      ["PATCH", `/api/fields/${FIELD}`],
      ["DELETE", `/api/fields/${FIELD}`],
      ["DELETE", "/api/datasets/d1"],
      ["PATCH", "/api/datasets/d1"],
      ["GET", "/api/team"],
      ["GET", "/api/keys"],
      ["POST", "/api/keys"],
      ["GET", `/api/fields/${FIELD}/map`],
      ["GET", `/api/fields/${FIELD}/derived`],
      ["GET", "/api/me"],
      ["POST", "/api/machines"],
      ["GET", "/api/machines/m1/season"],
      ["PUT", "/api/alerts/rules"],
      ["GET", "/fields"], // a page
      ["POST", `/fields/${FIELD}`], // a server action
      ["GET", "/api/fields/x/datasets/../../../team"],
      ["GET", "/api/fields/%2e%2e"],
      ["GET", "/api"],
      ["GET", "/"],
    ];
    for (const [method, path] of refused)
      expect(keyScopeAllows("upload", method, path), `${method} ${path}`).toBe(false);
  });

  it("keyScopeAllows -- an unknown scope allows nothing", () => {
    expect(keyScopeAllows("admin" as never, "GET", "/api/fields")).toBe(false);
  });
});

describe("scopeRefusal", () => {
  it("scopeRefusal -- names the scope, what it allows and what was asked", () => {
    const m = scopeRefusal("upload", "post", "/api/audits");
    expect(m).toContain('scope "upload"');
    expect(m).toContain("uploading files to a field");
    expect(m).toContain("POST /api/audits");
    expect(scopeRefusal("read", "DELETE", "/api/keys/k1")).toContain("GET requests");
  });

  it("scopeRefusal -- has a sentence for every scope", () => {
    for (const scope of API_KEY_SCOPES) expect(scopeRefusal(scope, "GET", "/x")).toMatch(/^This API key is .+\.$/);
  });
});
