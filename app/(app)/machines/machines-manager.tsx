"use client";
import Link from "next/link";
import { useState } from "react";
import useSWR, { useSWRConfig } from "swr";
import { ApiError, fetcher, sendJson } from "@/lib/fetcher";
import { keys } from "@/lib/swr-keys";
import type { MachineDto } from "@/lib/machine-types";
import { MachineInput } from "@/lib/validation/machines";
import { FormError, TextField } from "@/app/_components/form";
import { Empty, Panel, TableScroll } from "@/app/_components/ui";

type Editing = { mode: "new" } | { mode: "edit"; machine: MachineDto } | null;

const button = "rounded-plot bg-leaf px-3 py-1.5 text-sm font-medium text-white hover:bg-leaf-deep disabled:opacity-60";

/** The organisation's machines; create, edit and delete for QA leads and owners. */
export function MachinesManager({
  canEdit,
  initial,
}: {
  canEdit: boolean;
  /** The list as the page was rendered with it (GET /api/machines's body). */
  initial?: { machines: MachineDto[] };
}) {
  const { data, error, isLoading } = useSWR<{ machines: MachineDto[] }>(keys.machines(), fetcher, {
    fallbackData: initial,
  });
  const [editing, setEditing] = useState<Editing>(null);
  const [notice, setNotice] = useState<string | null>(null);
  const [deleteError, setDeleteError] = useState<string | null>(null);
  const { mutate } = useSWRConfig();
  const machines = data?.machines ?? [];

  async function remove(m: MachineDto) {
    setNotice(null);
    setDeleteError(null);
    try {
      await sendJson<void>(keys.machine(m.id), "DELETE");
      await mutate(keys.machines());
      setNotice(`Deleted “${m.name}”.`);
    } catch (e) {
      setDeleteError(e instanceof Error ? e.message : "The machine could not be deleted.");
    }
  }

  return (
    <div className="grid gap-6">
      <Panel
        title="Machines"
        action={
          canEdit && editing?.mode !== "new" ? (
            <button
              type="button"
              className={button}
              onClick={() => {
                setNotice(null);
                setEditing({ mode: "new" });
              }}
            >
              New machine
            </button>
          ) : undefined
        }
      >
        {notice ? (
          <p role="status" className="mb-3 rounded-plot bg-leaf-pale px-3 py-2 text-sm" data-testid="machine-notice">
            {notice}
          </p>
        ) : null}
        <FormError message={deleteError} />
        {error ? (
          <p role="alert" className="text-sm text-alarm">
            The machines could not be loaded: {(error as Error).message}
          </p>
        ) : null}
        {isLoading ? (
          <Empty>Loading…</Empty>
        ) : machines.length === 0 && !error ? (
          <Empty>No machines yet.{canEdit ? " Add the planting machines whose records you audit." : ""}</Empty>
        ) : (
          <TableScroll label="Machines">
            <table className="w-full text-left text-sm tabular-nums" data-testid="machines-table">
              <caption className="sr-only">Planting machines</caption>
              <thead className="text-xs text-ink-faint">
                <tr>
                  <th scope="col" className="py-1 pr-3 font-medium">
                    Machine
                  </th>
                  <th scope="col" className="pr-3 text-right font-medium">
                    Working width
                  </th>
                  <th scope="col" className="pr-3 text-right font-medium">
                    Tool arms
                  </th>
                  <th scope="col" className="pr-3 font-medium">
                    Receiver and camera
                  </th>
                  <th scope="col" className="pr-3 text-right font-medium">
                    Uploads
                  </th>
                  <th scope="col" className="font-medium">
                    <span className="sr-only">Actions</span>
                  </th>
                </tr>
              </thead>
              <tbody className="divide-y divide-chalk-deep">
                {machines.map((m) => (
                  <tr key={m.id} data-testid="machine-row" data-machine-name={m.name}>
                    <th scope="row" className="py-2 pr-3 align-top font-medium">
                      {m.name}
                    </th>
                    <td className="pr-3 text-right align-top whitespace-nowrap">{m.workingWidthM.toFixed(2)} m</td>
                    <td className="pr-3 text-right align-top">{m.toolArms}</td>
                    <td className="pr-3 align-top text-ink-soft">
                      {m.receiverNotes ? <span className="block">Receiver: {m.receiverNotes}</span> : null}
                      {m.cameraNotes ? <span className="block">Camera: {m.cameraNotes}</span> : null}
                      {!m.receiverNotes && !m.cameraNotes ? "–" : null}
                    </td>
                    <td className="pr-3 text-right align-top">{m.uploads}</td>
                    <td className="align-top whitespace-nowrap">
                      <Link
                        href={`/machines/${m.id}/season`}
                        className="mr-3 font-medium text-leaf hover:underline"
                        aria-label={`Season of ${m.name}`}
                      >
                        Season
                      </Link>
                      {canEdit ? (
                        <>
                          <button
                            type="button"
                            className="mr-3 font-medium text-leaf hover:underline"
                            aria-label={`Edit ${m.name}`}
                            onClick={() => {
                              setNotice(null);
                              setEditing({ mode: "edit", machine: m });
                            }}
                          >
                            Edit
                          </button>
                          {m.uploads === 0 ? (
                            <button
                              type="button"
                              className="font-medium text-alarm hover:underline"
                              aria-label={`Delete ${m.name}`}
                              onClick={() => remove(m)}
                            >
                              Delete
                            </button>
                          ) : null}
                        </>
                      ) : null}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </TableScroll>
        )}
        <p className="mt-3 text-xs text-ink-soft">
          A machine named by uploads stays, so its audits keep their machine; rename it instead.
        </p>
      </Panel>
      {canEdit && editing ? (
        <MachineForm
          key={editing.mode === "edit" ? editing.machine.id : "new"}
          editing={editing}
          onDone={(msg) => {
            setEditing(null);
            if (msg) setNotice(msg);
          }}
        />
      ) : null}
    </div>
  );
}

function MachineForm({ editing, onDone }: { editing: NonNullable<Editing>; onDone: (message: string | null) => void }) {
  const { mutate } = useSWRConfig();
  const [formError, setFormError] = useState<string | null>(null);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [pending, setPending] = useState(false);
  const m = editing.mode === "edit" ? editing.machine : null;

  async function onSubmit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    setFormError(null);
    const f = new FormData(e.currentTarget);
    const text = (k: string) => String(f.get(k) ?? "").trim();
    const width = text("workingWidthM").replace(",", ".");
    const arms = text("toolArms");
    const parsed = MachineInput.safeParse({
      name: text("name"),
      workingWidthM: width === "" ? Number.NaN : Number(width),
      toolArms: /^\d+$/.test(arms) ? Number(arms) : arms === "" ? Number.NaN : Number(arms),
      receiverNotes: text("receiverNotes") || null,
      cameraNotes: text("cameraNotes") || null,
    });
    if (!parsed.success) {
      const byField: Record<string, string> = {};
      for (const i of parsed.error.issues) byField[String(i.path[0])] ??= i.message;
      if (byField.workingWidthM?.includes("number")) byField.workingWidthM = `“${width}” is not a width in metres.`;
      if (byField.toolArms?.includes("number")) byField.toolArms = `“${arms}” is not a whole number of tool arms.`;
      setErrors(byField);
      setFormError("Check the marked fields.");
      return;
    }
    setErrors({});
    setPending(true);
    try {
      const { machine } = m
        ? await sendJson<{ machine: MachineDto }>(keys.machine(m.id), "PATCH", parsed.data)
        : await sendJson<{ machine: MachineDto }>(keys.machines(), "POST", parsed.data);
      await mutate(keys.machines());
      onDone(m ? `Saved “${machine.name}”.` : `Added “${machine.name}”.`);
    } catch (err) {
      setPending(false);
      if (err instanceof ApiError && err.status === 409) {
        setErrors({ name: "Another machine already has this name." });
        setFormError(err.message);
      } else if (err instanceof ApiError && err.status === 403) {
        setFormError("Only QA leads and owners can change machines.");
      } else setFormError(err instanceof Error ? err.message : "The machine could not be saved.");
    }
  }

  const title = m ? `Edit “${m.name}”` : "New machine";
  return (
    <Panel title={title}>
      <form onSubmit={onSubmit} noValidate aria-label={title} data-testid="machine-form">
        <FormError message={formError} />
        <div className="grid gap-x-6 sm:grid-cols-3">
          <TextField name="name" label="Name" defaultValue={m?.name} error={errors.name} />
          <TextField
            name="workingWidthM"
            label="Working width (m)"
            defaultValue={m ? String(m.workingWidthM) : ""}
            error={errors.workingWidthM}
            hint="Across the rows it plants in one pass."
          />
          <TextField
            name="toolArms"
            label="Tool arms"
            defaultValue={m ? String(m.toolArms) : ""}
            error={errors.toolArms}
            hint="Planting units, as the records number them."
          />
        </div>
        <TextField
          name="receiverNotes"
          label="Receiver notes (optional)"
          defaultValue={m?.receiverNotes ?? ""}
          error={errors.receiverNotes}
          hint="GNSS receiver, antenna position, correction source."
        />
        <TextField
          name="cameraNotes"
          label="Camera notes (optional)"
          defaultValue={m?.cameraNotes ?? ""}
          error={errors.cameraNotes}
          hint="Row or plant cameras that correct the recorded positions, and their calibration."
        />
        <div className="flex gap-3">
          <button type="submit" disabled={pending} className={button}>
            {pending ? "Saving…" : m ? "Save machine" : "Add machine"}
          </button>
          <button
            type="button"
            className="rounded-plot border border-chalk-line px-3 py-1.5 text-sm"
            onClick={() => onDone(null)}
          >
            Cancel
          </button>
        </div>
      </form>
    </Panel>
  );
}
