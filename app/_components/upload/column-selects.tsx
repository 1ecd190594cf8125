"use client";
import { useMemo } from "react";
import { Controller } from "react-hook-form";
import { FieldRow, describedBy, inputClass } from "@/app/_components/field-form/controls";
import { guessColumns } from "./mapping-schema";
import type { Preview } from "./file-step-shared";
import type { ColumnMappingState } from "./use-column-mapping";

/** One select per part of a record (plant id, positions, crop, …), each with a hint of what it will read. */
export function ColumnSelects({ mapping, preview }: { mapping: ColumnMappingState; preview: Preview }) {
  const { header, format } = preview;
  const {
    form: { control },
    errors,
    values,
    plan,
    notInFile,
    coords,
    label,
    roles,
  } = mapping;
  const samples = useMemo(() => {
    const out = new Map<string, string>();
    header.forEach((h, i) => {
      const v = preview.rows.map((r) => r.cells[i]).find((c) => c !== undefined && c.trim() !== "");
      if (v !== undefined) out.set(h, v);
    });
    return out;
  }, [header, preview.rows]);
  const guessed = useMemo(() => guessColumns(header, format, coords).columns, [header, format, coords]);
  return (
    <div className="grid gap-x-6 md:grid-cols-3">
      {roles.map((role) => {
        const id = `map-${role}`;
        const err = errors.columns?.[role]?.message;
        const chosen = values.columns?.[role];
        const position = role === "x" || role === "y";
        const read = plan.guess.columns[role];
        const hint =
          chosen === null
            ? guessed[role]
              ? `“${guessed[role]}” is not read.`
              : undefined
            : chosen === ""
              ? read
                ? `Plotproof's guess: “${read}”.`
                : undefined
              : chosen && samples.has(chosen)
                ? `e.g. ${samples.get(chosen)}`
                : undefined;
        return (
          <FieldRow key={role} id={id} label={label(role)} error={err} hint={hint}>
            <Controller
              control={control}
              name={`columns.${role}`}
              rules={{ deps: roles.filter((o) => o !== role).map((o) => `columns.${o}` as const) }}
              render={({ field: f }) => (
                <select
                  id={id}
                  ref={f.ref}
                  name={f.name}
                  onBlur={f.onBlur}
                  value={f.value === null ? notInFile : f.value}
                  onChange={(e) => f.onChange(e.target.value === notInFile ? null : e.target.value)}
                  aria-invalid={err ? true : undefined}
                  aria-describedby={describedBy(id, { error: err, hint })}
                  className={inputClass(!!err)}
                >
                  {/* Positions are required, so x/y offer neither the guess nor "not in this file". */}
                  <option value="">{position ? "— choose a column —" : "— Plotproof's guess —"}</option>
                  {position ? null : <option value={notInFile}>— not in this file —</option>}
                  {header.map((h, i) => (
                    <option key={`${i}-${h}`} value={h}>
                      {h}
                    </option>
                  ))}
                  {chosen && !header.includes(chosen) ? (
                    <option value={chosen}>{chosen} (not in this file)</option>
                  ) : null}
                </select>
              )}
            />
          </FieldRow>
        );
      })}
    </div>
  );
}
