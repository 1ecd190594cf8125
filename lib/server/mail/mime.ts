/**
 * A small reader for the messages our own mailer writes (nodemailer): headers, RFC 2047 encoded
 * words, multipart bodies, quoted-printable and base64. Enough to show captured messages on the
 * outbox page and in tests; not a general e-mail parser. Pure.
 */

export interface ParsedMail {
  headers: Record<string, string>;
  subject: string;
  from: string;
  to: string[];
  text: string;
  html: string | null;
}

interface Part {
  headers: Record<string, string>;
  body: string;
}

/** @example parseMail("Subject: Hi\r\nContent-Type: text/plain\r\n\r\nHello\r\n").text // "Hello\r\n" */
export function parseMail(raw: string): ParsedMail {
  const top = splitPart(raw);
  const texts: string[] = [];
  const htmls: string[] = [];
  collect(top, texts, htmls);
  const h = top.headers;
  return {
    headers: h,
    subject: decodeWords(h["subject"] ?? ""),
    from: decodeWords(h["from"] ?? ""),
    to: splitAddresses(decodeWords(h["to"] ?? "")),
    text: texts[0] ?? (htmls[0] ? htmlToText(htmls[0]) : ""),
    html: htmls[0] ?? null,
  };
}

function splitPart(raw: string): Part {
  const m = /\r?\n\r?\n/.exec(raw);
  const head = m ? raw.slice(0, m.index) : raw;
  const body = m ? raw.slice(m.index + m[0].length) : "";
  const headers: Record<string, string> = {};
  const lines = head.split(/\r?\n/);
  let current = "";
  for (const line of lines) {
    if (/^[ \t]/.test(line) && current) headers[current] += " " + line.trim();
    else {
      const i = line.indexOf(":");
      if (i <= 0) continue;
      current = line.slice(0, i).trim().toLowerCase();
      headers[current] = line.slice(i + 1).trim();
    }
  }
  return { headers, body };
}

function param(header: string, name: string): string | null {
  const m = new RegExp(`;\\s*${name}\\s*=\\s*(?:"([^"]*)"|([^;\\s]+))`, "i").exec(header);
  return m ? (m[1] ?? m[2]) : null;
}

function collect(part: Part, texts: string[], htmls: string[]): void {
  const type = (part.headers["content-type"] ?? "text/plain").toLowerCase();
  if (type.startsWith("multipart/")) {
    const boundary = param(part.headers["content-type"], "boundary");
    if (!boundary) return;
    const chunks = part.body.split(new RegExp(`(?:^|\\r?\\n)--${escapeRe(boundary)}(?:--)?[ \\t]*(?:\\r?\\n|$)`));
    for (const chunk of chunks.slice(1)) {
      if (chunk.trim() === "") continue;
      collect(splitPart(chunk), texts, htmls);
    }
    return;
  }
  const charset = param(part.headers["content-type"] ?? "", "charset") ?? "utf-8";
  const decoded = decodeBody(part.body, part.headers["content-transfer-encoding"] ?? "7bit", charset);
  if (type.startsWith("text/html")) htmls.push(decoded);
  else if (type.startsWith("text/")) texts.push(decoded);
}

function decodeBody(body: string, encoding: string, charset: string): string {
  const enc = encoding.toLowerCase().trim();
  if (enc === "base64") return bytesToText(base64Bytes(body.replace(/\s+/g, "")), charset);
  if (enc === "quoted-printable") return bytesToText(qpBytes(body), charset);
  return body;
}

/** Quoted-printable (RFC 2045 §6.7) to bytes. */
export function qpBytes(s: string): Uint8Array {
  const soft = s.replace(/=\r?\n/g, "");
  const out: number[] = [];
  for (let i = 0; i < soft.length; i++) {
    const c = soft[i];
    if (c === "=" && /^[0-9A-Fa-f]{2}$/.test(soft.slice(i + 1, i + 3))) {
      out.push(parseInt(soft.slice(i + 1, i + 3), 16));
      i += 2;
    } else {
      const code = soft.charCodeAt(i);
      if (code < 0x80) out.push(code);
      else out.push(...new TextEncoder().encode(c));
    }
  }
  return Uint8Array.from(out);
}

function base64Bytes(s: string): Uint8Array {
  const bin = atob(s);
  const out = new Uint8Array(bin.length);
  for (let i = 0; i < bin.length; i++) out[i] = bin.charCodeAt(i);
  return out;
}

function bytesToText(bytes: Uint8Array, charset: string): string {
  try {
    return new TextDecoder(charset.toLowerCase()).decode(bytes);
  } catch {
    return new TextDecoder("utf-8").decode(bytes);
  }
}

/** RFC 2047 encoded words, e.g. "=?UTF-8?Q?Zo=C3=AB?=" → "Zoë". */
export function decodeWords(s: string): string {
  return s
    .replace(/(=\?[^?]+\?[QqBb]\?[^?]*\?=)\s+(?==\?)/g, "$1")
    .replace(/=\?([^?]+)\?([QqBb])\?([^?]*)\?=/g, (_, charset: string, enc: string, text: string) => {
      const bytes = enc.toUpperCase() === "B" ? base64Bytes(text) : qpBytes(text.replace(/_/g, " "));
      return bytesToText(bytes, charset);
    });
}

function splitAddresses(s: string): string[] {
  return s
    .split(",")
    .map((a) => {
      const m = /<([^>]+)>/.exec(a);
      return (m ? m[1] : a).trim().toLowerCase();
    })
    .filter(Boolean);
}

function htmlToText(html: string): string {
  return html
    .replace(/<br\s*\/?>/gi, "\n")
    .replace(/<\/p>/gi, "\n\n")
    .replace(/<[^>]+>/g, "")
    .replace(/&amp;/g, "&")
    .replace(/&lt;/g, "<")
    .replace(/&gt;/g, ">")
    .replace(/&quot;/g, '"');
}

function escapeRe(s: string): string {
  return s.replace(/[.*+?^${}()|[\]\\]/g, "\\$&");
}

/** The first link in a text that starts with `prefix` (e.g. the app's base URL). */
export function findLink(text: string, prefix: string): string | null {
  const re = /https?:\/\/[^\s<>"')]+/g;
  for (const m of text.matchAll(re)) if (m[0].startsWith(prefix)) return m[0];
  return null;
}
