import { describe, expect, it } from "vitest";
import { readCsv } from "./csv";
import { ByteDecoder, encodingIssue, NotTextError, textChunks } from "./text";

const HEADER = "plant_id,crop,lat,lon\n";

function latin1(s: string): Uint8Array {
  // Every character below U+0100 is one byte of the same value in ISO-8859-1 / Windows-1252 (WHATWG Encoding, windows-1252 index).
  return Uint8Array.from(s, (c) => c.charCodeAt(0));
}

async function decodeAll(chunks: Uint8Array[]): Promise<{ text: string; decoder: ByteDecoder }> {
  const decoder = new ByteDecoder();
  let text = "";
  for (const c of chunks) text += decoder.push(c);
  text += decoder.end();
  return { text, decoder };
}

describe("ByteDecoder", () => {
  it("decode -- plain UTF-8 stays UTF-8, also when a character is split across chunks", async () => {
    // RFC 3629 §3: "ü" is C3 BC in UTF-8
    const bytes = new TextEncoder().encode("a,Müller\n");
    const { text, decoder } = await decodeAll([bytes.subarray(0, 4), bytes.subarray(4)]);
    expect(text).toBe("a,Müller\n");
    expect(decoder.report.encoding).toBe("utf-8");
  });

  it("decode -- bytes that are not UTF-8 after ASCII are read as Windows-1252, naming the first such line", async () => {
    // WHATWG Encoding Standard, index-windows-1252: 0xFC → U+00FC "ü", 0x80 → U+20AC "€"
    const bytes = latin1(`${HEADER}P1,Kopfsalat,52.1,9.2\nP2,Rübe \u0080,52.1,9.2\n`);
    bytes[bytes.indexOf(0x80)] = 0x80;
    const { text, decoder } = await decodeAll([bytes.subarray(0, 10), bytes.subarray(10, 50), bytes.subarray(50)]);
    expect(text).toContain("P2,Rübe €,52.1,9.2");
    expect(decoder.report).toMatchObject({ encoding: "windows-1252", firstNonAsciiLine: 3 });
    expect(decoder.report.firstNonAsciiText).toMatch(/^P2,Rü/); // the sample ends where the chunk ends
  });

  it("decode -- a lone byte above 0x7F held at a chunk end is re-read as Windows-1252", async () => {
    // WHATWG index-windows-1252: 0xE9 → U+00E9 "é"
    const bytes = latin1("id\ncaf\u00e9\n");
    const cut = bytes.indexOf(0xe9) + 1;
    const { text, decoder } = await decodeAll([bytes.subarray(0, cut), bytes.subarray(cut)]);
    expect(text).toBe("id\ncafé\n");
    expect(decoder.report.encoding).toBe("windows-1252");
  });

  it("decode -- UTF-16 LE and BE with a byte-order mark are decoded (Unicode 15.0 §23.8 Table 23-4)", async () => {
    const le = Uint8Array.of(0xff, 0xfe, 0x61, 0x00, 0xfc, 0x00, 0x0a, 0x00);
    const be = Uint8Array.of(0xfe, 0xff, 0x00, 0x61, 0x00, 0xfc, 0x00, 0x0a);
    const a = await decodeAll([le]);
    const b = await decodeAll([be]);
    expect(a.text).toBe("aü\n");
    expect(a.decoder.report.encoding).toBe("utf-16le");
    expect(b.text).toBe("aü\n");
    expect(b.decoder.report.encoding).toBe("utf-16be");
  });

  it("decode -- a UTF-8 byte-order mark is dropped and gives no warning", async () => {
    const { text, decoder } = await decodeAll([Uint8Array.of(0xef, 0xbb, 0xbf, 0x61, 0x0a)]);
    expect(text).toBe("a\n");
    expect(decoder.report.encoding).toBe("utf-8-bom");
    expect(encodingIssue(decoder.report, "a.csv")).toBeNull();
  });

  it("decode -- a file mixing UTF-8 and Latin-1 is refused naming both lines", async () => {
    const utf8 = new TextEncoder().encode("id\nMüller\n");
    const bytes = new Uint8Array([...utf8, ...latin1("M\u00fcller\n")]);
    await expect(decodeAll([bytes])).rejects.toThrow(/line 2 holds UTF-8 characters, but line 3/);
    await expect(decodeAll([utf8, latin1("M\u00fcller\n")])).rejects.toThrow(/mixes encodings/);
  });

  it("decode -- bytes Windows-1252 leaves undefined are refused naming the encoding and line", async () => {
    // WHATWG index-windows-1252 maps 0x81 to U+0081, a C1 control: no character
    const bytes = latin1("id\nab\u0081\n");
    const err = await decodeAll([bytes]).catch((e: NotTextError) => e);
    expect(err).toBeInstanceOf(NotTextError);
    expect((err as NotTextError).message).toContain("Windows-1252");
    expect((err as NotTextError).line).toBe(2);
  });

  it("decode -- invalid UTF-16 after its byte-order mark is refused naming UTF-16 LE", async () => {
    // Unicode 15.0 §3.9 D91: a lone high surrogate (D800) is ill-formed UTF-16
    const bytes = Uint8Array.of(0xff, 0xfe, 0x61, 0x00, 0x0a, 0x00, 0x00, 0xd8, 0x62, 0x00);
    await expect(decodeAll([bytes])).rejects.toThrow(/UTF-16 LE.*line 2/);
  });

  it("textChunks -- zip content is refused as before", async () => {
    const zip = Uint8Array.of(0x50, 0x4b, 0x03, 0x04, 0x14, 0x00);
    const run = async () => {
      for await (const _ of textChunks([zip])) void _;
    };
    await expect(run()).rejects.toThrow(/zip archive/);
  });
});

describe("readCsv encoding", () => {
  it("readCsv -- a Latin-1 file is read with a warning naming the encoding, line and text", async () => {
    const r = await readCsv([latin1(`${HEADER}P1,Kopfsalat,52.1,9.2\nP2,Rübe,52.1,9.2\n`)], {
      source: "alt.csv",
      role: "planted",
    });
    expect(r.table).not.toBeNull();
    expect(r.table!.attrs.crop!.values).toContain("Rübe");
    expect(r.issues).toEqual([
      expect.objectContaining({
        severity: "warning",
        code: "file-encoding",
        file: "alt.csv",
        line: 3,
        value: expect.stringContaining("Rübe"),
        message: expect.stringContaining("Windows-1252"),
      }),
    ]);
  });

  it("readCsv -- an undecodable file is an error with its line, no table", async () => {
    const r = await readCsv([latin1(`${HEADER}P1,x\u0090,52.1,9.2\n`)], { source: "bad.csv", role: "planted" });
    expect(r.table).toBeNull();
    expect(r.issues).toEqual([expect.objectContaining({ severity: "error", code: "file-encoding-invalid", line: 2 })]);
  });
});
