import { describe, expect, it } from "vitest";
import { appendTo, viewWithRoom } from "./spare";

describe("spare room", () => {
  it("appendTo -- fills a reader's spare room once, leaving the first view unchanged", () => {
    const full = new Float64Array(8);
    full.set([1, 2, 3]);
    const a = viewWithRoom(full, 3);
    const out = appendTo(a, 2);
    out.set([4, 5], 3);
    expect(out.buffer).toBe(full.buffer); // no copy
    expect(Array.from(out)).toEqual([1, 2, 3, 4, 5]);
    expect(Array.from(a)).toEqual([1, 2, 3]);
    const again = appendTo(a, 1); // the room was used: a new array this time
    expect(again.buffer).not.toBe(full.buffer);
    expect(Array.from(again)).toEqual([1, 2, 3, 0]);
  });

  it("appendTo -- copies arrays it did not hand out, or without room", () => {
    const mine = new Int32Array([7, 8, 9, 10]);
    const view = mine.subarray(0, 2);
    const out = appendTo(view, 1);
    expect(out.buffer).not.toBe(mine.buffer);
    expect(Array.from(mine)).toEqual([7, 8, 9, 10]);
    const small = viewWithRoom(new Int32Array(3), 2);
    expect(appendTo(small, 5).length).toBe(7);
  });
});
