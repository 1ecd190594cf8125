import { describe, expect, it } from "vitest";
import { FrameError, readFrame, writeFrame } from "./binary-frame";

/** Arrays of every kind with lengths that leave a gap before the next 8-byte boundary. */
function sampleArrays() {
  return {
    f64: Float64Array.of(662410.5712, Number.NaN, -0.25),
    u8: Uint8Array.of(1, 2, 3),
    f32: Float32Array.of(1.5, -2.25, 3),
    i32: Int32Array.of(-1, 0, 2_147_483_647),
    u16: Uint16Array.of(0x690d, 65535, 0),
  };
}

function sampleFrame() {
  const a = sampleArrays();
  const list = [a.f64, a.u8, a.f32, a.i32, a.u16];
  const bytes = writeFrame("TEST", list, (parts) => ({ title: "Long Acre ✓", parts }));
  return { a, bytes };
}

describe("binary frame", () => {
  it("writeFrame -- round trip gives back every array and the header", () => {
    const { a, bytes } = sampleFrame();
    const frame = readFrame(bytes, ["TEST"]);
    expect(frame.magic).toBe("TEST");
    const parts = frame.header.parts as { offset: number; byteLength: number }[];
    expect(frame.header.title).toBe("Long Acre ✓");
    expect(frame.array("f64", parts[0].offset, 3)).toEqual(a.f64);
    expect(frame.array("u8", parts[1].offset, 3)).toEqual(a.u8);
    expect(frame.array("f32", parts[2].offset, 3)).toEqual(a.f32);
    expect(frame.array("i32", parts[3].offset, 3)).toEqual(a.i32);
    expect(frame.array("u16", parts[4].offset, 3)).toEqual(a.u16);
  });

  it("writeFrame -- the header length, the data start and every array offset follow the layout", () => {
    const { bytes } = sampleFrame();
    const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
    expect(String.fromCharCode(...bytes.subarray(0, 4))).toBe("TEST");
    const headerLength = view.getUint32(4, true);
    const header = JSON.parse(new TextDecoder().decode(bytes.subarray(8, 8 + headerLength)));
    // 24 bytes of f64, 3 of u8 padded to 8, 12 of f32 padded to 16, 12 of i32 padded to 16, 6 of u16 padded to 8.
    expect(header.parts).toEqual([
      { offset: 0, byteLength: 24 },
      { offset: 24, byteLength: 3 },
      { offset: 32, byteLength: 12 },
      { offset: 48, byteLength: 12 },
      { offset: 64, byteLength: 6 },
    ]);
    const start = Math.ceil((8 + headerLength) / 8) * 8;
    expect(bytes.byteLength).toBe(start + 72);
    // Padding after the header and between arrays is zero.
    expect(Array.from(bytes.subarray(8 + headerLength, start)).every((b) => b === 0)).toBe(true);
    expect(Array.from(bytes.subarray(start + 27, start + 32))).toEqual([0, 0, 0, 0, 0]);
  });

  it("readFrame -- arrays are views into an aligned input, copies of an unaligned one", () => {
    const { a, bytes } = sampleFrame();
    const buffer = (bytes.buffer as ArrayBuffer).slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength);
    const aligned = readFrame(buffer, ["TEST"]);
    const offsets = (aligned.header.parts as { offset: number }[]).map((p) => p.offset);
    const x = aligned.array("f64", offsets[0], 3);
    expect(x.buffer).toBe(buffer);
    expect(x.byteOffset % 8).toBe(0);

    const shifted = new Uint8Array(bytes.byteLength + 3);
    shifted.set(bytes, 3);
    const unaligned = readFrame(shifted.subarray(3), ["TEST"]);
    const y = unaligned.array("f64", offsets[0], 3);
    expect(y.buffer).not.toBe(shifted.buffer);
    expect(y).toEqual(a.f64);
    // Bytes need no alignment, so they stay a view even here.
    expect(unaligned.array("u8", offsets[1], 3).buffer).toBe(shifted.buffer);
  });

  it("readFrame -- { copy: true } gives an array owning its buffer", () => {
    const { a, bytes } = sampleFrame();
    const frame = readFrame(bytes, ["TEST"]);
    const offset = (frame.header.parts as { offset: number }[])[3].offset;
    const own = frame.array("i32", offset, 3, { copy: true });
    expect(own.buffer).not.toBe(bytes.buffer);
    expect(own.byteLength).toBe(own.buffer.byteLength);
    expect(own).toEqual(a.i32);
  });

  it("readFrame -- a Buffer inside a larger allocation (as node-postgres hands bytea over) is copied, not viewed", () => {
    const { a, bytes } = sampleFrame();
    const pool = Buffer.alloc(bytes.byteLength + 13);
    pool.set(bytes, 5); // offset 5: every array is unaligned, so every one is copied
    const inside = pool.subarray(5, 5 + bytes.byteLength);
    const frame = readFrame(inside, ["TEST"]);
    const offset = (frame.header.parts as { offset: number }[])[3].offset;
    const own = frame.array("i32", offset, 3, { copy: true });
    expect(own.buffer).not.toBe(pool.buffer);
    expect(own.byteLength).toBe(own.buffer.byteLength);
    expect(own).toEqual(a.i32);
  });

  it("readFrame -- another magic is refused with both names in the message", () => {
    const { bytes } = sampleFrame();
    expect(() => readFrame(bytes, ["PPT2", "PPT1"])).toThrow('binary frame: expected PPT2 or PPT1, found "TEST"');
    try {
      readFrame(bytes, ["PPMD"]);
    } catch (e) {
      expect(e).toBeInstanceOf(FrameError);
      expect((e as FrameError).problem).toBe("magic");
    }
    expect.assertions(3);
  });

  it("readFrame -- truncated input says so, at the header and at an array", () => {
    const { bytes } = sampleFrame();
    expect(() => readFrame(bytes.subarray(0, 6), ["TEST"])).toThrow(
      "binary frame: 6 bytes, too few for the header length",
    );
    expect(() => readFrame(bytes.subarray(0, 20), ["TEST"])).toThrow(
      /^binary frame: the header needs \d+ bytes, 12 are left$/,
    );
    const short = readFrame(bytes.subarray(0, bytes.byteLength - 8), ["TEST"]);
    const last = (short.header.parts as { offset: number }[])[4].offset;
    expect(() => short.array("u16", last, 3)).toThrow(
      "binary frame: an array of 6 bytes at offset 64 runs past the end (64 bytes of data)",
    );
  });

  it("readFrame -- a header that is not a JSON object is refused", () => {
    const frameOf = (text: string) => {
      const header = new TextEncoder().encode(text);
      const out = new Uint8Array(8 + header.length);
      out.set(new TextEncoder().encode("TEST"));
      new DataView(out.buffer).setUint32(4, header.length, true);
      out.set(header, 8);
      return out;
    };
    expect(() => readFrame(frameOf("{nope"), ["TEST"])).toThrow("binary frame: the header is not JSON");
    expect(() => readFrame(frameOf("[1]"), ["TEST"])).toThrow("binary frame: the header is not a JSON object");
    expect(readFrame(frameOf("{}"), ["TEST"]).dataLength).toBe(0);
  });

  it("writeFrame -- refuses a magic that is not 4 ASCII characters", () => {
    expect(() => writeFrame("PP", [], () => ({}))).toThrow('binary frame: magic must be 4 ASCII characters, got "PP"');
  });

  it("writeFrame -- does not change its inputs", () => {
    const a = sampleArrays();
    const before = [a.f64, a.u8, a.f32, a.i32, a.u16].map((x) => Array.from(x as ArrayLike<number>));
    writeFrame("TEST", [a.f64, a.u8, a.f32, a.i32, a.u16], () => ({}));
    expect([a.f64, a.u8, a.f32, a.i32, a.u16].map((x) => Array.from(x as ArrayLike<number>))).toEqual(before);
  });
});
