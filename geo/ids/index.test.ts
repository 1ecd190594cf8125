import { describe, expect, it } from "vitest";
import { findDuplicateIds, fnv1a, IdColumn, indexIds } from "./index";

describe("ids", () => {
  it("fnv1a -- published 32-bit FNV-1a test vectors", () => {
    // FNV-1a 32-bit test vectors ("", "a", "foobar") from the FNV reference test suite (draft-eastlake-fnv); from memory
    expect(fnv1a("")).toBe(0x811c9dc5);
    expect(fnv1a("a")).toBe(0xe40c292c);
    expect(fnv1a("foobar")).toBe(0xbf9cf968);
  });

  it("indexIds -- finds first rows and lists every row of repeated ids", () => {
    // self-constructed: truth by construction
    const ids = ["P1", "P2", "", "P1", "P3", "P1", "", "P2"];
    const idx = indexIds(ids);
    expect(idx.size).toBe(3);
    expect(idx.lookup("P1")).toBe(0);
    expect(idx.lookup("P3")).toBe(4);
    expect(idx.lookup("nope")).toBe(-1);
    expect(idx.lookup("")).toBe(-1);
    expect(idx.duplicates).toEqual(
      new Map([
        ["P1", [0, 3, 5]],
        ["P2", [1, 7]],
      ]),
    );
  });

  it("indexIds -- agrees with a Map on many ids with hash collisions in the table", () => {
    // independent oracle: JavaScript's built-in Map
    const ids = Array.from({ length: 20000 }, (_, i) => `X${(i * 7919) % 15000}`);
    const idx = indexIds(ids);
    const first = new Map<string, number>();
    ids.forEach((id, i) => {
      if (!first.has(id)) first.set(id, i);
    });
    expect(idx.size).toBe(first.size);
    for (const [id, i] of first) expect(idx.lookup(id)).toBe(i);
    expect(idx.duplicates!.size).toBe(5000);
  });

  it("findDuplicateIds -- sorted ids need no hashing, unsorted ones are checked", () => {
    // by construction
    expect(findDuplicateIds(["A1", "", "A2", "B"])).toBeNull();
    expect(findDuplicateIds(["A2", "A1", "A2"])).toEqual(new Map([["A2", [0, 2]]]));
    expect(findDuplicateIds(["A1", "A1"])).toEqual(new Map([["A1", [0, 1]]]));
    expect(findDuplicateIds(["b", "a"])).toBeNull();
  });
});

describe("IdColumn", () => {
  const ids = ["LA-000001", "", "Ä-ß", "LA-000002", " x"];
  const col = IdColumn.from(ids);

  it("IdColumn -- gives back each id, empty ones as empty strings", () => {
    expect(col.length).toBe(5);
    expect(col.toArray()).toEqual(ids);
    expect(col.isEmpty(1)).toBe(true);
    expect(col.isEmpty(0)).toBe(false);
  });

  it("IdColumn -- hash equals fnv1a of the string; compare agrees with string order", () => {
    for (let i = 0; i < ids.length; i++) {
      expect(col.hash(i)).toBe(fnv1a(ids[i]));
      for (let j = 0; j < ids.length; j++) {
        const c = col.compare(i, col, j);
        expect(Math.sign(c)).toBe(ids[i] < ids[j] ? -1 : ids[i] > ids[j] ? 1 : 0);
      }
    }
  });

  it("IdColumn -- Latin-1 ids in bytes; an id beyond Latin-1 switches to UTF-16 mid-way", () => {
    expect(col.codes).toBeInstanceOf(Uint8Array);
    const mixed = ["P1", "植-1", "P2"];
    const m = IdColumn.from(mixed);
    expect(m.codes).toBeInstanceOf(Uint16Array);
    expect(m.toArray()).toEqual(mixed);
    expect(col.concat(m).toArray()).toEqual([...ids, ...mixed]);
    expect(m.concat(col).toArray()).toEqual([...mixed, ...ids]);
  });

  it("IdColumn -- concat, and revive after a structured clone", () => {
    const other = IdColumn.from(["B1", ""]);
    const before = col.toArray();
    expect(col.concat(other).toArray()).toEqual([...ids, "B1", ""]);
    expect(col.toArray()).toEqual(before);
    const cloned = IdColumn.revive(structuredClone(col))!;
    expect(cloned).toBeInstanceOf(IdColumn);
    expect(cloned.toArray()).toEqual(ids);
  });

  it("IdColumn -- ids longer than one fromCharCode batch", () => {
    const long = "P".repeat(10_000) + "Q";
    expect(IdColumn.from([long]).get(0)).toBe(long);
  });

  it("indexIds -- looks up ids of another column without making strings", () => {
    const idx = indexIds(col);
    const survey = IdColumn.from(["LA-000002", "nope", ""]);
    expect([0, 1, 2].map((k) => idx.lookupFrom(survey, k))).toEqual([3, -1, -1]);
    expect(idx.lookup("Ä-ß")).toBe(2);
  });
});
