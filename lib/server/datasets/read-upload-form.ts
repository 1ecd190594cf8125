import "server-only";
import { Readable } from "node:stream";
import type { ReadableStream as NodeWebStream } from "node:stream/web";
import busboy from "busboy";
import { AppError } from "@/lib/errors";

export interface UploadedFile {
  name: string;
  type: string;
  bytes: Uint8Array;
}

export interface UploadForm {
  file: UploadedFile | null;
  fields: Record<string, string>;
}

export interface UploadLimits {
  /** The largest file accepted, in bytes. */
  fileBytes: number;
  /** The largest non-file field (a column mapping is the biggest, a few kilobytes). */
  fieldBytes?: number;
}

const tooLarge = (limit: number) =>
  new AppError("payload_too_large", `Files up to ${Math.floor(limit / 1024 / 1024)} MB can be uploaded.`);

/**
 * Read a multipart upload as a stream (busboy), holding at most `fileBytes` of the file: the moment a file
 * (or the body of a chunked request, whose length nobody declared) crosses the limit, reading stops and the
 * answer is 413. `req.formData()` would read the whole body first, whatever its size.
 */
export async function readUploadForm(req: Request, limits: UploadLimits): Promise<UploadForm> {
  const type = req.headers.get("content-type") ?? "";
  if (!/^multipart\/form-data/i.test(type) || !req.body)
    throw new AppError("invalid_input", "Send the upload as multipart/form-data with a 'file' part.");
  const declared = Number(req.headers.get("content-length") ?? 0);
  if (declared > limits.fileBytes + 1024 * 1024) throw tooLarge(limits.fileBytes);

  const fieldBytes = limits.fieldBytes ?? 64 * 1024;
  const source = Readable.fromWeb(req.body as unknown as NodeWebStream<Uint8Array>);
  return new Promise<UploadForm>((resolve, reject) => {
    let settled = false;
    const fail = (err: AppError) => {
      if (settled) return;
      settled = true;
      source.unpipe();
      source.destroy();
      reject(err);
    };
    let parser: busboy.Busboy;
    try {
      parser = busboy({
        headers: { "content-type": type },
        limits: { fileSize: limits.fileBytes, files: 1, fields: 20, fieldSize: fieldBytes, parts: 21 },
      });
    } catch {
      fail(new AppError("invalid_input", "The multipart body has no boundary; send it as multipart/form-data."));
      return;
    }
    const fields: Record<string, string> = {};
    let file: UploadedFile | null = null;
    let fileDone: Promise<void> = Promise.resolve();

    parser.on("field", (name, value, info) => {
      if (info.valueTruncated) {
        fail(new AppError("invalid_input", `The form field '${name}' is longer than ${fieldBytes / 1024} kB.`));
        return;
      }
      fields[name] = value;
    });
    parser.on("file", (name, stream, info) => {
      if (name !== "file") {
        stream.resume();
        return;
      }
      const chunks: Buffer[] = [];
      let size = 0;
      fileDone = new Promise<void>((done) => {
        stream.on("data", (c: Buffer) => {
          size += c.length;
          chunks.push(c);
        });
        stream.on("limit", () => fail(tooLarge(limits.fileBytes)));
        stream.on("end", () => {
          if (!settled)
            file = { name: info.filename ?? "", type: info.mimeType ?? "", bytes: Buffer.concat(chunks, size) };
          chunks.length = 0;
          done();
        });
      });
    });
    parser.on("filesLimit", () => fail(new AppError("invalid_input", "Upload one file at a time (one 'file' part).")));
    parser.on("partsLimit", () => fail(new AppError("invalid_input", "The form has more parts than an upload needs.")));
    parser.on("error", (e) =>
      fail(new AppError("invalid_input", `The multipart body could not be read: ${(e as Error).message}.`)),
    );
    parser.on("close", () => {
      void fileDone.then(() => {
        if (settled) return;
        settled = true;
        resolve({ file, fields });
      });
    });
    source.on("error", () =>
      fail(new AppError("invalid_input", "The upload was interrupted before the whole file arrived.")),
    );
    source.pipe(parser);
  });
}
