"use client";
import { useCallback, useState } from "react";
import { MAX_UPLOAD_BYTES } from "@/lib/validation/upload";
import { Notice } from "@/app/_components/field-form/controls";
import { DropZone, fileProblem } from "./drop-zone";
import { FileStep, type UploadField } from "./file-step";
import type { FileKind } from "./mapping-schema";
import { usePreview } from "./use-preview";
import { MachinePicker } from "./machine-picker";
import { FieldworkSection, type SurveyFieldworkChoices } from "./fieldwork-section";
import { emptyFieldwork, type FieldworkValues, fieldworkJson } from "@/app/_components/fieldwork/fieldwork-fields";

const INTRO: Record<FileKind, string> = {
  planted:
    "The planting machine's export: one row per plant with its recorded position (latitude/longitude or easting/northing), and where available its id, crop, bed, row, tool arm, GNSS fix and planting time.",
  survey:
    "The checkpoints measured with the more precise instrument (total station or RTK rover pole): one row per surveyed plant with its position and, where the tag was read, the plant id.",
};

/** Choose a file → preview → columns → save, for one field and one kind of file. */
export function UploadFlow({
  field,
  kind,
  machines,
  fieldwork,
}: {
  field: UploadField;
  kind: FileKind;
  /** As-planted only: the organisation's machines to name the one that recorded the file (issue 13). */
  machines?: { id: string; name: string; toolArms: number }[];
  /** Survey only: the field's plans and control marks, for the optional fieldwork record. */
  fieldwork?: SurveyFieldworkChoices;
}) {
  const [file, setFile] = useState<File | null>(null);
  const [work, setWork] = useState<FieldworkValues>(() => emptyFieldwork());
  const [machineId, setMachineId] = useState("");
  const [generation, setGeneration] = useState(0);
  const [fileError, setFileError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const preview = usePreview(file);

  const take = (f: File) => {
    const problem = fileProblem(f, MAX_UPLOAD_BYTES);
    setFileError(problem);
    setFile(problem ? null : f);
    setGeneration((g) => g + 1);
  };
  const reset = useCallback(() => {
    setFile(null);
    setFileError(null);
    setGeneration((g) => g + 1);
  }, []);

  return (
    <>
      <section aria-labelledby="step-file" className="mb-6 rounded-plot border border-chalk-line bg-white p-5">
        <h2 id="step-file" className="mb-1 text-base font-semibold">
          1. Choose the file
        </h2>
        <p className="mb-4 text-sm text-ink-soft">{INTRO[kind]}</p>
        <DropZone id="upload-file" onFile={take} disabled={busy} error={fileError} chosen={file} />
        {kind === "planted" && machines ? (
          <MachinePicker machines={machines} value={machineId} onChange={setMachineId} disabled={busy} />
        ) : null}
        {kind === "survey" && fieldwork ? (
          <FieldworkSection choices={fieldwork} values={work} onChange={setWork} disabled={busy} />
        ) : null}
      </section>

      {preview.status === "reading" ? (
        <p role="status" className="mb-6 text-sm text-ink-soft" data-testid="preview-reading">
          Reading the first rows of {file?.name}…
        </p>
      ) : null}
      {preview.status === "failed" ? (
        <div className="mb-6" data-testid="preview-failed">
          <Notice tone="alarm">{preview.message}</Notice>
        </div>
      ) : null}
      {preview.status === "ready" && file ? (
        <FileStep
          key={generation}
          file={file}
          preview={preview.preview}
          field={field}
          kind={kind}
          onBusy={setBusy}
          onReset={reset}
          machineId={kind === "planted" && machineId ? machineId : undefined}
          fieldwork={kind === "survey" ? fieldworkJson(work) : null}
        />
      ) : null}
    </>
  );
}
