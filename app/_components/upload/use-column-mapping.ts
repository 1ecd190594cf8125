"use client";
import { useEffect, useMemo, useRef, useState } from "react";
import { useForm, useWatch } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import useSWR from "swr";
import type { ColumnRole, CoordinateKind } from "@/geo";
import { fetcher } from "@/lib/fetcher";
import { keys } from "@/lib/swr-keys";
import type { PresetDto } from "@/lib/api-types";
import {
  ROLE_ORDER,
  bestPreset,
  guessColumns,
  mappingSchema,
  notInFileValue,
  planFor,
  presetColumns,
  roleLabel,
  toColumnMapping,
  type FileKind,
  type MappingValues,
} from "./mapping-schema";
import { GEOGRAPHIC_DEFAULT, type Preview, type UploadField } from "./file-step-shared";

export type ColumnMappingState = ReturnType<typeof useColumnMapping>;

/**
 * The column mapping of one previewed file: the form (Plotproof's guess to start with), the saved presets and
 * the one applied, and what the server will read with the current choice.
 */
export function useColumnMapping({ preview, field, kind }: { preview: Preview; field: UploadField; kind: FileKind }) {
  const { header, format } = preview;
  const presets = useSWR<{ presets: PresetDto[] }>(keys.presets(kind), fetcher);

  const initial = useMemo<MappingValues>(() => {
    const guess = guessColumns(header, format, format === "geojson" ? preview.coordinateKind : undefined);
    const coordinates: CoordinateKind =
      guess.coordinates ?? (format === "geojson" ? preview.coordinateKind : "geographic");
    const crs =
      (format === "geojson" ? preview.crsHint : null) ?? (coordinates === "projected" ? field.crs : GEOGRAPHIC_DEFAULT);
    return { columns: guess.columns, coordinates, crs, savePreset: false, presetName: "" };
  }, [header, format, preview, field.crs]);

  const schema = useMemo(() => mappingSchema(header, format, kind), [header, format, kind]);
  const form = useForm<MappingValues>({ resolver: zodResolver(schema), defaultValues: initial, mode: "onChange" });
  const values = useWatch({ control: form.control }) as MappingValues;

  const [appliedPreset, setAppliedPreset] = useState<{ preset: PresetDto; auto: boolean } | null>(null);
  const presetDecided = useRef(false);
  // Set once the CRS was chosen by hand or by a preset: switching the coordinate kind then leaves it alone.
  const crsTouched = useRef(false);

  const applyPreset = (preset: PresetDto, auto: boolean) => {
    const coordinates = preset.mapping.coordinates ?? form.getValues("coordinates");
    form.reset({
      columns: presetColumns(preset, header, format),
      coordinates,
      crs:
        preset.crs ??
        (coordinates === "projected"
          ? field.crs
          : format === "geojson" && preview.crsHint
            ? preview.crsHint
            : GEOGRAPHIC_DEFAULT),
      savePreset: false,
      presetName: "",
    });
    crsTouched.current = !!preset.crs;
    setAppliedPreset({ preset, auto });
    void form.trigger();
  };

  const backToGuess = () => {
    form.reset(initial);
    crsTouched.current = false;
    setAppliedPreset(null);
  };

  // A saved preset whose columns are all in this file is applied at once (and the page says so).
  // biome-ignore lint/correctness/useExhaustiveDependencies: decided once, when the presets arrive; later edits to the form must not re-apply one.
  useEffect(() => {
    if (presetDecided.current || !presets.data) return;
    presetDecided.current = true;
    const best = bestPreset(presets.data.presets, header, format);
    if (best) applyPreset(best, true);
  }, [presets.data]);

  const plan = useMemo(() => planFor(header, format, toColumnMapping(values, format)), [header, format, values]);
  const notInFile = useMemo(() => notInFileValue(header), [header]);
  const coords = values.coordinates ?? initial.coordinates;
  const label = (r: ColumnRole) => roleLabel(r, coords, kind);
  const roles = ROLE_ORDER[kind].filter((r) => !(format === "geojson" && (r === "x" || r === "y")));
  // What the server will read, guesses included, so the preview never calls a guessed column "not read".
  const roleOf = useMemo(() => {
    const m = new Map<string, ColumnRole>();
    for (const r of roles) {
      const name = plan.guess.columns[r];
      if (name && header.includes(name)) m.set(name, r);
    }
    return m;
  }, [roles, plan, header]);

  return {
    form,
    // Read here, in the component that owns the form, so react-hook-form re-renders it when errors change.
    errors: form.formState.errors,
    values,
    presets: presets.data?.presets ?? [],
    appliedPreset,
    applyPreset,
    backToGuess,
    crsTouched,
    plan,
    notInFile,
    coords,
    label,
    roles,
    roleOf,
  };
}
