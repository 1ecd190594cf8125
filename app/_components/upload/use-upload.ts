"use client";
import { useEffect, useRef, useState } from "react";
import { useRouter } from "next/navigation";
import type { UseFormSetError } from "react-hook-form";
import { useSWRConfig } from "swr";
import { keys } from "@/lib/swr-keys";
import type { InputIssue, UploadOkDto } from "@/lib/api-types";
import { toColumnMapping, type FileKind, type MappingValues } from "./mapping-schema";
import { sendUpload, asIssues, type ServerStage, type UploadOutcome } from "./send-upload";
import { STAGES, type Preview, type UploadField } from "./file-step-shared";

export type UploadResult =
  | { name: "none" }
  | { name: "saved"; body: UploadOkDto }
  | { name: "invalid"; message: string; issues: InputIssue[] }
  | { name: "warnings"; message: string; issues: InputIssue[] }
  | { name: "failed"; message: string };

export interface UploadProgress {
  transfer: number | null;
  stage: ServerStage | null;
  stageFraction: number;
  done: ServerStage[];
  /** The server refused the file at `stage`; nothing was saved. */
  stopped?: boolean;
}

export type UploadState = ReturnType<typeof useUpload>;

/**
 * Sending one file with its mapping: progress while it travels and the server reads it, and the server's answer
 * (saved, invalid, warnings to accept, failed). Problems with the settings sent along go to the form's controls.
 */
export function useUpload({
  file,
  field,
  kind,
  format,
  setError,
  onBusy,
  machineId,
  fieldwork,
}: {
  file: File;
  field: UploadField;
  kind: FileKind;
  format: Preview["format"];
  setError: UseFormSetError<MappingValues>;
  onBusy: (busy: boolean) => void;
  /** As-planted only: the machine that recorded the file (issue 13). */
  machineId?: string;
  /** Survey only: the plan, control-mark check and instrument as the `fieldwork` part (JSON), or null for none. */
  fieldwork?: string | null;
}) {
  const router = useRouter();
  const { mutate } = useSWRConfig();
  const [result, setResult] = useState<UploadResult>({ name: "none" });
  const [progress, setProgress] = useState<UploadProgress | null>(null);
  const [uploading, setUploading] = useState(false);
  const [acceptChecked, setAcceptChecked] = useState(false);
  const [formError, setFormError] = useState<string | null>(null);
  const abortRef = useRef<(() => void) | null>(null);
  const resultRef = useRef<HTMLDivElement>(null);

  useEffect(() => {
    onBusy(uploading);
  }, [uploading, onBusy]);
  useEffect(() => {
    if (!uploading) return;
    const warn = (e: BeforeUnloadEvent) => {
      e.preventDefault();
    };
    window.addEventListener("beforeunload", warn);
    return () => window.removeEventListener("beforeunload", warn);
  }, [uploading]);
  useEffect(() => {
    if (result.name !== "none") resultRef.current?.focus();
  }, [result]);

  const upload = async (v: MappingValues, acceptWarnings: boolean) => {
    setFormError(null);
    setResult({ name: "none" });
    setAcceptChecked(false);
    setUploading(true);
    setProgress({ transfer: 0, stage: null, stageFraction: 0, done: [] });
    const body = new FormData();
    body.set("file", file, file.name);
    body.set("kind", kind);
    body.set("crs", v.crs.trim());
    body.set("mapping", JSON.stringify(toColumnMapping(v, format)));
    body.set("acceptWarnings", acceptWarnings ? "true" : "false");
    if (v.savePreset && v.presetName.trim()) body.set("presetName", v.presetName.trim());
    if (kind === "planted" && machineId) body.set("machineId", machineId);
    if (kind === "survey" && fieldwork) body.set("fieldwork", fieldwork);
    const { done, abort } = sendUpload(keys.fieldDatasets(field.id), body, {
      onTransfer: (transfer) => setProgress((p) => (p ? { ...p, transfer } : p)),
      onStage: (stage, fraction) =>
        setProgress((p) => {
          if (!p) return p;
          const order = STAGES.map((s) => s.stage);
          const finished = order.slice(0, order.indexOf(stage));
          return {
            ...p,
            transfer: 1,
            stage,
            stageFraction: fraction,
            done: fraction >= 1 ? [...finished, stage] : finished,
          };
        }),
    });
    abortRef.current = abort;
    const outcome = await done;
    abortRef.current = null;
    setUploading(false);
    await handleOutcome(outcome, v);
  };

  const handleOutcome = async (outcome: UploadOutcome, v: MappingValues) => {
    if (outcome.kind === "saved") {
      setProgress({ transfer: 1, stage: "saving", stageFraction: 1, done: ["reading", "checking", "saving"] });
      setResult({ name: "saved", body: outcome.body });
      await Promise.all([
        mutate(keys.field(field.id)),
        mutate(keys.fieldDatasets(field.id)),
        mutate(keys.fields()),
        mutate(keys.fieldDerived(field.id)),
        v.savePreset ? mutate(keys.presets(kind)) : Promise.resolve(),
      ]);
      router.refresh();
      return;
    }
    if (outcome.kind === "aborted") {
      setProgress(null);
      setFormError("The upload was cancelled before the file reached the server. Nothing was saved.");
      return;
    }
    if (outcome.kind === "network") {
      setProgress((p) => (p ? { ...p, stopped: true } : p));
      setResult({ name: "failed", message: outcome.message });
      return;
    }
    setProgress((p) => (p ? { ...p, stopped: true } : p));
    const issues = asIssues(outcome.issues);
    if (outcome.code === "invalid_file") return setResult({ name: "invalid", message: outcome.message, issues });
    if (outcome.code === "warnings_unaccepted")
      return setResult({ name: "warnings", message: outcome.message, issues });
    if (outcome.code === "invalid_input") {
      // Problems with the form fields sent along (crs, mapping, kind) go next to their controls.
      let placed = false;
      for (const raw of outcome.issues) {
        const i = raw as { path?: unknown[]; message?: string };
        const key = Array.isArray(i.path) ? i.path[0] : null;
        if (key === "crs" && i.message) {
          setError("crs", { message: i.message }, { shouldFocus: true });
          placed = true;
        }
        if (key === "presetName" && i.message) {
          setError("presetName", { message: i.message }, { shouldFocus: true });
          placed = true;
        }
      }
      setProgress(null);
      setFormError(
        placed
          ? "The server did not accept some settings; see the messages next to them. Nothing was saved."
          : `${outcome.message} Nothing was saved.`,
      );
      return;
    }
    const words: Record<number, string> = {
      401: "Your session has ended. Sign in again in another tab, then save again.",
      403: "Your role cannot upload files to this field.",
      404: "This field no longer exists, or is not part of your organisation.",
      413: outcome.message,
    };
    setResult({ name: "failed", message: words[outcome.status] ?? outcome.message });
  };

  return {
    result,
    progress,
    uploading,
    acceptChecked,
    setAcceptChecked,
    formError,
    resultRef,
    upload,
    cancel: () => abortRef.current?.(),
  };
}
