"use client";
import { useEffect, useRef } from "react";
import useSWR from "swr";
import { fetcher } from "@/lib/fetcher";
import { mapKeys } from "@/lib/map/keys";
import { codeText, isOut } from "@/lib/map/select";
import { PAIR_FLAG, UNPAIRED_KINDS, type MapData } from "@/lib/map/types";
import type { ResidualRowDto, UnpairedRowDto } from "@/lib/api-types";
import { formatMm, formatSignedMm } from "@/app/_components/audit/format";
import type { MapTarget } from "./deck-view";

const KIND_WORDS: Record<UnpairedRowDto["kind"], string> = {
  "planted-not-found": "As-planted record without a checkpoint",
  "surveyed-not-planted": "Surveyed, but no record",
  ambiguous: "Survey point with two equally near records",
};

const side = (cross: number) => (cross > 0 ? "right of the row" : cross < 0 ? "left of the row" : "on the row line");

/** One line about whatever the pointer is over, from the binary payload (no request). */
export function tooltipText(data: MapData, target: MapTarget, metricValue: (seq: number) => number): string {
  const a = data.arrays,
    dict = data.meta.dict;
  if (target.kind === "cell") {
    const c = target.cell;
    const where = c.bed ? `Bed ${c.bed}, ` : "";
    const share = c.shareOut === null ? "no tolerance verdict" : `${c.out} of ${c.known} out of tolerance`;
    return `${where}${c.from.toFixed(0)}–${c.to.toFixed(0)} m along the row · ${c.n} checkpoint${c.n === 1 ? "" : "s"} · mean ${formatMm(c.mean)} · ${share}`;
  }
  if (target.kind === "unpaired") {
    const i = target.seq;
    const kind = UNPAIRED_KINDS[a.unpairedKind[i]];
    const bed = codeText(dict.bed, a.unpairedCodes.bed, i),
      row = codeText(dict.row, a.unpairedCodes.row, i);
    return `${KIND_WORDS[kind]}${bed ? ` · bed ${bed}` : ""}${row ? ` row ${row}` : ""} · tap or click for details`;
  }
  const i = target.seq;
  const id = a.pairIds[i] || "plant without id";
  const bed = codeText(dict.bed, a.pairCodes.bed, i),
    row = codeText(dict.row, a.pairCodes.row, i);
  const flags = a.pairFlags[i];
  const verdict = !(flags & PAIR_FLAG.WITHIN_KNOWN) ? "" : isOut(flags) ? " · out of tolerance" : " · within tolerance";
  return `${id}${bed ? ` · bed ${bed}` : ""}${row ? ` row ${row}` : ""} · ${formatMm(metricValue(i))}${verdict}`;
}

function Row({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    <div className="flex justify-between gap-3 py-0.5">
      <dt className="text-ink-soft">{label}</dt>
      <dd className="text-right font-medium">{children}</dd>
    </div>
  );
}

const metres = (v: number) => v.toFixed(3);

/** Side panel with the full record of the selected point, fetched as JSON when opened. */
export function DetailsPanel({
  auditId,
  crs,
  target,
  onClose,
}: {
  auditId: string;
  crs: string;
  target: MapTarget;
  onClose: () => void;
}) {
  const heading = useRef<HTMLHeadingElement>(null);
  const key =
    target.kind === "pair"
      ? mapKeys.mapPair(auditId, target.seq)
      : target.kind === "unpaired"
        ? mapKeys.mapUnpaired(auditId, target.seq)
        : null;
  const { data, error } = useSWR<{ pair?: ResidualRowDto; unpaired?: UnpairedRowDto }>(key, fetcher, {
    revalidateOnFocus: false,
  });
  // biome-ignore lint/correctness/useExhaustiveDependencies: focus moves to the heading each time another plant is shown.
  useEffect(() => heading.current?.focus(), [key]);

  let body: React.ReactNode;
  if (target.kind === "cell") {
    const c = target.cell;
    body = (
      <dl className="text-sm">
        {c.bed ? <Row label="Bed">{c.bed}</Row> : null}
        <Row label="Along the row">{`${c.from.toFixed(1)}–${c.to.toFixed(1)} m`}</Row>
        <Row label="Checkpoints">{c.n}</Row>
        <Row label="Mean error">{formatMm(c.mean)}</Row>
        <Row label="Out of tolerance">
          {c.shareOut === null ? "–" : `${c.out} of ${c.known} (${(c.shareOut * 100).toFixed(0)} %)`}
        </Row>
      </dl>
    );
  } else if (error)
    body = (
      <p role="alert" className="text-sm text-alarm">
        {(error as Error).message}
      </p>
    );
  else if (!data)
    body = (
      <p className="text-sm text-ink-faint" aria-busy="true">
        Loading…
      </p>
    );
  else if (data.pair) {
    const p = data.pair;
    body = (
      <div className="grid gap-3 text-sm" data-testid="details-pair" data-seq={p.seq}>
        <section>
          <h3 className="mb-1 text-xs font-semibold uppercase tracking-wide text-ink-faint">As-planted record</h3>
          <dl>
            <Row label="Plant id">{p.plantId ?? "–"}</Row>
            <Row label="Crop">{p.crop ?? "–"}</Row>
            <Row label="Bed · row">{`${p.bed ?? "–"} · ${p.row ?? "–"}`}</Row>
            <Row label="Tool arm">{p.arm ?? "–"}</Row>
            <Row label="GNSS fix">{p.fix ?? "–"}</Row>
            <Row label="Planting day">{p.day ?? "–"}</Row>
            <Row label={`Easting (${crs})`}>{metres(p.plantedE)}</Row>
            <Row label="Northing">{metres(p.plantedN)}</Row>
          </dl>
        </section>
        <section>
          <h3 className="mb-1 text-xs font-semibold uppercase tracking-wide text-ink-faint">Survey point</h3>
          <dl>
            <Row label="Survey id">{p.surveyId ?? "–"}</Row>
            <Row label="Easting">{metres(p.surveyE)}</Row>
            <Row label="Northing">{metres(p.surveyN)}</Row>
            <Row label="Paired by">
              {p.pairedBy === "id" ? "plant id" : "position"}
              {p.beyondMaxDistance ? " (beyond the maximum distance)" : ""}
            </Row>
          </dl>
        </section>
        <section>
          <h3 className="mb-1 text-xs font-semibold uppercase tracking-wide text-ink-faint">
            Residual (survey − record)
          </h3>
          <dl>
            <Row label="East · north">{`${formatSignedMm(p.dE)} · ${formatSignedMm(p.dN)}`}</Row>
            <Row label="Along the row">{formatSignedMm(p.along)}</Row>
            <Row label="Across the row">{p.cross === null ? "–" : `${formatSignedMm(p.cross)} (${side(p.cross)})`}</Row>
            <Row label="Radial">{formatMm(p.radial)}</Row>
            <Row label="Tolerance">
              {p.within === null ? (
                "no limits"
              ) : p.within ? (
                <span className="text-leaf">within</span>
              ) : (
                <span className="text-alarm">out of tolerance</span>
              )}
            </Row>
            {p.outlier ? <Row label="Outlier rule">flagged</Row> : null}
          </dl>
        </section>
      </div>
    );
  } else if (data.unpaired) {
    const u = data.unpaired;
    body = (
      <dl className="text-sm" data-testid="details-unpaired" data-seq={u.seq}>
        <Row label="Kind">{KIND_WORDS[u.kind]}</Row>
        <Row label="Id">{u.pointId ?? "–"}</Row>
        <Row label="File line">{u.line}</Row>
        <Row label="Crop">{u.crop ?? "–"}</Row>
        <Row label="Bed · row">{`${u.bed ?? "–"} · ${u.row ?? "–"}`}</Row>
        <Row label={`Easting (${crs})`}>{metres(u.e)}</Row>
        <Row label="Northing">{metres(u.n)}</Row>
      </dl>
    );
  }
  const title = target.kind === "pair" ? "Checkpoint" : target.kind === "unpaired" ? "Unpaired point" : "Cell";
  return (
    <aside
      className="absolute bottom-2 right-2 top-14 z-10 w-[min(20rem,calc(100%-1rem))] overflow-y-auto rounded-plot border border-chalk-line bg-white p-4 shadow-sm"
      aria-label={`${title} details`}
      data-testid="map-details"
      onKeyDown={(e) => {
        if (e.key === "Escape") onClose();
      }}
    >
      <div className="mb-3 flex items-start justify-between gap-2">
        <h2 ref={heading} tabIndex={-1} className="text-base font-semibold">
          {title}
        </h2>
        <button
          type="button"
          onClick={onClose}
          className="min-h-11 rounded-plot border border-ink-faint px-3 py-1 text-sm hover:bg-chalk"
        >
          Close
        </button>
      </div>
      {body}
    </aside>
  );
}
