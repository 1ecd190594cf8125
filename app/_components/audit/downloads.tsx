"use client";
import { useEffect, useState } from "react";
import { keys } from "@/lib/swr-keys";
import type { SheetSeparator, SheetUnits } from "@/lib/audit/spreadsheet-csv";

/** CSV report links: plain downloads, open to every role. Without a format, the reports exactly as computed. */
export function auditCsvUrls(auditId: string, format?: { units: SheetUnits; sep: SheetSeparator }) {
  const base = keys.audit(auditId);
  const q = format ? `?units=${format.units}&sep=${format.sep}` : "";
  return {
    residuals: `${base}/residuals.csv${q}`,
    summary: `${base}/summary.csv${q}`,
    unpaired: `${base}/unpaired.csv`,
  };
}

/** Semicolon (with decimal comma) when the browser's language writes 1.5 as "1,5", else comma. */
function separatorOfLocale(locale: string | undefined): SheetSeparator {
  try {
    const decimal = new Intl.NumberFormat(locale).formatToParts(1.5).find((p) => p.type === "decimal")?.value;
    return decimal === "," ? "semicolon" : "comma";
  } catch {
    return "comma";
  }
}

const link =
  "inline-flex items-center gap-1.5 rounded-plot border border-chalk-line bg-white px-3 py-1.5 text-sm font-medium text-leaf hover:bg-leaf-pale";
const icon = (
  <svg width="14" height="14" viewBox="0 0 14 14" aria-hidden="true">
    <path d="M7 1v8M3.5 5.5L7 9l3.5-3.5M2 12.5h10" stroke="currentColor" strokeWidth="1.6" fill="none" />
  </svg>
);

export function DownloadLinks({ auditId }: { auditId: string }) {
  const [units, setUnits] = useState<SheetUnits>("mm");
  const [sep, setSep] = useState<SheetSeparator>("comma");
  // The browser's locale is only known on the client; the first render uses the comma so server and client agree.
  useEffect(() => setSep(separatorOfLocale(navigator.language)), []);
  const sheet = auditCsvUrls(auditId, { units, sep });
  const asComputed = auditCsvUrls(auditId);
  return (
    <div className="space-y-2">
      <nav aria-label="Download reports" className="flex flex-wrap items-center gap-2" data-testid="downloads">
        <a className={link} href={sheet.residuals} download>
          {icon}Per-plant errors (CSV)
        </a>
        <a className={link} href={sheet.summary} download>
          {icon}Summary (CSV)
        </a>
        <a className={link} href={asComputed.unpaired} download>
          {icon}Unpaired points (CSV)
        </a>
        <label className="text-sm">
          Errors in{" "}
          <select
            className="min-h-9 rounded-plot border border-ink-faint bg-white px-1 py-0.5"
            value={units}
            onChange={(e) => setUnits(e.target.value as SheetUnits)}
          >
            <option value="mm">millimetres</option>
            <option value="m">metres</option>
          </select>
        </label>
        <label className="text-sm">
          Spreadsheet style{" "}
          <select
            className="min-h-9 rounded-plot border border-ink-faint bg-white px-1 py-0.5"
            value={sep}
            onChange={(e) => setSep(e.target.value as SheetSeparator)}
          >
            <option value="comma">comma, decimal point (1.5)</option>
            <option value="semicolon">semicolon, decimal comma (1,5)</option>
          </select>
        </label>
      </nav>
      <nav aria-label="Reports as computed" className="text-xs text-ink/70" data-testid="downloads-as-computed">
        As computed and hashed at sign-off (comma, metres, the engine's column names):{" "}
        <a className="text-leaf underline" href={asComputed.residuals} download>
          per-plant errors
        </a>
        ,{" "}
        <a className="text-leaf underline" href={asComputed.summary} download>
          summary
        </a>
        .
      </nav>
    </div>
  );
}
