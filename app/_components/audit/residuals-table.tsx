"use client";
import { useEffect, useMemo, useState } from "react";
import useSWR from "swr";
import {
  createColumnHelper,
  rowPaginationFeature,
  rowSortingFeature,
  tableFeatures,
  useTable,
  type PaginationState,
  type SortingState,
} from "@tanstack/react-table";
import { fetcher } from "@/lib/fetcher";
import { keys, type ResidualQuery } from "@/lib/swr-keys";
import { RESIDUAL_SORTS } from "@/lib/validation/audit";
import type { AuditDto, Page, ResidualRowDto } from "@/lib/api-types";
import { PassMark, WithinMark } from "./pass-mark";
import { formatCount, mmNumber } from "./format";
import { FIRST_PAGE } from "./paging";

type SortKey = NonNullable<ResidualQuery["sort"]>;

const features = tableFeatures({ rowSortingFeature, rowPaginationFeature });
const helper = createColumnHelper<typeof features, ResidualRowDto>();
const SORTABLE = new Set<SortKey>(RESIDUAL_SORTS);

const mmCell =
  (digits = 1) =>
  ({ getValue }: { getValue: () => unknown }) =>
    mmNumber(getValue() as number | null, digits);

// Module scope keeps the column definitions stable between renders.
const columns = helper.columns([
  helper.accessor("seq", { header: "#", cell: ({ getValue }) => (getValue() as number) + 1 }),
  helper.accessor("plantId", {
    header: "Plant id",
    cell: ({ row }) =>
      row.original.plantId ?? (
        <span className="text-ink-faint">{row.original.surveyId ? `survey ${row.original.surveyId}` : "no id"}</span>
      ),
  }),
  helper.accessor("bed", { header: "Bed", cell: ({ getValue }) => getValue() ?? "–" }),
  helper.accessor("row", { header: "Row", enableSorting: false, cell: ({ getValue }) => getValue() ?? "–" }),
  helper.accessor("arm", { header: "Arm", cell: ({ getValue }) => getValue() ?? "–" }),
  helper.accessor("fix", { header: "Fix", enableSorting: false, cell: ({ getValue }) => getValue() ?? "–" }),
  helper.accessor("day", { header: "Day", enableSorting: false, cell: ({ getValue }) => getValue() ?? "–" }),
  helper.accessor("dE", { header: "dE mm", sortDescFirst: true, cell: mmCell() }),
  helper.accessor("dN", { header: "dN mm", sortDescFirst: true, cell: mmCell() }),
  helper.accessor("along", { header: "Along mm", sortDescFirst: true, cell: mmCell() }),
  helper.accessor("cross", { header: "Cross mm", sortDescFirst: true, cell: mmCell() }),
  helper.accessor("radial", { header: "Radial mm", sortDescFirst: true, cell: mmCell() }),
  helper.accessor("within", {
    header: "Tolerance",
    enableSorting: false,
    cell: ({ getValue }) => <WithinMark within={getValue() as boolean | null} />,
  }),
  helper.accessor("outlier", {
    header: "Outlier",
    enableSorting: false,
    cell: ({ getValue }) =>
      getValue() ? <PassMark passed={false} failWord="Outlier" /> : <span className="text-ink-faint">no</span>,
  }),
  helper.accessor("pairedBy", {
    header: "Paired by",
    enableSorting: false,
    cell: ({ row }) => (
      <>
        {row.original.pairedBy === "id" ? "plant id" : "position"}
        {row.original.beyondMaxDistance ? <span className="block text-xs text-alarm">beyond max. distance</span> : null}
      </>
    ),
  }),
]);

const NUMERIC = new Set(["seq", "dE", "dN", "along", "cross", "radial"]);
const SORT_LABEL: Record<SortKey, string> = {
  seq: "pairing order",
  plantId: "plant id",
  bed: "bed",
  arm: "tool arm",
  dE: "dE",
  dN: "dN",
  along: "along-row error",
  cross: "cross-row error",
  radial: "radial error",
};
const EMPTY: ResidualRowDto[] = [];

interface Filters {
  only: "" | "out" | "outliers";
  arm: string;
  bed: string;
  fix: string;
  day: string;
  q: string;
}
const NO_FILTERS: Filters = { only: "", arm: "", bed: "", fix: "", day: "", q: "" };

/** Per-plant residuals: sorting, filtering and paging are done by the server. */
export function ResidualsTable({ audit }: { audit: AuditDto }) {
  const summary = audit.summary!;
  const [sorting, setSorting] = useState<SortingState>([{ id: "seq", desc: false }]);
  const [pagination, setPagination] = useState<PaginationState>({ pageIndex: 0, pageSize: 25 });
  const [filters, setFilters] = useState<Filters>(NO_FILTERS);
  const [search, setSearch] = useState("");

  // Plant id search waits for a pause in typing.
  useEffect(() => {
    const t = setTimeout(() => {
      const q = search.trim();
      setFilters((f) => (f.q === q ? f : { ...f, q }));
      setPagination((p) => (p.pageIndex === 0 ? p : { ...p, pageIndex: 0 }));
    }, 300);
    return () => clearTimeout(t);
  }, [search]);

  function setFilter<K extends keyof Filters>(k: K, v: Filters[K]) {
    setFilters((f) => (f[k] === v ? f : { ...f, [k]: v }));
    setPagination((p) => (p.pageIndex === 0 ? p : { ...p, pageIndex: 0 }));
  }

  const query: ResidualQuery = useMemo(() => {
    const s = sorting[0];
    return {
      page: pagination.pageIndex + FIRST_PAGE,
      pageSize: pagination.pageSize,
      sort: s && SORTABLE.has(s.id as SortKey) ? (s.id as SortKey) : "seq",
      dir: s?.desc ? "desc" : "asc",
      only: filters.only || undefined,
      arm: filters.arm || undefined,
      bed: filters.bed || undefined,
      fix: filters.fix || undefined,
      day: filters.day || undefined,
      q: filters.q || undefined,
    };
  }, [sorting, pagination, filters]);

  const { data, error, isLoading, isValidating } = useSWR<Page<ResidualRowDto>>(
    keys.auditResiduals(audit.id, query),
    fetcher,
    { keepPreviousData: true },
  );

  const table = useTable({
    features,
    columns,
    data: data?.rows ?? EMPTY,
    getRowId: (r) => String(r.seq),
    state: { sorting, pagination },
    onSortingChange: (u) => {
      setSorting(u);
      setPagination((p) => ({ ...p, pageIndex: 0 }));
    },
    onPaginationChange: setPagination,
    manualSorting: true,
    manualPagination: true,
    enableMultiSort: false,
    enableSortingRemoval: false,
    rowCount: data?.total ?? 0,
  });

  const options = (name: "arm" | "bed" | "fix" | "day") =>
    (summary.groups[name] ?? []).map((g) => g.key).filter((k): k is string => k !== null);
  const total = data?.total ?? 0;
  const first = total === 0 ? 0 : pagination.pageIndex * pagination.pageSize + 1;
  const last = Math.min(total, (pagination.pageIndex + 1) * pagination.pageSize);
  const sortedBy = sorting[0];

  return (
    <section aria-labelledby="residuals-heading" data-testid="residuals">
      <h2 id="residuals-heading" className="mb-1 text-base font-semibold">
        Per-plant errors
      </h2>
      <p className="mb-3 text-sm text-ink-soft">
        Every paired plant. Choose a column heading to sort; filters and sorting apply to all{" "}
        {formatCount(summary.pairs)} pairs, not just this page.
      </p>

      <form
        className="mb-3 flex flex-wrap items-end gap-3 text-sm"
        role="search"
        aria-label="Filter per-plant errors"
        onSubmit={(e) => e.preventDefault()}
      >
        <div className="flex flex-col gap-1">
          <label htmlFor="residuals-only" className="font-medium">
            Show
          </label>
          <select
            id="residuals-only"
            className="rounded-plot border border-chalk-line bg-white px-2 py-1.5"
            value={filters.only}
            onChange={(e) => setFilter("only", e.target.value as Filters["only"])}
          >
            <option value="">all plants</option>
            <option value="out">only out of tolerance</option>
            <option value="outliers">only outliers</option>
          </select>
        </div>
        {(["arm", "bed", "fix", "day"] as const).map((name) => {
          const opts = options(name);
          const label = { arm: "Tool arm", bed: "Bed", fix: "GNSS fix", day: "Planting day" }[name];
          return opts.length > 0 ? (
            <div key={name} className="flex flex-col gap-1">
              <label htmlFor={`residuals-${name}`} className="font-medium">
                {label}
              </label>
              <select
                id={`residuals-${name}`}
                className="rounded-plot border border-chalk-line bg-white px-2 py-1.5"
                value={filters[name]}
                onChange={(e) => setFilter(name, e.target.value)}
              >
                <option value="">any</option>
                {opts.map((o) => (
                  <option key={o} value={o}>
                    {o}
                  </option>
                ))}
              </select>
            </div>
          ) : (
            <div key={name} className="flex flex-col gap-1">
              <label htmlFor={`residuals-${name}`} className="font-medium">
                {label}
              </label>
              <input
                id={`residuals-${name}`}
                className="w-24 rounded-plot border border-chalk-line bg-white px-2 py-1.5"
                value={filters[name]}
                onChange={(e) => setFilter(name, e.target.value.trim())}
              />
            </div>
          );
        })}
        <div className="flex flex-col gap-1">
          <label htmlFor="residuals-q" className="font-medium">
            Plant id contains
          </label>
          <input
            id="residuals-q"
            type="search"
            className="w-40 rounded-plot border border-chalk-line bg-white px-2 py-1.5"
            value={search}
            onChange={(e) => setSearch(e.target.value)}
          />
        </div>
        {JSON.stringify(filters) !== JSON.stringify(NO_FILTERS) ? (
          <button
            type="button"
            className="rounded-plot border border-chalk-line px-3 py-1.5 hover:bg-chalk"
            onClick={() => {
              setSearch("");
              setFilters(NO_FILTERS);
              setPagination((p) => ({ ...p, pageIndex: 0 }));
            }}
          >
            Clear filters
          </button>
        ) : null}
      </form>

      {error ? (
        <p role="alert" className="mb-2 text-sm text-alarm">
          The per-plant errors could not be loaded: {(error as Error).message}
        </p>
      ) : null}

      <p className="mb-2 text-sm" aria-live="polite" data-testid="residuals-status">
        {isLoading ? (
          "Loading…"
        ) : total === 0 ? (
          "No plants match these filters."
        ) : (
          <>
            Plants {formatCount(first)}–{formatCount(last)} of {formatCount(total)}
          </>
        )}
        {sortedBy ? <span className="text-ink-soft">, {sortText(sortedBy.id as SortKey, sortedBy.desc)}</span> : null}
        {isValidating && !isLoading ? <span className="text-ink-faint"> · updating</span> : null}
      </p>

      <div
        className="relative overflow-x-auto rounded-plot border border-chalk-line bg-white"
        role="region"
        aria-label="Per-plant errors"
        // biome-ignore lint/a11y/noNoninteractiveTabindex: a scrolling region must be reachable by keyboard
        tabIndex={0}
      >
        <table className="w-full text-left text-sm tabular-nums" data-testid="residuals-table" aria-busy={isValidating}>
          <caption className="sr-only">Per-plant errors, survey minus as-planted, in millimetres</caption>
          <thead className="bg-chalk text-xs text-ink-soft">
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id}>
                {group.headers.map((header) => {
                  const sorted = header.column.getIsSorted();
                  const numeric = NUMERIC.has(header.column.id);
                  return (
                    <th
                      key={header.id}
                      scope="col"
                      className={`px-2 py-2 font-medium whitespace-nowrap ${numeric ? "text-right" : ""}`}
                      aria-sort={sorted === "asc" ? "ascending" : sorted === "desc" ? "descending" : undefined}
                    >
                      {header.column.getCanSort() ? (
                        <button
                          type="button"
                          onClick={header.column.getToggleSortingHandler()}
                          className="inline-flex items-center gap-1 hover:text-ink"
                        >
                          <table.FlexRender header={header} />
                          <span aria-hidden="true">{sorted === "asc" ? "▲" : sorted === "desc" ? "▼" : "↕"}</span>
                        </button>
                      ) : (
                        <table.FlexRender header={header} />
                      )}
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody className="divide-y divide-chalk-deep">
            {table.getRowModel().rows.map((row) => (
              <tr
                key={row.id}
                data-testid="residual-row"
                data-bed={row.original.bed ?? ""}
                data-radial={row.original.radial}
                data-plant={row.original.plantId ?? ""}
                className={row.original.within === false ? "bg-alarm-pale/40" : undefined}
              >
                {row.getAllCells().map((cell) => (
                  <td
                    key={cell.id}
                    className={`px-2 py-1.5 whitespace-nowrap ${NUMERIC.has(cell.column.id) ? "text-right" : ""}`}
                  >
                    <table.FlexRender cell={cell} />
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>

      <nav className="mt-3 flex flex-wrap items-center gap-3 text-sm" aria-label="Pages of per-plant errors">
        <button
          type="button"
          className="rounded-plot border border-chalk-line px-3 py-1 disabled:opacity-40"
          onClick={() => table.firstPage()}
          disabled={!table.getCanPreviousPage()}
        >
          First
        </button>
        <button
          type="button"
          className="rounded-plot border border-chalk-line px-3 py-1 disabled:opacity-40"
          onClick={() => table.previousPage()}
          disabled={!table.getCanPreviousPage()}
        >
          Previous
        </button>
        <span>
          Page {pagination.pageIndex + 1} of {Math.max(1, table.getPageCount())}
        </span>
        <button
          type="button"
          className="rounded-plot border border-chalk-line px-3 py-1 disabled:opacity-40"
          onClick={() => table.nextPage()}
          disabled={!table.getCanNextPage()}
        >
          Next
        </button>
        <button
          type="button"
          className="rounded-plot border border-chalk-line px-3 py-1 disabled:opacity-40"
          onClick={() => table.lastPage()}
          disabled={!table.getCanNextPage()}
        >
          Last
        </button>
        <span className="ml-auto flex items-center gap-2">
          <label htmlFor="residuals-page-size">Rows per page</label>
          <select
            id="residuals-page-size"
            className="rounded-plot border border-chalk-line bg-white px-2 py-1"
            value={pagination.pageSize}
            onChange={(e) => table.setPageSize(Number(e.target.value))}
          >
            {[25, 50, 100].map((n) => (
              <option key={n} value={n}>
                {n}
              </option>
            ))}
          </select>
        </span>
      </nav>
    </section>
  );
}

function sortText(key: SortKey, desc: boolean): string {
  if (key === "seq") return desc ? "in reverse pairing order" : "in pairing order";
  const numeric = NUMERIC.has(key);
  return `sorted by ${SORT_LABEL[key]}, ${numeric ? (desc ? "largest first" : "smallest first") : desc ? "Z to A" : "A to Z"}`;
}
