import { describe, expect, it } from "vitest";
import nodemailer from "nodemailer";
import { decodeWords, findLink, parseMail, qpBytes } from "./mime";

async function compose(msg: Record<string, unknown>): Promise<string> {
  // nodemailer's own composer as an independent writer of the messages we read
  const t = nodemailer.createTransport({ streamTransport: true, buffer: true, newline: "windows" });
  const info = await t.sendMail({ from: "Plotproof <no-reply@plotproof.invalid>", ...msg });
  return (info.message as Buffer).toString("utf8");
}

describe("parseMail", () => {
  it("parseMail -- text and HTML alternative with a non-ASCII subject and a long link", async () => {
    const link = "http://127.0.0.1:3100/invite/" + "x".repeat(90);
    const raw = await compose({
      to: "Zoë Vane <zoe@kestrelfen.example>",
      subject: "Join Kestrel Fen — on Plotproof",
      text: `Hello Zoë,\n\nOpen this link:\n\n${link}\n`,
      html: `<p>Hello Zoë</p><p><a href="${link}">${link}</a></p>`,
      headers: { "X-Plotproof-Kind": "invitation" },
    });
    const m = parseMail(raw);
    expect(m.subject).toBe("Join Kestrel Fen — on Plotproof");
    expect(m.to).toEqual(["zoe@kestrelfen.example"]);
    expect(m.text).toContain("Hello Zoë,");
    expect(findLink(m.text, "http://127.0.0.1:3100/invite/")).toBe(link);
    expect(m.html).toContain("<p>Hello Zoë</p>");
    expect(m.headers["x-plotproof-kind"]).toBe("invitation");
  });

  it("parseMail -- a plain text message in base64", async () => {
    const raw = await compose({ to: "a@b.example", subject: "x", text: "ünïcödé ".repeat(30), textEncoding: "base64" });
    expect(parseMail(raw).text.trim()).toBe("ünïcödé ".repeat(30).trim());
  });

  it("qpBytes -- soft line breaks and escaped bytes (RFC 2045 §6.7)", () => {
    expect(new TextDecoder().decode(qpBytes("Zo=C3=AB said =3D=\r\nhello"))).toBe("Zoë said =hello");
  });

  it("decodeWords -- Q and B encoded words, adjacent words joined (RFC 2047 §6.2)", () => {
    expect(decodeWords("=?UTF-8?Q?Zo=C3=AB_Vane?= =?UTF-8?B?4oCU?= ok")).toBe("Zoë Vane— ok");
  });
});
