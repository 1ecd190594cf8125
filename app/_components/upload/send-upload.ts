import type { InputIssue, UploadOkDto, UploadStreamLine } from "@/lib/api-types";

export type ServerStage = "reading" | "checking" | "saving";

/** How an upload ended. */
export type UploadOutcome =
  | { kind: "saved"; body: UploadOkDto }
  | { kind: "refused"; status: number; code: string; message: string; issues: unknown[] }
  | { kind: "network"; message: string }
  | { kind: "aborted" };

export interface UploadHandlers {
  /** Share of the file sent, 0–1 (null when the browser cannot tell). */
  onTransfer: (fraction: number | null) => void;
  onStage: (stage: ServerStage, fraction: number) => void;
}

/** Splits a growing NDJSON text into complete lines; the unfinished tail waits for more text. */
export class NdjsonLines {
  private offset = 0;
  /** Lines completed since the last call; with `final`, also the last line without a line break. */
  take(text: string, final = false): string[] {
    const out: string[] = [];
    for (;;) {
      const nl = text.indexOf("\n", this.offset);
      if (nl < 0) break;
      const line = text.slice(this.offset, nl).trim();
      this.offset = nl + 1;
      if (line) out.push(line);
    }
    if (final) {
      const rest = text.slice(this.offset).trim();
      this.offset = text.length;
      if (rest) out.push(rest);
    }
    return out;
  }
}

function isOk(body: unknown): body is UploadOkDto {
  return !!body && typeof body === "object" && "dataset" in body;
}

function fromBody(status: number, body: unknown): UploadOutcome {
  if (status === 201 && isOk(body)) return { kind: "saved", body };
  const err = (body as { error?: { code?: unknown; message?: unknown; issues?: unknown } } | null)?.error;
  return {
    kind: "refused",
    status,
    code: typeof err?.code === "string" ? err.code : "internal",
    message: typeof err?.message === "string" ? err.message : `The server answered ${status} without an explanation.`,
    issues: Array.isArray(err?.issues) ? err.issues : [],
  };
}

/**
 * POST a multipart upload with XMLHttpRequest (the only browser API that reports upload progress), asking
 * for the NDJSON progress stream; the outcome is the stream's final `done` line, or the plain JSON answer
 * when the server refused before streaming (401, 403, 404, 413…).
 */
export function sendUpload(
  url: string,
  form: FormData,
  handlers: UploadHandlers,
): { done: Promise<UploadOutcome>; abort: () => void } {
  const xhr = new XMLHttpRequest();
  const lines = new NdjsonLines();
  let finalLine: Extract<UploadStreamLine, { type: "done" }> | null = null;

  const isStream = () => (xhr.getResponseHeader("content-type") ?? "").includes("ndjson");
  const consume = (final: boolean) => {
    if (!isStream()) return;
    for (const raw of lines.take(xhr.responseText, final)) {
      let line: UploadStreamLine;
      try {
        line = JSON.parse(raw) as UploadStreamLine;
      } catch {
        continue;
      }
      if (line.type === "progress") handlers.onStage(line.stage, line.fraction);
      else if (line.type === "done") finalLine = line;
    }
  };

  const done = new Promise<UploadOutcome>((resolve) => {
    xhr.open("POST", url);
    xhr.setRequestHeader("Accept", "application/x-ndjson");
    xhr.upload.onprogress = (e) => handlers.onTransfer(e.lengthComputable && e.total > 0 ? e.loaded / e.total : null);
    xhr.upload.onload = () => handlers.onTransfer(1);
    xhr.onprogress = () => consume(false);
    xhr.onload = () => {
      if (isStream()) {
        consume(true);
        const last = finalLine as Extract<UploadStreamLine, { type: "done" }> | null;
        resolve(
          last
            ? fromBody(last.status, last.body)
            : {
                kind: "network",
                message:
                  "The server stopped answering before it said whether the file was saved. Open the field to see whether the file is listed before trying again.",
              },
        );
        return;
      }
      let body: unknown = null;
      try {
        body = JSON.parse(xhr.responseText);
      } catch {
        body = null;
      }
      resolve(fromBody(xhr.status, body));
    };
    xhr.onerror = () =>
      resolve({
        kind: "network",
        message:
          "The connection broke off during the upload. Check the network, then open the field to see whether the file is listed before trying again.",
      });
    xhr.onabort = () => resolve({ kind: "aborted" });
    xhr.send(form);
  });
  return { done, abort: () => xhr.abort() };
}

/** The issues of a refused upload, keeping only well-formed ones. */
export function asIssues(list: unknown[]): InputIssue[] {
  return list
    .filter((i): i is InputIssue => !!i && typeof i === "object" && typeof (i as InputIssue).message === "string")
    .map((i) => ({ ...i, severity: i.severity === "warning" ? "warning" : "error" }));
}
