"use client";
import { useEffect, useRef, useState } from "react";
import { PREVIEW_ROWS, type PreviewRequest, type PreviewResult } from "./preview-types";

export type PreviewState =
  | { status: "idle" }
  | { status: "reading" }
  | { status: "ready"; preview: Exclude<PreviewResult, { ok: false }> }
  | { status: "failed"; message: string };

/** Reads the first rows of `file` in a web worker (one worker per page, ended when the page goes). */
export function usePreview(file: File | null): PreviewState {
  const worker = useRef<Worker | null>(null);
  const seq = useRef(0);
  const [state, setState] = useState<PreviewState>({ status: "idle" });

  useEffect(() => {
    return () => {
      worker.current?.terminate();
      worker.current = null;
    };
  }, []);

  useEffect(() => {
    if (!file) {
      setState({ status: "idle" });
      return;
    }
    if (!worker.current) {
      worker.current = new Worker(new URL("./preview.worker.ts", import.meta.url), { type: "module" });
    }
    const w = worker.current;
    const id = ++seq.current;
    setState({ status: "reading" });
    const onMessage = (e: MessageEvent<PreviewResult>) => {
      if (e.data.id !== id) return;
      setState(e.data.ok ? { status: "ready", preview: e.data } : { status: "failed", message: e.data.message });
    };
    const onError = (e: ErrorEvent) => {
      setState({
        status: "failed",
        message: `The preview could not be made in this browser (${e.message || "worker failed"}).`,
      });
    };
    w.addEventListener("message", onMessage);
    w.addEventListener("error", onError);
    const request: PreviewRequest = { id, file, rows: PREVIEW_ROWS };
    w.postMessage(request);
    return () => {
      w.removeEventListener("message", onMessage);
      w.removeEventListener("error", onError);
    };
  }, [file]);

  return state;
}
