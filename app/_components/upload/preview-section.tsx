"use client";
import type { ColumnRole } from "@/geo";
import type { CsvPreview } from "./preview-types";
import { formatBytes, type Preview } from "./file-step-shared";

const DELIMITER_NAME: Record<CsvPreview["delimiter"], string> = {
  ",": "comma",
  ";": "semicolon",
  "\t": "tab",
  "|": "pipe",
};

/** Step 2: what the browser read of the file, each column labelled with the part it plays. */
export function FilePreview({
  file,
  preview,
  roleOf,
  label,
}: {
  file: File;
  preview: Preview;
  roleOf: Map<string, ColumnRole>;
  label: (r: ColumnRole) => string;
}) {
  return (
    <section
      aria-labelledby="step-preview"
      className="mb-6 rounded-plot border border-chalk-line bg-white p-5"
      data-testid="upload-preview"
    >
      <h2 id="step-preview" className="mb-2 text-base font-semibold">
        2. The first rows, as read in this browser
      </h2>
      <PreviewFacts preview={preview} file={file} />
      <PreviewTable preview={preview} roleOf={roleOf} label={label} />
    </section>
  );
}

function PreviewFacts({ preview, file }: { preview: Preview; file: File }) {
  return (
    <dl className="mb-3 grid grid-cols-2 gap-x-6 gap-y-1 text-sm md:grid-cols-4" data-testid="preview-facts">
      <div>
        <dt className="text-ink-faint">File</dt>
        <dd className="break-all">
          {file.name} · {formatBytes(file.size)}
        </dd>
      </div>
      {preview.format === "csv" ? (
        <>
          <div>
            <dt className="text-ink-faint">Rows</dt>
            <dd>
              {preview.rowCountExact ? "" : "about "}
              {preview.rowCount.toLocaleString("en-GB")}
            </dd>
          </div>
          <div>
            <dt className="text-ink-faint">Delimiter</dt>
            <dd data-testid="preview-delimiter">{DELIMITER_NAME[preview.delimiter]}</dd>
          </div>
          <div>
            <dt className="text-ink-faint">Decimal comma</dt>
            <dd data-testid="preview-decimal-comma">
              {preview.decimalCommaSeen
                ? "found — 52,5 is read as 52.5"
                : preview.decimalCommaAccepted
                  ? "none seen (would be read as a decimal point)"
                  : "no — comma separates columns"}
            </dd>
          </div>
        </>
      ) : (
        <>
          <div>
            <dt className="text-ink-faint">Features</dt>
            <dd>{preview.featureCount.toLocaleString("en-GB")}</dd>
          </div>
          <div>
            <dt className="text-ink-faint">Format</dt>
            <dd>GeoJSON FeatureCollection</dd>
          </div>
          <div>
            <dt className="text-ink-faint">CRS named in the file</dt>
            <dd>{preview.crsHint ?? "none (GeoJSON means WGS 84)"}</dd>
          </div>
        </>
      )}
      {preview.format === "geojson" && Object.keys(preview.otherGeometries).length > 0 ? (
        <div className="col-span-full text-alarm">
          Not points:{" "}
          {Object.entries(preview.otherGeometries)
            .map(([t, n]) => `${n} ${t}`)
            .join(", ")}
          . Each plant must be one Point feature.
        </div>
      ) : null}
      {preview.header.length > 0 &&
      preview.header.every((h) => h !== "" && Number.isFinite(Number(h.replace(",", ".")))) ? (
        <div className="col-span-full text-alarm">
          The first line holds numbers, not column names. Add a header line such as plant_id,lat,lon.
        </div>
      ) : null}
    </dl>
  );
}

function PreviewTable({
  preview,
  roleOf,
  label,
}: {
  preview: Preview;
  roleOf: Map<string, ColumnRole>;
  label: (r: ColumnRole) => string;
}) {
  if (preview.rows.length === 0) return <p className="text-sm text-alarm">The file has a header but no rows.</p>;
  return (
    <div className="max-h-96 overflow-auto rounded-plot border border-chalk-line">
      <table className="w-full text-left font-mono text-xs" data-testid="preview-table">
        <caption className="sr-only">
          First {preview.rows.length} rows of the file, with the part each column plays
        </caption>
        <thead className="sticky top-0 bg-chalk">
          <tr>
            <th scope="col" className="px-2 py-1.5 font-sans font-medium text-ink-faint">
              {preview.format === "csv" ? "Line" : "Feature"}
            </th>
            {preview.format === "geojson" ? (
              <th scope="col" className="px-2 py-1.5 font-sans font-medium">
                geometry<span className="block text-leaf">position</span>
              </th>
            ) : null}
            {preview.header.map((h, i) => {
              const role = roleOf.get(h);
              return (
                <th key={`${i}-${h}`} scope="col" className="px-2 py-1.5 align-bottom font-medium">
                  {h}
                  <span className={`block font-sans text-xs ${role ? "text-leaf" : "text-ink-faint"}`}>
                    {role ? label(role) : "not read"}
                  </span>
                </th>
              );
            })}
          </tr>
        </thead>
        <tbody className="divide-y divide-chalk-deep">
          {preview.rows.map((r, n) => (
            <tr key={r.line}>
              <td className="px-2 py-1 text-ink-faint">{r.line}</td>
              {preview.format === "geojson" ? <td className="px-2 py-1">{preview.positions[n]}</td> : null}
              {preview.header.map((_, i) => (
                <td key={i} className="px-2 py-1 whitespace-nowrap">
                  {r.cells[i] ?? ""}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
