/**
 * The one framing of Plotproof's binary formats — the points blob (db/points-blob.ts) and the map payload
 * (lib/map/binary.ts): a JSON header followed by typed arrays, each 8-byte aligned so a reader can view it in place.
 *
 * Layout:
 *
 *   0      magic           4 ASCII bytes naming the format and its version ("PPT2", "PPMD", …)
 *   4      u32 H           byte length of the header, little-endian
 *   8      header          H bytes of UTF-8 JSON, written by the format
 *   8+H    zero padding    up to the next multiple of 8 (= data start D)
 *   D+o    array bytes     one run per array, in the platform's byte order; every o is a multiple of 8,
 *                          the gaps between runs are zero
 *
 * The header says where each array lies (the writer hands the offsets to the format); the framing itself
 * knows nothing of array names or types. Pure and free of Node built-ins: the browser reads the map payload with it.
 */

export type ArrayKind = "f64" | "f32" | "i32" | "u16" | "u8";

interface KindArray {
  f64: Float64Array;
  f32: Float32Array;
  i32: Int32Array;
  u16: Uint16Array;
  u8: Uint8Array;
}

/** Bytes per element of each kind. */
export const KIND_BYTES: Record<ArrayKind, number> = { f64: 8, f32: 4, i32: 4, u16: 2, u8: 1 };

/** Where one array was written: `offset` bytes from the data start (a multiple of 8), `byteLength` bytes long. */
export interface FramePart {
  offset: number;
  byteLength: number;
}

export type FrameProblem = "magic" | "truncated" | "header";

/** A frame that cannot be read; `problem` lets each format word the message in its own terms. */
export class FrameError extends Error {
  constructor(
    readonly problem: FrameProblem,
    message: string,
  ) {
    super(message);
    this.name = "FrameError";
  }
}

/** A frame whose header has been read; the arrays are taken out on demand. */
export interface Frame {
  magic: string;
  /** The parsed JSON header: always an object; its shape is the format's business. */
  header: Record<string, unknown>;
  /** Bytes from the data start to the end of the input. */
  dataLength: number;
  /**
   * `count` elements of `kind` at `offset` bytes from the data start: a view into the input when its position
   * suits the element size, otherwise (or with `{ copy: true }`) a copy owning its own buffer.
   * Throws a FrameError ("truncated") when the array runs past the end of the input.
   */
  array<K extends ArrayKind>(kind: K, offset: number, count: number, options?: { copy?: boolean }): KindArray[K];
}

type ArrayMaker<K extends ArrayKind> = new (
  buffer: ArrayBufferLike,
  byteOffset?: number,
  length?: number,
) => KindArray[K];
const ARRAY_OF: { [K in ArrayKind]: ArrayMaker<K> } = {
  f64: Float64Array,
  f32: Float32Array,
  i32: Int32Array,
  u16: Uint16Array,
  u8: Uint8Array,
};
const pad8 = (n: number) => (n + 7) & ~7;
const MAGIC_PATTERN = /^[\x20-\x7e]{4}$/;

/**
 * Writes a frame: `magic`, then the header `header(parts)` returns (parts[i] says where arrays[i] goes),
 * then the arrays' bytes, each starting on a multiple of 8 from the data start.
 *
 * @example
 * const x = Float64Array.of(1.5, 2.5);
 * const bytes = writeFrame("DEMO", [x], (parts) => ({ x: parts[0].offset }));
 * // bytes.length === 32: 8 of magic and length, 7 of header {"x":0}, 1 of padding, 16 of data
 */
export function writeFrame(
  magic: string,
  arrays: readonly ArrayBufferView[],
  header: (parts: FramePart[]) => unknown,
): Uint8Array {
  if (!MAGIC_PATTERN.test(magic)) throw new Error(`binary frame: magic must be 4 ASCII characters, got "${magic}"`);
  let dataLength = 0;
  const parts = arrays.map((a) => {
    const part = { offset: dataLength, byteLength: a.byteLength };
    dataLength = pad8(dataLength + a.byteLength);
    return part;
  });
  const encoder = new TextEncoder();
  const headerBytes = encoder.encode(JSON.stringify(header(parts)));
  const start = pad8(8 + headerBytes.length);
  const out = new Uint8Array(start + dataLength);
  out.set(encoder.encode(magic), 0);
  new DataView(out.buffer).setUint32(4, headerBytes.length, true);
  out.set(headerBytes, 8);
  arrays.forEach((a, i) => out.set(new Uint8Array(a.buffer, a.byteOffset, a.byteLength), start + parts[i].offset));
  return out;
}

/**
 * Reads a frame's magic and header; `magics` lists the ones the caller reads. Nothing is copied here.
 * Throws a FrameError: "magic" for another format, "truncated" when the header runs past the end,
 * "header" when it is not a JSON object.
 *
 * @example
 * const frame = readFrame(bytes, ["DEMO"]);
 * const x = frame.array("f64", frame.header.x as number, 2); // Float64Array [1.5, 2.5]
 */
export function readFrame(input: ArrayBuffer | Uint8Array, magics: readonly string[]): Frame {
  const bytes = input instanceof Uint8Array ? input : new Uint8Array(input);
  const magic = String.fromCharCode(...bytes.subarray(0, 4));
  if (!magics.includes(magic))
    throw new FrameError("magic", `binary frame: expected ${magics.join(" or ")}, found "${magic}"`);
  if (bytes.byteLength < 8)
    throw new FrameError("truncated", `binary frame: ${bytes.byteLength} bytes, too few for the header length`);
  const headerLength = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength).getUint32(4, true);
  if (8 + headerLength > bytes.byteLength)
    throw new FrameError(
      "truncated",
      `binary frame: the header needs ${headerLength} bytes, ${bytes.byteLength - 8} are left`,
    );
  let header: unknown;
  try {
    header = JSON.parse(new TextDecoder().decode(bytes.subarray(8, 8 + headerLength)));
  } catch {
    throw new FrameError("header", "binary frame: the header is not JSON");
  }
  if (typeof header !== "object" || header === null || Array.isArray(header))
    throw new FrameError("header", "binary frame: the header is not a JSON object");
  const start = pad8(8 + headerLength);
  const dataLength = Math.max(0, bytes.byteLength - start);

  const array = <K extends ArrayKind>(kind: K, offset: number, count: number, options?: { copy?: boolean }) => {
    const size = KIND_BYTES[kind];
    const byteLength = count * size;
    if (!Number.isInteger(offset) || !Number.isInteger(count) || offset < 0 || count < 0)
      throw new FrameError("truncated", `binary frame: no array of ${count} at offset ${offset}`);
    if (offset + byteLength > dataLength)
      throw new FrameError(
        "truncated",
        `binary frame: an array of ${byteLength} bytes at offset ${offset} runs past the end (${dataLength} bytes of data)`,
      );
    const at = bytes.byteOffset + start + offset;
    const make: ArrayMaker<K> = ARRAY_OF[kind];
    // A typed array must start on a multiple of its element size; a driver may hand over any offset.
    if (options?.copy || at % size !== 0)
      // Uint8Array's own slice copies; Node's Buffer.slice (node-postgres hands bytea over as a Buffer) is a view.
      return new make(Uint8Array.prototype.slice.call(bytes, start + offset, start + offset + byteLength).buffer);
    return new make(bytes.buffer, at, count);
  };
  return { magic, header: header as Record<string, unknown>, dataLength, array };
}
