import { keys } from "@/lib/swr-keys";

/** CSV report links: plain downloads, open to every role. */
export function auditCsvUrls(auditId: string) {
  const base = keys.audit(auditId);
  return { residuals: `${base}/residuals.csv`, summary: `${base}/summary.csv`, unpaired: `${base}/unpaired.csv` };
}

export function DownloadLinks({ auditId }: { auditId: string }) {
  const urls = auditCsvUrls(auditId);
  const link =
    "inline-flex items-center gap-1.5 rounded-plot border border-chalk-line bg-white px-3 py-1.5 text-sm font-medium text-leaf hover:bg-leaf-pale";
  const icon = (
    <svg width="14" height="14" viewBox="0 0 14 14" aria-hidden="true">
      <path d="M7 1v8M3.5 5.5L7 9l3.5-3.5M2 12.5h10" stroke="currentColor" strokeWidth="1.6" fill="none" />
    </svg>
  );
  return (
    <nav aria-label="Download reports" className="flex flex-wrap gap-2" data-testid="downloads">
      <a className={link} href={urls.residuals} download>
        {icon}Per-plant errors (CSV)
      </a>
      <a className={link} href={urls.summary} download>
        {icon}Summary (CSV)
      </a>
      <a className={link} href={urls.unpaired} download>
        {icon}Unpaired points (CSV)
      </a>
    </nav>
  );
}
