"use client";
import { useEffect, useId, useState } from "react";
import useSWR from "swr";
import { fetcher } from "@/lib/fetcher";
import { keys } from "@/lib/swr-keys";
import type { CrsDto } from "@/lib/api-types";
import { describedBy, inputClass } from "./controls";

const KIND_WORDS: Record<CrsDto["kind"], string> = {
  geographic: "latitude/longitude in degrees",
  projected: "easting/northing in metres",
};

/** Debounced copy of a value, so the list is not fetched on every key stroke. */
function useDebounced<T>(value: T, ms: number): T {
  const [v, setV] = useState(value);
  useEffect(() => {
    const t = setTimeout(() => setV(value), ms);
    return () => clearTimeout(t);
  }, [value, ms]);
  return v;
}

/**
 * A searchable coordinate reference system: a text box (an EPSG code or a +proj string may be typed)
 * with a list of matches from GET /api/crs?q= (ARIA combobox with a listbox popup).
 */
export function CrsPicker({
  id,
  label,
  value,
  onChange,
  onBlur,
  error,
  hint,
  disabled,
}: {
  id: string;
  label: string;
  value: string;
  onChange: (code: string) => void;
  onBlur?: () => void;
  error?: string;
  hint?: React.ReactNode;
  disabled?: boolean;
}) {
  const listId = useId();
  const [open, setOpen] = useState(false);
  const [query, setQuery] = useState("");
  const [active, setActive] = useState(-1);
  const q = useDebounced(query, 150);
  const list = useSWR<{ crs: CrsDto[] }>(open ? keys.crs(q) : null, fetcher, { keepPreviousData: true });
  // The chosen system's name, so people can see they picked the right one.
  const chosen = useSWR<{ crs: CrsDto[] }>(
    /^EPSG:\d{4,5}$/i.test(value.trim()) ? keys.crs(value.trim()) : null,
    fetcher,
  );
  const chosenEntry = chosen.data?.crs.find((c) => c.code.toUpperCase() === value.trim().toUpperCase());
  const options = (list.data?.crs ?? []).slice(0, 40);

  const choose = (c: CrsDto) => {
    onChange(c.code);
    setOpen(false);
    setActive(-1);
  };

  const onKeyDown = (e: React.KeyboardEvent<HTMLInputElement>) => {
    if (e.key === "ArrowDown") {
      e.preventDefault();
      if (!open) setOpen(true);
      setActive((a) => Math.min(a + 1, options.length - 1));
    } else if (e.key === "ArrowUp") {
      e.preventDefault();
      setActive((a) => Math.max(a - 1, 0));
    } else if (e.key === "Enter" && open && active >= 0 && options[active]) {
      e.preventDefault();
      choose(options[active]);
    } else if (e.key === "Escape" && open) {
      e.preventDefault();
      setOpen(false);
    }
  };

  const noteId = `${id}-chosen`;
  const described = [describedBy(id, { hint, error }), noteId].filter(Boolean).join(" ");
  return (
    <div className="mb-4">
      <label htmlFor={id} className="mb-1 block text-sm font-medium">
        {label}
      </label>
      <div className="relative">
        <input
          id={id}
          type="text"
          role="combobox"
          autoComplete="off"
          spellCheck={false}
          disabled={disabled}
          aria-autocomplete="list"
          aria-expanded={open}
          aria-controls={listId}
          aria-activedescendant={open && active >= 0 ? `${listId}-${active}` : undefined}
          aria-invalid={error ? true : undefined}
          aria-describedby={described}
          placeholder="Search by code, zone or name, e.g. 25831 or UTM 31"
          value={value}
          onChange={(e) => {
            onChange(e.target.value);
            setQuery(e.target.value);
            setOpen(true);
            setActive(-1);
          }}
          onFocus={() => {
            setQuery("");
          }}
          onClick={() => setOpen(true)}
          onBlur={() => {
            setOpen(false);
            onBlur?.();
          }}
          onKeyDown={onKeyDown}
          className={`${inputClass(!!error)} font-mono`}
        />
        {/* The WAI-ARIA combobox pattern: focus stays in the input, which names the active option (aria-activedescendant). */}
        <ul
          id={listId}
          role="listbox"
          aria-label={`${label}: matches`}
          hidden={!open}
          className="absolute z-20 mt-1 max-h-72 w-full overflow-auto rounded-plot border border-chalk-line bg-white py-1 text-sm shadow-lg"
        >
          {list.error ? (
            <li role="presentation" className="px-3 py-2 text-alarm">
              The list of coordinate systems could not be loaded; type an EPSG code such as EPSG:25831.
            </li>
          ) : options.length === 0 ? (
            <li role="presentation" className="px-3 py-2 text-ink-faint">
              {list.isLoading
                ? "Searching…"
                : "No coordinate system matches; try a number such as 25831 or a word such as UTM."}
            </li>
          ) : (
            options.map((c, i) => (
              // biome-ignore lint/a11y/useKeyWithClickEvents: the input handles arrows and Enter for the options.
              // biome-ignore lint/a11y/useFocusableInteractive: options are never focused; the input keeps focus.
              <li
                key={c.code}
                id={`${listId}-${i}`}
                role="option"
                aria-selected={i === active || c.code === value}
                onMouseDown={(e) => e.preventDefault()}
                onClick={() => choose(c)}
                onMouseEnter={() => setActive(i)}
                className={`cursor-pointer px-3 py-1.5 ${i === active ? "bg-leaf-pale" : ""}`}
              >
                <span className="font-mono">{c.code}</span> · {c.name}
                <span className="block text-xs text-ink-faint">{KIND_WORDS[c.kind]}</span>
              </li>
            ))
          )}
        </ul>
      </div>
      <p id={noteId} className="mt-1 text-xs text-ink-soft" data-testid={`${id}-chosen`}>
        {chosenEntry
          ? `${chosenEntry.name} — ${KIND_WORDS[chosenEntry.kind]}`
          : value.trim().startsWith("+proj=")
            ? "Custom proj definition"
            : ""}
      </p>
      {hint ? (
        <p id={`${id}-hint`} className="mt-1 text-xs text-ink-faint">
          {hint}
        </p>
      ) : null}
      {error ? (
        <p id={`${id}-error`} className="mt-1 text-sm text-alarm" data-field-error={id}>
          {error}
        </p>
      ) : null}
    </div>
  );
}
