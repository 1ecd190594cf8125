"use client";
import { useState } from "react";
import useSWR from "swr";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { z } from "zod";
import { type ApiError, fetcher, sendJson } from "@/lib/fetcher";
import { ROLES, ROLE_DUTY, ROLE_LABEL, type Role } from "@/lib/roles";
import type { InvitationDto } from "@/lib/review/types";
import { Empty, Panel, TableScroll } from "@/app/_components/ui";
import { LocalTime } from "@/app/_components/local-time";
import { FormError } from "@/app/_components/form";
import { FieldRow, buttonClass, inputClass } from "@/app/_components/field-form/controls";

interface MemberRow {
  memberId: string;
  name: string;
  email: string;
  role: Role;
  joinedAt: string;
}
type TeamDto = { members: MemberRow[]; invitations: InvitationDto[] };

const InviteForm = z.object({
  email: z.email("Enter a valid e-mail address, e.g. name@farm.example."),
  role: z.enum(ROLES, { message: "Choose a role." }),
});
type InviteValues = z.infer<typeof InviteForm>;

const STATUS_WORD: Record<InvitationDto["status"], string> = {
  pending: "waiting",
  accepted: "accepted",
  canceled: "withdrawn",
  rejected: "declined",
  expired: "expired",
};

/** Members with their roles, invitations, and the invite form. Owners only. */
export function TeamManager({ viewerEmail }: { viewerEmail: string }) {
  const { data, error, mutate } = useSWR<TeamDto>("/api/team", fetcher);
  const [notice, setNotice] = useState<{ tone: "ok" | "alarm"; text: string } | null>(null);
  const [busy, setBusy] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    reset,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<InviteValues>({
    resolver: zodResolver(InviteForm),
    defaultValues: { email: "", role: "technician" },
  });

  async function act(key: string, fn: () => Promise<string>) {
    setBusy(key);
    setNotice(null);
    try {
      setNotice({ tone: "ok", text: await fn() });
      await mutate();
    } catch (err) {
      setNotice({ tone: "alarm", text: (err as ApiError).message });
    } finally {
      setBusy(null);
    }
  }

  async function onInvite(v: InviteValues) {
    setNotice(null);
    try {
      const res = await sendJson<{ invitation: InvitationDto; mail: string | null }>(
        "/api/team/invitations",
        "POST",
        v,
      );
      reset({ email: "", role: v.role });
      setNotice({
        tone: res.mail === "sent" ? "ok" : "alarm",
        text:
          res.mail === "sent"
            ? `Invitation e-mailed to ${res.invitation.email}. It works for 7 days.`
            : `The invitation to ${res.invitation.email} was created but not e-mailed (${res.mail ?? "no mail server"}). Copy its link from the list below.`,
      });
      await mutate();
    } catch (err) {
      const e = err as ApiError;
      const issue = ((e.issues ?? []) as { path?: string[]; message: string }[]).find(
        (i) => i.path?.[0] === "email" || i.path?.[0] === "role",
      );
      if (issue) setError(issue.path![0] as "email" | "role", { message: issue.message });
      else setError("email", { message: e.message });
    }
  }

  if (error) return <FormError message={(error as Error).message} />;
  const pending = data?.invitations.filter((i) => i.status === "pending" || i.status === "expired") ?? [];
  const past = data?.invitations.filter((i) => i.status !== "pending" && i.status !== "expired").slice(0, 10) ?? [];

  return (
    <div className="grid gap-6">
      {notice ? (
        <p
          role={notice.tone === "alarm" ? "alert" : "status"}
          className={`rounded-plot border-l-4 p-3 text-sm ${notice.tone === "ok" ? "border-leaf bg-leaf-pale" : "border-alarm bg-alarm-pale"}`}
          data-testid="team-notice"
        >
          {notice.text}
        </p>
      ) : null}

      <Panel title="Members">
        {!data ? (
          <p className="text-sm text-ink-faint">Loading…</p>
        ) : (
          <TableScroll label="Team members">
            <table className="w-full text-left text-sm" data-testid="team-table">
              <thead className="text-ink-faint">
                <tr>
                  <th className="py-1 font-medium">Name</th>
                  <th className="font-medium">E-mail</th>
                  <th className="font-medium">Role</th>
                  <th className="font-medium">Since</th>
                  <th>
                    <span className="sr-only">Actions</span>
                  </th>
                </tr>
              </thead>
              <tbody className="divide-y divide-chalk-deep">
                {data.members.map((m) => (
                  <tr key={m.memberId} data-email={m.email}>
                    <td className="py-2">
                      {m.name}
                      {m.email === viewerEmail ? <span className="text-ink-faint"> (you)</span> : null}
                    </td>
                    <td>{m.email}</td>
                    <td>
                      <label className="sr-only" htmlFor={`role-${m.memberId}`}>
                        Role of {m.name}
                      </label>
                      <select
                        id={`role-${m.memberId}`}
                        value={m.role}
                        disabled={busy !== null}
                        className="rounded-plot border border-chalk-line bg-white px-2 py-1 text-sm"
                        onChange={(e) => {
                          const role = e.target.value as Role;
                          void act(`role-${m.memberId}`, async () => {
                            await sendJson(`/api/team/members/${m.memberId}`, "PATCH", { role });
                            return `${m.name} is now ${ROLE_LABEL[role]}.`;
                          });
                        }}
                      >
                        {ROLES.map((r) => (
                          <option key={r} value={r}>
                            {ROLE_LABEL[r]}
                          </option>
                        ))}
                      </select>
                    </td>
                    <td className="text-ink-soft">
                      <LocalTime iso={m.joinedAt} />
                    </td>
                    <td className="text-right">
                      <button
                        type="button"
                        className="text-sm font-medium text-alarm hover:underline disabled:opacity-50"
                        disabled={busy !== null}
                        onClick={() => {
                          if (
                            !window.confirm(
                              `Remove ${m.name} from the organisation? Their account stays, and their past work keeps their name.`,
                            )
                          )
                            return;
                          void act(`remove-${m.memberId}`, async () => {
                            await sendJson(`/api/team/members/${m.memberId}`, "DELETE");
                            return `${m.name} was removed.`;
                          });
                        }}
                      >
                        Remove
                      </button>
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </TableScroll>
        )}
        <ul className="mt-4 grid gap-1 text-xs text-ink-soft sm:grid-cols-2">
          {ROLES.map((r) => (
            <li key={r}>
              <span className="font-medium text-ink">{ROLE_LABEL[r]}</span>: {ROLE_DUTY[r]}
            </li>
          ))}
        </ul>
      </Panel>

      <Panel title="Invite someone">
        <form
          onSubmit={handleSubmit(onInvite)}
          noValidate
          aria-label="Invite someone"
          className="grid items-start gap-x-4 sm:grid-cols-[2fr_1fr_auto]"
        >
          <FieldRow id="inviteEmail" label="E-mail" error={errors.email?.message}>
            <input
              id="inviteEmail"
              type="email"
              autoComplete="off"
              className={inputClass(!!errors.email)}
              {...register("email")}
            />
          </FieldRow>
          <FieldRow id="inviteRole" label="Role" error={errors.role?.message}>
            <select id="inviteRole" className={inputClass(!!errors.role)} {...register("role")}>
              {ROLES.map((r) => (
                <option key={r} value={r}>
                  {ROLE_LABEL[r]}
                </option>
              ))}
            </select>
          </FieldRow>
          <button type="submit" disabled={isSubmitting} className={`${buttonClass.primary} sm:mt-6`}>
            {isSubmitting ? "Sending…" : "Send invitation"}
          </button>
        </form>
        <p className="text-xs text-ink-faint">
          The person gets an e-mail with a link that works for 7 days. New people set their own password; people who
          already use Plotproof sign in to accept.
        </p>
      </Panel>

      <Panel title="Invitations">
        {!data ? null : pending.length === 0 && past.length === 0 ? (
          <Empty>No invitations yet.</Empty>
        ) : (
          <TableScroll label="Invitations">
            <table className="w-full text-left text-sm" data-testid="invitations-table">
              <thead className="text-ink-faint">
                <tr>
                  <th className="py-1 font-medium">E-mail</th>
                  <th className="font-medium">Role</th>
                  <th className="font-medium">Status</th>
                  <th className="font-medium">Expires</th>
                  <th>
                    <span className="sr-only">Actions</span>
                  </th>
                </tr>
              </thead>
              <tbody className="divide-y divide-chalk-deep">
                {[...pending, ...past].map((i) => (
                  <tr key={i.id} data-email={i.email} data-status={i.status}>
                    <td className="py-2">{i.email}</td>
                    <td>{ROLE_LABEL[i.role]}</td>
                    <td className={i.status === "expired" ? "text-alarm" : ""}>{STATUS_WORD[i.status]}</td>
                    <td className="text-ink-soft">
                      <LocalTime iso={i.expiresAt} />
                    </td>
                    <td className="space-x-3 text-right">
                      {i.status === "pending" ? (
                        <button
                          type="button"
                          className={buttonClass.quiet}
                          onClick={() => {
                            void navigator.clipboard?.writeText(i.link);
                            setNotice({ tone: "ok", text: `Link copied: ${i.link}` });
                          }}
                        >
                          Copy link
                        </button>
                      ) : null}
                      {i.status === "pending" || i.status === "expired" ? (
                        <>
                          <button
                            type="button"
                            className={buttonClass.quiet}
                            disabled={busy !== null}
                            onClick={() =>
                              void act(`resend-${i.id}`, async () => {
                                await sendJson(`/api/team/invitations/${i.id}/resend`, "POST");
                                return `Invitation sent to ${i.email} again.`;
                              })
                            }
                          >
                            Send again
                          </button>
                          <button
                            type="button"
                            className="text-sm font-medium text-alarm hover:underline disabled:opacity-50"
                            disabled={busy !== null}
                            onClick={() =>
                              void act(`cancel-${i.id}`, async () => {
                                await sendJson(`/api/team/invitations/${i.id}`, "DELETE");
                                return `The invitation to ${i.email} was withdrawn.`;
                              })
                            }
                          >
                            Withdraw
                          </button>
                        </>
                      ) : null}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </TableScroll>
        )}
      </Panel>
    </div>
  );
}
