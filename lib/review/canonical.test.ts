import { describe, expect, it } from "vitest";
import { canonicalJson } from "./canonical";
import { sha256Hex } from "./hash";

describe("canonicalJson", () => {
  it("canonicalJson -- sorts keys at every depth and drops undefined members", () => {
    const a = canonicalJson({ b: 1, a: { d: [3, { z: 1, y: 2 }], c: undefined } });
    const b = canonicalJson({ a: { d: [3, { y: 2, z: 1 }] }, b: 1 });
    expect(a).toBe('{"a":{"d":[3,{"y":2,"z":1}]},"b":1}');
    expect(b).toBe(a);
  });

  it("canonicalJson -- orders keys by UTF-16 code units, not by locale", () => {
    // RFC 8785 §3.2.3: code-unit order puts upper case before lower case and "é" (U+00E9) after "z".
    expect(canonicalJson({ é: 1, z: 2, B: 3, a: 4 })).toBe('{"B":3,"a":4,"z":2,"é":1}');
  });

  it("canonicalJson -- numbers in the shortest round-trip form, −0 as 0, non-finite as null", () => {
    // RFC 8785 §3.2.2.3 uses ECMAScript's Number serialisation.
    expect(canonicalJson([1.0, 2.5, -0, 1e21, 1e-7, 0.1 + 0.2, NaN, Infinity])).toBe(
      "[1,2.5,0,1e+21,1e-7,0.30000000000000004,null,null]",
    );
  });

  it("canonicalJson -- strings escaped as JSON.stringify, dates as ISO text, typed arrays as arrays", () => {
    expect(
      canonicalJson({ s: 'a"b\\c\n\u0001', d: new Date("2026-04-14T21:40:00Z"), t: new Float64Array([1.5, -2]) }),
    ).toBe('{"d":"2026-04-14T21:40:00.000Z","s":"a\\"b\\\\c\\n\\u0001","t":[1.5,-2]}');
  });

  it("canonicalJson -- agrees with JSON.stringify on a summary-like object after sorting", () => {
    const obj = { pairs: 375, rmseR: 0.006123456789, groups: { fix: [{ key: "rtk-fixed", n: 300 }] }, notes: [] };
    expect(JSON.parse(canonicalJson(obj))).toEqual(obj);
  });

  it("canonicalJson -- refuses BigInt with the path", () => {
    expect(() => canonicalJson({ a: [1n] })).toThrow("canonicalJson: cannot represent a bigint at $.a[0]");
  });

  it("canonicalJson -- a value that went through PostgreSQL jsonb text comes back with the same canonical form", () => {
    // jsonb keeps numbers as numeric text; parsing that text gives the same double.
    const v = { x: 0.1 + 0.2, y: 662410.5712, z: 1e-7 };
    expect(canonicalJson(JSON.parse('{"z": 0.0000001, "y": 662410.5712, "x": 0.30000000000000004}'))).toBe(
      canonicalJson(v),
    );
  });
});

describe("sha256Hex", () => {
  it('sha256Hex -- FIPS 180-2 example: "abc"', () => {
    // FIPS 180-2 Appendix B.1
    expect(sha256Hex("abc")).toBe("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
  });

  it("sha256Hex -- the empty string", () => {
    // FIPS 180-4 test vectors (NIST CAVP SHA256ShortMsg, Len = 0)
    expect(sha256Hex("")).toBe("e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855");
  });
});
