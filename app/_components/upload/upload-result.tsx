"use client";
import type { InputIssue } from "@/lib/api-types";
import { Notice, buttonClass } from "@/app/_components/field-form/controls";
import type { FileKind } from "./mapping-schema";
import { IssueTable } from "./issue-table";
import { downloadText, issuesCsv, safeFileName } from "./errors-csv";
import type { UploadField } from "./file-step-shared";
import { SavedSummary } from "./saved-summary";
import type { UploadState } from "./use-upload";

/**
 * What the server answered, announced to screen readers and focused when it arrives: saved, invalid,
 * warnings to accept before saving, or failed.
 */
export function UploadAnswer({
  upload,
  file,
  field,
  kind,
  onAcceptWarnings,
  onReset,
}: {
  upload: UploadState;
  file: File;
  field: UploadField;
  kind: FileKind;
  onAcceptWarnings: () => void;
  onReset: () => void;
}) {
  const { result, resultRef } = upload;
  return (
    <>
      <p role="status" className="sr-only">
        {result.name === "saved"
          ? `Saved: ${result.body.dataset.fileName}, ${result.body.dataset.rowCount} rows.`
          : result.name === "invalid"
            ? `Nothing was saved: the file has ${result.issues.filter((i) => i.severity === "error").length} errors, listed below.`
            : result.name === "warnings"
              ? "Not saved yet: read the warnings below and confirm to save."
              : result.name === "failed"
                ? `The file was not saved. ${result.message}`
                : ""}
      </p>
      <div ref={resultRef} tabIndex={-1} className="outline-none">
        {result.name === "saved" ? (
          <SavedSummary body={result.body} field={field} kind={kind} onReset={onReset} />
        ) : null}
        {result.name === "invalid" ? <Invalid result={result} file={file} field={field} /> : null}
        {result.name === "warnings" ? (
          <WarningsToAccept
            result={result}
            accepted={upload.acceptChecked}
            onAcceptedChange={upload.setAcceptChecked}
            saving={upload.uploading}
            onSave={onAcceptWarnings}
            onReset={onReset}
          />
        ) : null}
        {result.name === "failed" ? (
          <div className="mb-6" data-testid="upload-failed">
            <Notice tone="alarm">
              <p className="font-medium">The file was not saved.</p>
              <p>{result.message}</p>
            </Notice>
          </div>
        ) : null}
      </div>
    </>
  );
}

function Invalid({
  result,
  file,
  field,
}: {
  result: { message: string; issues: InputIssue[] };
  file: File;
  field: UploadField;
}) {
  const errors = result.issues.filter((i) => i.severity === "error").length;
  const warnings = result.issues.length - errors;
  return (
    <section
      className="mb-6 rounded-plot border border-alarm bg-white p-5"
      data-testid="upload-invalid"
      aria-labelledby="invalid-title"
    >
      <h2 id="invalid-title" className="mb-1 text-base font-semibold text-alarm">
        Nothing was saved: the file has {errors} error{errors === 1 ? "" : "s"}
      </h2>
      <p className="mb-1 text-sm">{result.message}</p>
      <p className="mb-3 text-sm text-ink-soft">
        Correct the file and choose it again, or change the columns above and save again.
        {warnings > 0 ? ` ${warnings} warning${warnings === 1 ? " is" : "s are"} listed too.` : ""}
        {result.issues.length >= 50 ? " Each kind of problem is listed up to 50 times." : ""}
      </p>
      <div className="mb-3">
        <button
          type="button"
          className={buttonClass.secondary}
          onClick={() =>
            downloadText(
              issuesCsv(result.issues),
              safeFileName(field.name, file.name.replace(/\.[^.]+$/, ""), "problems"),
            )
          }
        >
          Download errors as CSV
        </button>
      </div>
      <IssueTable
        issues={result.issues}
        caption={`Problems found in ${file.name}; nothing was saved`}
        testId="error-table"
      />
    </section>
  );
}

/** The file can be saved only once someone has read its warnings and said so. */
function WarningsToAccept({
  result,
  accepted,
  onAcceptedChange,
  saving,
  onSave,
  onReset,
}: {
  result: { message: string; issues: InputIssue[] };
  accepted: boolean;
  onAcceptedChange: (accepted: boolean) => void;
  saving: boolean;
  onSave: () => void;
  onReset: () => void;
}) {
  return (
    <section
      className="mb-6 rounded-plot border border-l-4 border-stake bg-stake-pale p-5"
      data-testid="upload-warnings"
      aria-labelledby="warnings-title"
    >
      <h2 id="warnings-title" className="mb-1 text-base font-semibold">
        Read these warnings before saving
      </h2>
      <p className="mb-3 text-sm text-ink-soft">{result.message} The file has not been saved.</p>
      <IssueTable issues={result.issues} caption="Warnings about the file" testId="warning-table" />
      <label className="mt-4 flex items-start gap-2 text-sm">
        <input
          type="checkbox"
          className="mt-1 accent-leaf"
          checked={accepted}
          onChange={(e) => onAcceptedChange(e.target.checked)}
        />
        I have read these warnings and want to save the file anyway
      </label>
      <div className="mt-3 flex gap-3">
        <button type="button" className={buttonClass.primary} disabled={!accepted || saving} onClick={onSave}>
          Save with these warnings
        </button>
        <button type="button" className={buttonClass.secondary} onClick={onReset}>
          Choose another file
        </button>
      </div>
    </section>
  );
}
