"use client";
import { useState } from "react";
import { Notice, buttonClass, inputClass } from "@/app/_components/field-form/controls";
import { presetFits } from "./mapping-schema";
import type { Preview } from "./file-step-shared";
import type { ColumnMappingState } from "./use-column-mapping";

/** Choosing a saved mapping, and saying which one is applied (with the way back to Plotproof's guess). */
export function PresetBar({ mapping, preview }: { mapping: ColumnMappingState; preview: Preview }) {
  const { header, format } = preview;
  const { presets } = mapping;
  const [chosenPresetId, setChosenPresetId] = useState("");
  return (
    <>
      {presets.length > 0 ? (
        <div className="mb-4 flex flex-wrap items-end gap-3">
          <div>
            <label htmlFor="preset" className="mb-1 block text-sm font-medium">
              Use a saved mapping
            </label>
            <select
              id="preset"
              value={chosenPresetId}
              onChange={(e) => setChosenPresetId(e.target.value)}
              className={`${inputClass(false)} max-w-sm`}
            >
              <option value="">Choose a preset…</option>
              {presets.map((p) => (
                <option key={p.id} value={p.id}>
                  {p.name}
                  {presetFits(p, header, format) ? "" : " (names columns this file lacks)"}
                </option>
              ))}
            </select>
          </div>
          <button
            type="button"
            className={buttonClass.secondary}
            disabled={!chosenPresetId}
            onClick={() => {
              const p = presets.find((x) => x.id === chosenPresetId);
              if (p) mapping.applyPreset(p, false);
            }}
          >
            Use preset
          </button>
        </div>
      ) : null}
      {mapping.appliedPreset ? (
        <div className="mb-4" data-testid="preset-applied">
          <Notice tone="ok">
            {mapping.appliedPreset.auto ? (
              <>
                The saved mapping <strong>“{mapping.appliedPreset.preset.name}”</strong> was applied, because every
                column it names is in this file.
              </>
            ) : (
              <>
                The saved mapping <strong>“{mapping.appliedPreset.preset.name}”</strong> is applied.
              </>
            )}{" "}
            <button type="button" className={buttonClass.quiet} onClick={mapping.backToGuess}>
              Use Plotproof&apos;s guess instead
            </button>
          </Notice>
        </div>
      ) : null}
    </>
  );
}
