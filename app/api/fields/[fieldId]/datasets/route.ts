import { guardedRoute } from "@/lib/server/access";
import { refusingCrossSite } from "@/lib/server/cross-site";
import { getDb } from "@/db/client";
import { getFieldById } from "@/db/queries/fields";
import { listDatasets } from "@/db/queries/datasets";
import { AppError, notFound } from "@/lib/errors";
import { ANY_ROLE, CAN_PREPARE } from "@/lib/roles";
import { parseInput, routeId } from "@/lib/validation/request";
import { MAX_UPLOAD_BYTES, UploadFields } from "@/lib/validation/upload";
import { ingestDataset, type IngestRequest } from "@/lib/server/datasets/ingest-dataset";
import { readUploadForm } from "@/lib/server/datasets/read-upload-form";
import type { UploadStreamLine } from "@/lib/api-types";

export const GET = guardedRoute<{ fieldId: string }>(ANY_ROLE, async ({ viewer, params }) => {
  const fieldId = routeId(params, "fieldId", "Field");
  const db = await getDb();
  if (!(await getFieldById(db, { id: fieldId, orgId: viewer.orgId }))) throw notFound("Field");
  return Response.json({ datasets: await listDatasets(db, { orgId: viewer.orgId, fieldId }) });
});

/**
 * Upload an as-planted or survey file (multipart: file, kind, crs?, mapping?, acceptWarnings?, presetName?,
 * fieldwork? — a survey's plan, control-mark check and instrument as JSON; machineId? — an as-planted file's machine).
 * With `Accept: application/x-ndjson` the answer streams progress lines and ends with the result.
 * proxy.ts skips this route (files above 10 MB would reach it cut off), so it refuses cross-site requests itself.
 */
export const POST = refusingCrossSite(
  guardedRoute<{ fieldId: string }>(CAN_PREPARE, async ({ req, viewer, params }) => {
    const fieldId = routeId(params, "fieldId", "Field");
    if (!(await getFieldById(await getDb(), { id: fieldId, orgId: viewer.orgId }))) throw notFound("Field");
    const form = await readUploadForm(req, { fileBytes: MAX_UPLOAD_BYTES });
    const file = form.file;
    if (!file)
      throw new AppError("invalid_input", "The 'file' part is missing.", [
        { path: ["file"], message: "Choose a file to upload" },
      ]);
    const fields = parseInput(UploadFields, form.fields, "form");
    const request: IngestRequest = {
      viewer,
      fieldId,
      kind: fields.kind,
      fileName: file.name || "upload.csv",
      contentType: file.type,
      bytes: file.bytes,
      crs: fields.crs,
      mapping: fields.mapping,
      acceptWarnings: fields.acceptWarnings,
      presetName: fields.presetName,
      fieldwork: fields.fieldwork,
      machineId: fields.machineId,
    };

    if (!(req.headers.get("accept") ?? "").includes("application/x-ndjson")) {
      return Response.json(await ingestDataset(request), { status: 201 });
    }
    const encoder = new TextEncoder();
    const stream = new ReadableStream<Uint8Array>({
      async start(controller) {
        const send = (line: UploadStreamLine) => controller.enqueue(encoder.encode(JSON.stringify(line) + "\n"));
        let last = -1;
        request.onProgress = (stage, fraction) => {
          const step = Math.floor(fraction * 20);
          if (stage !== "reading" || step !== last) send({ type: "progress", stage, fraction });
          last = step;
        };
        try {
          send({ type: "done", status: 201, body: await ingestDataset(request) });
        } catch (err) {
          if (err instanceof AppError) send({ type: "done", status: err.status, body: err.toBody() as never });
          else {
            console.error("[plotproof] upload failed", err);
            send({
              type: "done",
              status: 500,
              body: { error: { code: "internal", message: "The upload failed on our side; nothing was saved." } },
            });
          }
        }
        controller.close();
      },
    });
    return new Response(stream, {
      status: 200,
      headers: { "content-type": "application/x-ndjson; charset=utf-8", "cache-control": "no-store" },
    });
  }),
);
