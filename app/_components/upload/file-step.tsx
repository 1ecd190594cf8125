"use client";
import type { FileKind } from "./mapping-schema";
import type { Preview, UploadField } from "./file-step-shared";
import { useColumnMapping } from "./use-column-mapping";
import { useUpload } from "./use-upload";
import { FilePreview } from "./preview-section";
import { MappingForm } from "./mapping-form";
import { SaveProgress } from "./save-progress";
import { UploadAnswer } from "./upload-result";

export type { UploadField } from "./file-step-shared";

/**
 * One chosen file after its preview: the first rows, the column mapping (with presets), the upload with
 * its progress, and what the server answered.
 */
export function FileStep({
  file,
  preview,
  field,
  kind,
  onBusy,
  onReset,
  machineId,
  fieldwork,
}: {
  file: File;
  preview: Preview;
  field: UploadField;
  kind: FileKind;
  onBusy: (busy: boolean) => void;
  onReset: () => void;
  /** As-planted only: the machine the uploader chose (issue 13). */
  machineId?: string;
  /** Survey only: the fieldwork part (JSON) to send along, or null for none. */
  fieldwork?: string | null;
}) {
  const mapping = useColumnMapping({ preview, field, kind });
  const upload = useUpload({
    file,
    field,
    kind,
    format: preview.format,
    setError: mapping.form.setError,
    onBusy,
    machineId,
    fieldwork,
  });
  const locked = upload.uploading || upload.result.name === "saved";

  return (
    <>
      <FilePreview file={file} preview={preview} roleOf={mapping.roleOf} label={mapping.label} />
      <MappingForm mapping={mapping} upload={upload} preview={preview} field={field} locked={locked} />
      {upload.progress ? (
        <SaveProgress
          progress={upload.progress}
          fileSize={file.size}
          awaitingAcceptance={upload.result.name === "warnings"}
        />
      ) : null}
      <UploadAnswer
        upload={upload}
        file={file}
        field={field}
        kind={kind}
        onAcceptWarnings={() => void upload.upload(mapping.form.getValues(), true)}
        onReset={onReset}
      />
    </>
  );
}
