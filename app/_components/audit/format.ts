/** Display helpers for audit figures. Inputs are metres or shares (0–1), as in the API. */
import type { Interval } from "@/lib/audit/types";

export { formatMm } from "@/app/_components/ui";

const MINUS = "\u2212";

/** Millimetres with an explicit sign, e.g. "+1.2 mm", "−0.4 mm". */
export function formatSignedMm(metres: number | null | undefined): string {
  if (metres === null || metres === undefined || !Number.isFinite(metres)) return "–";
  const mm = metres * 1000;
  const text = Math.abs(mm).toFixed(1);
  if (text === "0.0") return "0.0 mm";
  return `${mm < 0 ? MINUS : "+"}${text} mm`;
}

/** A bias interval in millimetres, e.g. "−0.4 to +1.2 mm". */
export function formatIntervalMm(ci: Interval | null | undefined): string {
  if (!ci) return "–";
  return `${formatSignedMm(ci.lower).replace(" mm", "")} to ${formatSignedMm(ci.upper)}`;
}

/** A share 0–1 as a percentage with one decimal, e.g. "97.3 %". */
export function formatPct(share: number | null | undefined, digits = 1): string {
  if (share === null || share === undefined || !Number.isFinite(share)) return "–";
  return `${(share * 100).toFixed(digits)} %`;
}

/** A plain number with thousands separators. */
export function formatCount(n: number | null | undefined): string {
  if (n === null || n === undefined || !Number.isFinite(n)) return "–";
  return n.toLocaleString("en-GB");
}

/** Millimetres as a bare number for table cells, e.g. "−3.4". */
export function mmNumber(metres: number | null | undefined, digits = 1): string {
  if (metres === null || metres === undefined || !Number.isFinite(metres)) return "–";
  const v = (metres * 1000).toFixed(digits);
  return v.startsWith("-") ? MINUS + v.slice(1) : v;
}
