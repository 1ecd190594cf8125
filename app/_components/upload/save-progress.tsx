"use client";
import { ProgressBar } from "./progress";
import { STAGES, formatBytes } from "./file-step-shared";
import type { UploadProgress } from "./use-upload";

/**
 * Step 4: how much of the file has been sent, and which of the server's steps it has reached. A pause for warnings
 * to be read (`awaitingAcceptance`) is a caution in amber, not a stop: the file can still be saved.
 */
export function SaveProgress({
  progress,
  fileSize,
  awaitingAcceptance = false,
}: {
  progress: UploadProgress;
  fileSize: number;
  awaitingAcceptance?: boolean;
}) {
  const stepName = STAGES.find((s) => s.stage === progress.stage)?.label.toLowerCase();
  return (
    <section aria-labelledby="step-save" className="mb-6 rounded-plot border border-chalk-line bg-white p-5">
      <h2 id="step-save" className="mb-3 text-base font-semibold">
        4. Saving
      </h2>
      <ProgressBar
        id="upload-transfer"
        label="Sending the file"
        value={progress.transfer}
        detail={
          progress.transfer === null
            ? undefined
            : `${formatBytes(Math.round((progress.transfer ?? 0) * fileSize))} of ${formatBytes(fileSize)}`
        }
      />
      <ProgressBar
        id="upload-server"
        label={
          awaitingAcceptance
            ? "On the server: paused for you to read the warnings below"
            : `On the server: ${progress.stopped ? "stopped while " : ""}${stepName ?? (progress.stopped ? "answered before reading" : "waiting for the file")}`
        }
        value={progress.stage ? progress.stageFraction : 0}
        detail={awaitingAcceptance ? "not saved yet" : progress.stopped ? "nothing saved" : undefined}
      />
      <ol className="flex flex-wrap gap-x-6 gap-y-1 text-sm" aria-label="Server steps">
        {STAGES.map((s, i) => {
          const state = progress.done.includes(s.stage)
            ? "done"
            : progress.stage === s.stage
              ? awaitingAcceptance
                ? "paused"
                : progress.stopped
                  ? "stopped"
                  : "now"
              : "later";
          return (
            <li
              key={s.stage}
              className={
                state === "done"
                  ? "text-leaf"
                  : state === "now"
                    ? "font-medium"
                    : state === "stopped"
                      ? "font-medium text-alarm"
                      : state === "paused"
                        ? "font-medium text-loam"
                        : "text-ink-faint"
              }
              data-step-state={state}
            >
              {state === "done" ? "✓ " : state === "stopped" ? "✕ " : state === "paused" ? "⚠ " : `${i + 1}. `}
              {s.label}
              <span className="sr-only">
                {state === "done"
                  ? " (done)"
                  : state === "now"
                    ? " (in progress)"
                    : state === "stopped"
                      ? " (stopped here)"
                      : state === "paused"
                        ? " (paused: warnings to read)"
                        : ""}
              </span>
            </li>
          );
        })}
      </ol>
    </section>
  );
}
