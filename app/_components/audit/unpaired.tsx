"use client";
import { useState } from "react";
import useSWR from "swr";
import { fetcher } from "@/lib/fetcher";
import { keys } from "@/lib/swr-keys";
import type { AuditDto, Page, UnpairedRowDto } from "@/lib/api-types";
import { formatCount } from "./format";
import { FIRST_PAGE } from "./paging";

type Kind = UnpairedRowDto["kind"];

const KINDS: { kind: Kind; title: string; explain: string; count: (s: NonNullable<AuditDto["summary"]>) => number }[] =
  [
    {
      kind: "planted-not-found",
      title: "Planted, not found in the survey",
      explain:
        "Records with no surveyed partner: the plant died or was not chosen as a checkpoint. Most records are not surveyed, so a large count is normal.",
      count: (s) => s.unmatchedPlanted,
    },
    {
      kind: "surveyed-not-planted",
      title: "Surveyed, not in the records",
      explain:
        "Survey points with no record near enough: a weed or volunteer measured by mistake, or a plant the machine did not record.",
      count: (s) => s.unmatchedSurvey,
    },
    {
      kind: "ambiguous",
      title: "Ambiguous",
      explain:
        "Survey points without a plant id that lie almost equally near two records, so they were left unpaired rather than guessed.",
      count: (s) => s.ambiguousSurvey,
    },
  ];

const PAGE_SIZE = 20;

/** The three lists of points left unpaired, each with its count and a paged list. */
export function UnpairedLists({ audit }: { audit: AuditDto }) {
  const summary = audit.summary!;
  const [open, setOpen] = useState<Kind>(
    () => KINDS.find((k) => k.kind !== "planted-not-found" && k.count(summary) > 0)?.kind ?? "planted-not-found",
  );
  return (
    <section aria-labelledby="unpaired-heading" data-testid="unpaired">
      <h2 id="unpaired-heading" className="mb-3 text-base font-semibold">
        Left unpaired
      </h2>
      <div className="mb-3 flex flex-wrap gap-2" role="group" aria-label="Which list">
        {KINDS.map((k) => (
          <button
            key={k.kind}
            type="button"
            aria-pressed={open === k.kind}
            onClick={() => setOpen(k.kind)}
            className={`rounded-plot border px-3 py-1.5 text-sm ${open === k.kind ? "border-leaf bg-leaf-pale font-medium" : "border-chalk-line bg-white hover:bg-chalk"}`}
            data-testid={`unpaired-tab-${k.kind}`}
          >
            {k.title} <span className="tabular-nums">({formatCount(k.count(summary))})</span>
          </button>
        ))}
      </div>
      {KINDS.filter((k) => k.kind === open).map((k) => (
        <UnpairedList key={k.kind} auditId={audit.id} kind={k.kind} title={k.title} explain={k.explain} />
      ))}
    </section>
  );
}

function UnpairedList({
  auditId,
  kind,
  title,
  explain,
}: {
  auditId: string;
  kind: Kind;
  title: string;
  explain: string;
}) {
  const [pageIndex, setPageIndex] = useState(0);
  const { data, error, isLoading } = useSWR<Page<UnpairedRowDto>>(
    keys.auditUnpaired(auditId, { kind, page: pageIndex + FIRST_PAGE, pageSize: PAGE_SIZE }),
    fetcher,
    { keepPreviousData: true },
  );
  const total = data?.total ?? 0;
  const pages = Math.max(1, Math.ceil(total / PAGE_SIZE));
  return (
    <div className="rounded-plot border border-chalk-line bg-white p-4" data-testid={`unpaired-${kind}`}>
      <p className="mb-2 text-sm text-ink-soft">{explain}</p>
      {error ? (
        <p role="alert" className="text-sm text-alarm">
          This list could not be loaded: {(error as Error).message}
        </p>
      ) : null}
      {isLoading ? (
        <p className="text-sm text-ink-faint">Loading…</p>
      ) : total === 0 ? (
        <p className="text-sm text-ink-faint">None.</p>
      ) : (
        <>
          <div
            className="relative overflow-x-auto"
            role="region"
            aria-label="Unpaired points"
            // biome-ignore lint/a11y/noNoninteractiveTabindex: a scrolling region must be reachable by keyboard
            tabIndex={0}
          >
            <table className="w-full text-left text-sm tabular-nums">
              <caption className="sr-only">
                {title}: {total} points
              </caption>
              <thead className="text-xs text-ink-faint">
                <tr>
                  <th scope="col" className="py-1 pr-2 font-medium">
                    Point id
                  </th>
                  <th scope="col" className="pr-2 font-medium">
                    File line
                  </th>
                  <th scope="col" className="pr-2 font-medium">
                    Crop
                  </th>
                  <th scope="col" className="pr-2 font-medium">
                    Bed
                  </th>
                  <th scope="col" className="pr-2 font-medium">
                    Row
                  </th>
                  <th scope="col" className="pr-2 text-right font-medium">
                    Easting (m)
                  </th>
                  <th scope="col" className="text-right font-medium">
                    Northing (m)
                  </th>
                </tr>
              </thead>
              <tbody className="divide-y divide-chalk-deep">
                {data!.rows.map((r) => (
                  <tr key={r.seq}>
                    <td className="py-1 pr-2">{r.pointId ?? <span className="text-ink-faint">no id</span>}</td>
                    <td className="pr-2">{r.line}</td>
                    <td className="pr-2">{r.crop ?? "–"}</td>
                    <td className="pr-2">{r.bed ?? "–"}</td>
                    <td className="pr-2">{r.row ?? "–"}</td>
                    <td className="pr-2 text-right">{r.e.toFixed(3)}</td>
                    <td className="text-right">{r.n.toFixed(3)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          <nav className="mt-2 flex items-center gap-3 text-sm" aria-label={`Pages of ${title.toLowerCase()}`}>
            <button
              type="button"
              className="rounded-plot border border-chalk-line px-3 py-1 disabled:opacity-40"
              disabled={pageIndex === 0}
              onClick={() => setPageIndex((p) => p - 1)}
            >
              Previous
            </button>
            <span>
              Page {pageIndex + 1} of {pages} · {formatCount(total)} points
            </span>
            <button
              type="button"
              className="rounded-plot border border-chalk-line px-3 py-1 disabled:opacity-40"
              disabled={pageIndex + 1 >= pages}
              onClick={() => setPageIndex((p) => p + 1)}
            >
              Next
            </button>
          </nav>
        </>
      )}
    </div>
  );
}
