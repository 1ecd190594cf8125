"use client";
import Link from "next/link";
import type { UploadOkDto } from "@/lib/api-types";
import { Notice, buttonClass } from "@/app/_components/field-form/controls";
import type { FileKind } from "./mapping-schema";
import { IssueTable } from "./issue-table";
import { KIND_NOUN, formatBytes, utmZone, type UploadField } from "./file-step-shared";

/** The server kept the file: what was stored, the warnings accepted, and where to go next. */
export function SavedSummary({
  body,
  field,
  kind,
  onReset,
}: {
  body: UploadOkDto;
  field: UploadField;
  kind: FileKind;
  onReset: () => void;
}) {
  const d = body.dataset;
  const other: FileKind = kind === "planted" ? "survey" : "planted";
  const suggestedZone = body.suggestedCrs ? utmZone(body.suggestedCrs) : null;
  const fieldZone = utmZone(field.crs);
  return (
    <section
      className="mb-6 rounded-plot border border-leaf bg-white p-5"
      data-testid="upload-saved"
      aria-labelledby="saved-title"
    >
      <h2 id="saved-title" className="mb-1 text-base font-semibold text-leaf">
        Saved: {d.fileName}
      </h2>
      <p className="mb-3 text-sm text-ink-soft">
        The file is kept exactly as uploaded, and its points are stored with {field.name}.
      </p>
      <dl className="mb-4 grid grid-cols-2 gap-x-6 gap-y-2 text-sm md:grid-cols-4">
        <div>
          <dt className="text-ink-faint">Rows read</dt>
          <dd data-testid="saved-rows">{d.rowCount.toLocaleString("en-GB")}</dd>
        </div>
        <div>
          <dt className="text-ink-faint">SHA-256</dt>
          <dd className="font-mono" title={d.sha256} data-testid="saved-sha">
            {d.sha256.slice(0, 12)}…
          </dd>
        </div>
        <div>
          <dt className="text-ink-faint">Size</dt>
          <dd>{formatBytes(d.sizeBytes)}</dd>
        </div>
        <div>
          <dt className="text-ink-faint">Read in</dt>
          <dd className="font-mono">{d.crs}</dd>
        </div>
        <div>
          <dt className="text-ink-faint">Warnings kept</dt>
          <dd data-testid="saved-warnings">{body.warnings.length}</dd>
        </div>
      </dl>
      {body.warnings.length > 0 ? (
        <div className="mb-4">
          <h3 className="mb-2 text-sm font-semibold">Warnings you accepted (kept with the file)</h3>
          <IssueTable issues={body.warnings} caption="Warnings kept with the file" testId="kept-warning-table" />
        </div>
      ) : null}
      {suggestedZone && fieldZone && suggestedZone !== fieldZone ? (
        <div className="mb-4">
          <Notice tone="caution">
            These points lie in UTM zone {suggestedZone} ({body.suggestedCrs}), but {field.name} is set to {field.crs}.{" "}
            <Link href={`/fields/${field.id}/edit`} className={buttonClass.quiet}>
              Check the field&apos;s coordinate system
            </Link>
          </Notice>
        </div>
      ) : null}
      <div className="flex flex-wrap items-center gap-4">
        <Link href={`/fields/${field.id}`} className={buttonClass.primary}>
          Back to {field.name}
        </Link>
        <Link href={`/fields/${field.id}/upload?kind=${other}`} className={buttonClass.secondary}>
          Upload the {KIND_NOUN[other]}
        </Link>
        <button type="button" className={buttonClass.quiet} onClick={onReset}>
          Upload another file of {KIND_NOUN[kind]}
        </button>
      </div>
    </section>
  );
}
