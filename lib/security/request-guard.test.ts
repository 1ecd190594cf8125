import { describe, expect, it } from "vitest";
import { originOf, ownOrigins, refuseCrossSite } from "./request-guard";

const OWN = ["http://127.0.0.1:3000"];
const req = (method: string, pathname: string, headers: Record<string, string>) => ({
  method,
  pathname,
  headers: new Headers(headers),
});

describe("refuseCrossSite", () => {
  it("refuseCrossSite -- a read is never refused", () => {
    expect(
      refuseCrossSite(req("GET", "/api/fields", { origin: "http://evil.example", cookie: "s=1" }), OWN),
    ).toBeNull();
  });

  it("refuseCrossSite -- a POST from another origin with the victim's cookie is refused with 403", () => {
    // The attack found: text/plain JSON body, owner's cookie, Origin of another site.
    const r = refuseCrossSite(
      req("POST", "/api/team/invitations", {
        origin: "http://evil.example",
        cookie: "s=1",
        "content-type": "text/plain",
        "content-length": "40",
      }),
      OWN,
    );
    expect(r?.status).toBe(403);
    expect(r?.message).toContain("http://evil.example");
  });

  it("refuseCrossSite -- Sec-Fetch-Site cross-site or same-site is refused even without Origin", () => {
    for (const site of ["cross-site", "same-site"]) {
      const r = refuseCrossSite(req("DELETE", "/api/keys/k1", { "sec-fetch-site": site, cookie: "s=1" }), OWN);
      expect(r?.status).toBe(403);
      expect(r?.message).toContain(site);
    }
  });

  it("refuseCrossSite -- the product's own pages pass", () => {
    const h = {
      origin: "http://127.0.0.1:3000",
      "sec-fetch-site": "same-origin",
      cookie: "s=1",
      "content-type": "application/json",
      "content-length": "2",
    };
    expect(refuseCrossSite(req("POST", "/api/fields", h), OWN)).toBeNull();
    expect(refuseCrossSite(req("PATCH", "/api/profiles/p1", h), OWN)).toBeNull();
  });

  it("refuseCrossSite -- an opaque origin (sandboxed frame, file:) is refused", () => {
    expect(refuseCrossSite(req("POST", "/api/fields", { origin: "null", cookie: "s=1" }), OWN)?.status).toBe(403);
  });

  it("refuseCrossSite -- a same-origin text/plain or form body to the API gets 415 naming the type", () => {
    for (const type of ["text/plain;charset=UTF-8", "application/x-www-form-urlencoded"]) {
      const r = refuseCrossSite(
        req("POST", "/api/fields", { origin: OWN[0], cookie: "s=1", "content-type": type, "content-length": "9" }),
        OWN,
      );
      expect(r?.status).toBe(415);
      expect(r?.message).toContain(type.split(";")[0]);
    }
  });

  it("refuseCrossSite -- a multipart upload and a bodiless POST pass the content-type rule", () => {
    const h = { origin: OWN[0], cookie: "s=1" };
    expect(
      refuseCrossSite(
        req("POST", "/api/fields/f1/datasets", { ...h, "content-type": "multipart/form-data; boundary=x" }),
        OWN,
      ),
    ).toBeNull();
    expect(refuseCrossSite(req("POST", "/api/audits/a1/submit", { ...h, "content-length": "0" }), OWN)).toBeNull();
  });

  it("refuseCrossSite -- the sign-in routes keep their own content types but not a foreign origin", () => {
    const h = { origin: OWN[0], "content-type": "text/plain", "content-length": "5" };
    expect(refuseCrossSite(req("POST", "/api/auth/sign-in/email", h), OWN)).toBeNull();
    expect(
      refuseCrossSite(req("POST", "/api/auth/sign-in/email", { ...h, origin: "http://evil.example" }), OWN)?.status,
    ).toBe(403);
  });

  it("refuseCrossSite -- a script with an API key and no cookie is not a cross-site request", () => {
    const h = { authorization: "Bearer ppk_x", "content-type": "application/json", "content-length": "2" };
    expect(refuseCrossSite(req("POST", "/api/fields", h), OWN)).toBeNull();
  });

  it("refuseCrossSite -- a server action (POST to a page) from this origin passes", () => {
    const h = { origin: OWN[0], cookie: "s=1", "content-type": "text/plain;charset=UTF-8", "content-length": "30" };
    expect(refuseCrossSite(req("POST", "/signup", h), OWN)).toBeNull();
  });
});

describe("originOf", () => {
  it("originOf -- scheme, host and port; nothing for a non-URL", () => {
    expect(originOf("https://plotproof.example:8443/x?y")).toBe("https://plotproof.example:8443");
    expect(originOf("not a url")).toBeNull();
    expect(originOf(undefined)).toBeNull();
  });
});

describe("ownOrigins", () => {
  it("ownOrigins -- the Host the browser used counts without any configured URL (npm run demo on localhost)", () => {
    expect(ownOrigins({ protocol: "http:", host: "localhost:3000" }, undefined)).toEqual(["http://localhost:3000"]);
    const own = ownOrigins({ protocol: "http:", host: "127.0.0.1:3000" }, "https://plotproof.example");
    expect(own).toEqual(["http://127.0.0.1:3000", "https://plotproof.example"]);
    const signIn = {
      method: "POST",
      pathname: "/api/auth/sign-in/email",
      headers: new Headers({ origin: "http://localhost:3000" }),
    };
    expect(refuseCrossSite(signIn, ownOrigins({ protocol: "http:", host: "localhost:3000" }, undefined))).toBeNull();
    expect(ownOrigins({ protocol: "http:", host: null }, undefined)).toEqual([]);
  });
});
