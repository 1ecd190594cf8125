"use client";
import { useState } from "react";
import useSWR from "swr";
import { fetcher, sendJson, ApiError } from "@/lib/fetcher";
import { keys } from "@/lib/swr-keys";
import type { ApiKeyDto } from "@/lib/api-types";
import { Panel, TableScroll } from "@/app/_components/ui";
import { LocalTime } from "@/app/_components/local-time";
import { API_KEY_SCOPES, type ApiKeyScope, SCOPE_LABEL, SCOPE_PURPOSE } from "@/lib/security/key-scope";

/** The expiry date a key stops working on (YYYY-MM-DD, UTC), and whether that has passed. */
function expiryOf(k: ApiKeyDto, now: number): { day: string; passed: boolean } | null {
  return k.expiresAt ? { day: k.expiresAt.slice(0, 10), passed: Date.parse(k.expiresAt) <= now } : null;
}

export function ApiKeysPanel() {
  const { data, mutate } = useSWR<{ keys: ApiKeyDto[] }>(keys.apiKeys(), fetcher);
  const now = Date.now();
  const [name, setName] = useState("");
  const [scope, setScope] = useState<ApiKeyScope>("upload");
  const [expiresOn, setExpiresOn] = useState("");
  const [error, setError] = useState<string | null>(null);
  const [created, setCreated] = useState<{ name: string; key: string; scope: ApiKeyScope } | null>(null);

  async function create(e: React.FormEvent) {
    e.preventDefault();
    setError(null);
    try {
      const res = await sendJson<{ name: string; key: string; scope: ApiKeyScope }>(keys.apiKeys(), "POST", {
        name,
        scope,
        expiresOn: expiresOn || null,
      });
      setCreated(res);
      setName("");
      setExpiresOn("");
      await mutate();
    } catch (err) {
      setError(err instanceof ApiError ? err.message : "Could not create the key.");
    }
  }

  // Revoking cannot be undone, so the row asks first: the id of the key waiting for that answer.
  const [confirming, setConfirming] = useState<string | null>(null);
  const [revokeError, setRevokeError] = useState<string | null>(null);

  async function revoke(id: string) {
    setRevokeError(null);
    try {
      await sendJson(`/api/keys/${id}`, "DELETE");
      setConfirming(null);
      await mutate();
    } catch (err) {
      setRevokeError(err instanceof ApiError ? err.message : "Could not revoke the key.");
    }
  }

  return (
    <div className="grid gap-6">
      <Panel title="Create a key">
        <form onSubmit={create} className="flex flex-wrap items-end gap-3" aria-label="Create an API key">
          <div>
            <label htmlFor="key-name" className="mb-1 block text-sm font-medium">
              Name
            </label>
            <input
              id="key-name"
              value={name}
              onChange={(e) => setName(e.target.value)}
              placeholder="Nightly planter export"
              aria-describedby={error ? "key-error" : undefined}
              className="w-72 rounded-plot border border-chalk-line px-3 py-2"
            />
          </div>
          <div>
            <label htmlFor="key-expiry" className="mb-1 block text-sm font-medium">
              Stops working on <span className="font-normal text-ink-faint">(optional, UTC)</span>
            </label>
            <input
              id="key-expiry"
              type="date"
              value={expiresOn}
              onChange={(e) => setExpiresOn(e.target.value)}
              className="rounded-plot border border-chalk-line px-3 py-2"
            />
          </div>
          <fieldset className="basis-full">
            <legend className="mb-1 text-sm font-medium">What the key may do</legend>
            <div className="grid gap-1">
              {API_KEY_SCOPES.map((s) => (
                <label key={s} className="flex items-baseline gap-2 text-sm">
                  <input type="radio" name="key-scope" value={s} checked={scope === s} onChange={() => setScope(s)} />
                  <span>
                    <span className="font-medium">{SCOPE_LABEL[s]}</span>
                    <span className="text-ink-soft"> — {SCOPE_PURPOSE[s]}.</span>
                  </span>
                </label>
              ))}
            </div>
          </fieldset>
          <button type="submit" className="rounded-plot bg-leaf px-4 py-2 font-medium text-white hover:bg-leaf-deep">
            Create key
          </button>
        </form>
        {error ? (
          <p id="key-error" role="alert" className="mt-2 text-sm text-alarm">
            {error}
          </p>
        ) : null}
        {created ? (
          <div className="mt-4 rounded-plot border-l-4 border-stake bg-stake-pale p-3 text-sm" role="status">
            <p className="font-semibold">
              Copy the key for “{created.name}” ({SCOPE_LABEL[created.scope].toLowerCase()}) now — it is shown only
              once.
            </p>
            <code className="mt-1 block break-all font-mono text-xs" data-testid="new-api-key">
              {created.key}
            </code>
            <p className="mt-1 text-ink-soft">
              Send it as <code>Authorization: Bearer …</code>.
            </p>
          </div>
        ) : null}
      </Panel>
      <Panel title="Keys">
        {!data ? (
          <p className="text-sm text-ink-faint">Loading…</p>
        ) : data.keys.length === 0 ? (
          <p className="text-sm text-ink-faint">No keys yet.</p>
        ) : (
          <TableScroll label="API keys">
            <table className="w-full text-left text-sm">
              <thead className="text-ink-faint">
                <tr>
                  <th className="py-1 font-medium">Name</th>
                  <th className="font-medium">Starts with</th>
                  <th className="font-medium">May do</th>
                  <th className="font-medium">Created</th>
                  <th className="font-medium">Last used</th>
                  <th className="font-medium">Expiry</th>
                  <th className="font-medium">State</th>
                  <th>
                    <span className="sr-only">Actions</span>
                  </th>
                </tr>
              </thead>
              <tbody className="divide-y divide-chalk-deep">
                {data.keys.map((k) => {
                  const expiry = expiryOf(k, now);
                  return (
                    <tr key={k.id} data-key-name={k.name}>
                      <td className="py-2">
                        {k.name} <span className="text-ink-faint">· {k.createdBy}</span>
                      </td>
                      <td className="font-mono text-xs">{k.prefix}…</td>
                      <td title={SCOPE_PURPOSE[k.scope]}>{SCOPE_LABEL[k.scope]}</td>
                      <td>
                        <LocalTime iso={k.createdAt} />
                      </td>
                      <td>{k.lastUsedAt ? <LocalTime iso={k.lastUsedAt} /> : "never"}</td>
                      <td>
                        {!expiry ? (
                          <span className="text-ink-faint">none</span>
                        ) : expiry.passed ? (
                          <span className="text-alarm">expired {expiry.day}</span>
                        ) : (
                          <span>expires {expiry.day}</span>
                        )}
                      </td>
                      <td>
                        {k.revokedAt ? (
                          <span className="text-alarm">revoked</span>
                        ) : expiry?.passed ? (
                          <span className="font-medium text-alarm">expired</span>
                        ) : (
                          "live"
                        )}
                      </td>
                      <td className="text-right">
                        {k.revokedAt ? null : confirming === k.id ? (
                          <span
                            role="group"
                            aria-label={`Confirm revoking ${k.name}`}
                            className="inline-flex flex-wrap items-center justify-end gap-2 text-sm"
                            data-testid="revoke-confirm"
                          >
                            <span>
                              Revoke “{k.name}”? Scripts using it stop working at once; this cannot be undone.
                            </span>
                            <button
                              type="button"
                              onClick={() => revoke(k.id)}
                              className="rounded-plot bg-alarm px-2 py-1 font-medium text-white hover:opacity-90"
                            >
                              Yes, revoke it
                            </button>
                            <button
                              type="button"
                              onClick={() => setConfirming(null)}
                              className="font-medium text-leaf hover:underline"
                            >
                              Keep it
                            </button>
                          </span>
                        ) : (
                          <button
                            type="button"
                            onClick={() => {
                              setRevokeError(null);
                              setConfirming(k.id);
                            }}
                            className="text-sm font-medium text-alarm hover:underline"
                          >
                            Revoke
                          </button>
                        )}
                      </td>
                    </tr>
                  );
                })}
              </tbody>
            </table>
          </TableScroll>
        )}
        {revokeError ? (
          <p role="alert" className="mt-2 text-sm text-alarm">
            {revokeError}
          </p>
        ) : null}
      </Panel>
    </div>
  );
}
