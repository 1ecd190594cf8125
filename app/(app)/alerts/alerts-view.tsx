"use client";
import Link from "next/link";
import { useState } from "react";
import useSWR, { useSWRConfig } from "swr";
import { ApiError, fetcher, sendJson } from "@/lib/fetcher";
import { keys } from "@/lib/swr-keys";
import type { AlertDto, AlertRulesDto } from "@/lib/machine-types";
import { AlertRulesInput } from "@/lib/validation/machines";
import { FormError, TextField } from "@/app/_components/form";
import { Empty, Panel } from "@/app/_components/ui";
import { LocalTime } from "@/app/_components/local-time";

const KIND_LABEL: Record<AlertDto["kind"], string> = {
  "arm-cross-offset": "Arm offset",
  "rmse-rise": "RMSE rise",
  "failed-verdict": "Failed verdict",
};

const button = "rounded-plot bg-leaf px-3 py-1.5 text-sm font-medium text-white hover:bg-leaf-deep disabled:opacity-60";

/** The thresholds (a form for QA leads and owners) and the alerts raised by computed audits. */
export function AlertsView({
  canSet,
  initial,
}: {
  canSet: boolean;
  /** What the page was rendered with (the bodies of GET /api/alerts/rules and GET /api/alerts). */
  initial?: { rules: { rules: AlertRulesDto }; alerts: { alerts: AlertDto[] } };
}) {
  const rules = useSWR<{ rules: AlertRulesDto }>(keys.alertRules(), fetcher, { fallbackData: initial?.rules });
  return (
    <div className="grid gap-6">
      <Panel title="Thresholds">
        {rules.error ? (
          <p role="alert" className="text-sm text-alarm">
            The thresholds could not be loaded: {(rules.error as Error).message}
          </p>
        ) : !rules.data ? (
          <Empty>Loading…</Empty>
        ) : canSet ? (
          <RulesForm rules={rules.data.rules} />
        ) : (
          <RulesText rules={rules.data.rules} />
        )}
      </Panel>
      <AlertList canSet={canSet} initial={initial?.alerts} />
    </div>
  );
}

function mmText(m: number | null): string {
  return m === null ? "" : String(Math.round(m * 1e6) / 1e3);
}
function pctText(share: number | null): string {
  return share === null ? "" : String(Math.round(share * 1e4) / 1e2);
}

function RulesText({ rules }: { rules: AlertRulesDto }) {
  const parts = [
    rules.armCrossOffsetM !== null ? `an arm's cross-row offset above ${mmText(rules.armCrossOffsetM)} mm` : null,
    rules.rmseRise !== null
      ? `horizontal RMSE up more than ${pctText(rules.rmseRise)} % from the previous audit`
      : null,
    rules.failedVerdict ? "a failed verdict" : null,
  ].filter(Boolean);
  return (
    <p className="text-sm" data-testid="alert-rules-text">
      {parts.length ? `Alert on ${parts.join("; ")}.` : "No thresholds are set."}
    </p>
  );
}

function RulesForm({ rules }: { rules: AlertRulesDto }) {
  const { mutate } = useSWRConfig();
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [formError, setFormError] = useState<string | null>(null);
  const [saved, setSaved] = useState<string | null>(null);
  const [pending, setPending] = useState(false);

  async function onSubmit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    setSaved(null);
    setFormError(null);
    const f = new FormData(e.currentTarget);
    const text = (k: string) =>
      String(f.get(k) ?? "")
        .trim()
        .replace(",", ".");
    const offset = text("armCrossOffsetMm");
    const rise = text("rmseRisePct");
    const found: Record<string, string> = {};
    const offsetMm = offset === "" ? null : Number(offset);
    const risePct = rise === "" ? null : Number(rise);
    if (offsetMm !== null && !Number.isFinite(offsetMm))
      found.armCrossOffsetMm = `“${offset}” is not a number of millimetres.`;
    if (risePct !== null && !Number.isFinite(risePct)) found.rmseRisePct = `“${rise}” is not a percentage.`;
    const body = {
      armCrossOffsetM: offsetMm === null || found.armCrossOffsetMm ? null : Math.round(offsetMm * 1e4) / 1e7,
      rmseRise: risePct === null || found.rmseRisePct ? null : Math.round(risePct * 1e4) / 1e6,
      failedVerdict: f.get("failedVerdict") === "on",
    };
    const parsed = AlertRulesInput.safeParse(body);
    if (!parsed.success)
      for (const i of parsed.error.issues) {
        const key = i.path[0] === "armCrossOffsetM" ? "armCrossOffsetMm" : "rmseRisePct";
        found[key] ??= i.message;
      }
    setErrors(found);
    if (Object.keys(found).length) {
      setFormError("Check the marked fields. Leave a field empty to switch its threshold off.");
      return;
    }
    setPending(true);
    try {
      await sendJson(keys.alertRules(), "PUT", body);
      await mutate(keys.alertRules());
      setSaved("Thresholds saved. They apply to audits computed from now on.");
    } catch (err) {
      setFormError(
        err instanceof ApiError && err.status === 403
          ? "Only QA leads and owners can set the thresholds."
          : err instanceof Error
            ? err.message
            : "The thresholds could not be saved.",
      );
    } finally {
      setPending(false);
    }
  }

  return (
    <form onSubmit={onSubmit} noValidate aria-label="Alert thresholds" data-testid="alert-rules-form">
      <FormError message={formError} />
      {saved ? (
        <p role="status" className="mb-3 rounded-plot bg-leaf-pale px-3 py-2 text-sm" data-testid="alert-rules-saved">
          {saved}
        </p>
      ) : null}
      <div className="grid gap-x-6 sm:grid-cols-2">
        <TextField
          name="armCrossOffsetMm"
          label="Arm cross-row offset above (mm)"
          defaultValue={mmText(rules.armCrossOffsetM)}
          error={errors.armCrossOffsetMm}
          hint="An arm's mean cross-row error on RTK-fixed checkpoints, when it is significant. Empty = off."
        />
        <TextField
          name="rmseRisePct"
          label="Horizontal RMSE up more than (%)"
          defaultValue={pctText(rules.rmseRise)}
          error={errors.rmseRisePct}
          hint="From the previous audit of the same machine, else of the same field. Empty = off."
        />
      </div>
      <label className="mb-4 flex items-center gap-2 text-sm">
        <input type="checkbox" name="failedVerdict" defaultChecked={rules.failedVerdict} />
        Alert when an audit fails its tolerance profile
      </label>
      <button type="submit" disabled={pending} className={button}>
        {pending ? "Saving…" : "Save thresholds"}
      </button>
    </form>
  );
}

function AlertList({ canSet, initial }: { canSet: boolean; initial?: { alerts: AlertDto[] } }) {
  const { data, error, isLoading } = useSWR<{ alerts: AlertDto[] }>(keys.alerts(), fetcher, {
    refreshInterval: 15_000,
    fallbackData: initial,
  });
  const { mutate } = useSWRConfig();
  const [actionError, setActionError] = useState<string | null>(null);
  const alerts = data?.alerts ?? [];
  const open = alerts.filter((a) => !a.acknowledgedAt).length;

  async function acknowledge(a: AlertDto, acknowledged: boolean) {
    setActionError(null);
    try {
      await sendJson(keys.alert(a.id), "PATCH", { acknowledged });
      await mutate(keys.alerts());
    } catch (e) {
      setActionError(e instanceof Error ? e.message : "The alert could not be changed.");
    }
  }

  return (
    <Panel title={`Raised alerts${data ? ` (${open} open)` : ""}`}>
      <FormError message={actionError} />
      {error ? (
        <p role="alert" className="text-sm text-alarm">
          The alerts could not be loaded: {(error as Error).message}
        </p>
      ) : isLoading ? (
        <Empty>Loading…</Empty>
      ) : alerts.length === 0 ? (
        <Empty>No audit has crossed a threshold.</Empty>
      ) : (
        <ul className="divide-y divide-chalk-deep text-sm" data-testid="alert-list">
          {alerts.map((a) => (
            <li
              key={a.id}
              className="flex flex-wrap items-start justify-between gap-3 py-2"
              data-testid="alert-item"
              data-kind={a.kind}
              data-open={a.acknowledgedAt ? "no" : "yes"}
            >
              <div className="min-w-0 flex-1">
                <span
                  className={`mr-2 inline-block rounded-plot px-1.5 py-0.5 text-xs font-medium ${a.acknowledgedAt ? "bg-chalk text-ink-soft" : "bg-alarm-pale text-alarm"}`}
                >
                  {KIND_LABEL[a.kind] ?? a.kind}
                </span>
                <Link href={`/audits/${a.audit.id}/diagnostics`} className="font-medium text-leaf hover:underline">
                  {a.audit.title}
                </Link>{" "}
                <span className="text-ink-soft">
                  · {a.audit.fieldName}
                  {a.machine ? ` · ${a.machine.name}` : ""}
                </span>
                <p className="mt-1">{a.message}</p>
                <p className="text-xs text-ink-faint">
                  <LocalTime iso={a.createdAt} />
                  {a.acknowledgedAt ? ` · acknowledged by ${a.acknowledgedBy ?? "a former member"}` : ""}
                </p>
              </div>
              {canSet ? (
                <button
                  type="button"
                  className="font-medium text-leaf hover:underline"
                  onClick={() => acknowledge(a, !a.acknowledgedAt)}
                >
                  {a.acknowledgedAt ? "Open again" : "Acknowledge"}
                </button>
              ) : null}
            </li>
          ))}
        </ul>
      )}
    </Panel>
  );
}
