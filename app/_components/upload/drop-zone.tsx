"use client";
import { useState } from "react";

export const ACCEPTED_EXTENSIONS = [".csv", ".txt", ".tsv", ".geojson", ".json"] as const;

/** Why a file cannot be taken, or null when it can. */
export function fileProblem(file: File, maxBytes: number): string | null {
  const ext = /\.[^.]+$/.exec(file.name)?.[0]?.toLowerCase() ?? "";
  if (!(ACCEPTED_EXTENSIONS as readonly string[]).includes(ext)) {
    return `“${file.name}” is not a file Plotproof reads. Choose a .csv, .txt or .tsv export, or a .geojson/.json FeatureCollection${/\.(xlsx?|ods)$/i.test(file.name) ? " (save the spreadsheet as CSV first)" : ""}.`;
  }
  if (file.size === 0) return `“${file.name}” is empty.`;
  if (file.size > maxBytes)
    return `“${file.name}” is ${(file.size / 1024 / 1024).toFixed(0)} MB; files up to ${maxBytes / 1024 / 1024} MB can be uploaded.`;
  return null;
}

/**
 * Drop a file here, or choose it: a real file input (focusable, opens the picker with Enter or Space)
 * under a label that is also the drop target.
 */
export function DropZone({
  id,
  onFile,
  disabled,
  error,
  chosen,
}: {
  id: string;
  onFile: (file: File) => void;
  disabled?: boolean;
  error?: string | null;
  chosen?: File | null;
}) {
  const [over, setOver] = useState(false);
  const hintId = `${id}-hint`,
    errId = `${id}-error`;
  return (
    // biome-ignore lint/a11y/noStaticElementInteractions: dropping is a mouse shortcut; the file input inside serves the keyboard.
    <div
      onDragOver={(e) => {
        if (disabled) return;
        e.preventDefault();
        e.dataTransfer.dropEffect = "copy";
        setOver(true);
      }}
      onDragLeave={() => setOver(false)}
      onDrop={(e) => {
        e.preventDefault();
        setOver(false);
        if (disabled) return;
        const f = e.dataTransfer.files?.[0];
        if (f) onFile(f);
      }}
      data-testid="drop-zone"
    >
      <input
        id={id}
        type="file"
        accept={ACCEPTED_EXTENSIONS.join(",")}
        disabled={disabled}
        className="peer sr-only"
        aria-describedby={[hintId, error ? errId : null].filter(Boolean).join(" ")}
        aria-invalid={error ? true : undefined}
        onChange={(e) => {
          const f = e.target.files?.[0];
          if (f) onFile(f);
          e.target.value = "";
        }}
      />
      <label
        htmlFor={id}
        className={`flex min-h-40 cursor-pointer flex-col items-center justify-center rounded-plot border-2 border-dashed px-6 py-10 text-center transition-colors peer-focus-visible:outline-3 peer-focus-visible:outline-offset-2 peer-focus-visible:outline-stake-deep peer-disabled:cursor-not-allowed peer-disabled:opacity-60 ${
          over
            ? "border-leaf bg-leaf-pale"
            : error
              ? "border-alarm bg-white"
              : "border-ink-faint bg-white hover:border-leaf"
        }`}
      >
        <svg aria-hidden="true" viewBox="0 0 24 24" className="mb-2 h-8 w-8 text-leaf">
          <path d="M12 16V4M7 9l5-5 5 5M4 16v4h16v-4" fill="none" stroke="currentColor" strokeWidth="2" />
        </svg>
        <span className="block text-lg font-medium">Choose a file or drop it here</span>
        <span className="mt-1 block text-sm text-ink-soft">
          {chosen
            ? `Chosen: ${chosen.name} — choose again to replace it`
            : "Tap or click here, or press Enter or Space, to open the file picker"}
        </span>
      </label>
      <p id={hintId} className="mt-2 text-xs text-ink-faint">
        CSV (.csv, .txt, .tsv — comma, semicolon, tab or pipe separated) or GeoJSON (.geojson, .json) with one point per
        plant. The file is read in this browser first; nothing is sent until you save.
      </p>
      {error ? (
        <p id={errId} role="alert" className="mt-1 text-sm text-alarm" data-field-error={id}>
          {error}
        </p>
      ) : null}
    </div>
  );
}
