"use client";
import { useRouter } from "next/navigation";
import { useState, type FormEvent, type ReactNode } from "react";
import useSWR, { SWRConfig } from "swr";
import { Badge, Card, Notice } from "@/components/ui/card";
import { SelectField, TextField } from "@/components/ui/field";
import { Button, buttonClass } from "@/components/ui/button";
import { RevokeCell } from "@/components/ui/revoke-cell";
import { TableHead } from "@/components/ui/table";
import type { Member } from "@/db/queries/teams";
import type { Role } from "@/lib/access";
import type { publicInvite } from "@/lib/invites";
import { ApiRequestError, apiSend, errorMessage, fetchJson } from "@/lib/api-client";
import { swrKeys } from "@/lib/swr-keys";

/** An invite as the API shows it (GET/POST /api/teams/[teamId]/invites). */
type PublicInvite = ReturnType<typeof publicInvite>;
type MembersBody = { members: Member[]; you: { userId: string; role: Role } };
type InvitesBody = { invites: PublicInvite[] };

const dateFmt = new Intl.DateTimeFormat("en-GB", { day: "numeric", month: "short", year: "numeric", timeZone: "UTC" });
const ROLE_HELP: Record<Role, string> = {
  owner: "everything, including members and deleting",
  editor: "create and change baselines, scenarios and reports",
  viewer: "read only",
};

export function TeamSettings(props: { teamId: string; teamName: string; role: Role; userId: string; members: MembersBody; invites: InvitesBody | null }) {
  const fallback: Record<string, unknown> = { [swrKeys.teamMembers(props.teamId)]: props.members };
  if (props.invites) fallback[swrKeys.teamInvites(props.teamId)] = props.invites;
  return (
    <SWRConfig value={{ fallback, fetcher: fetchJson }}>
      <SettingsBody {...props} />
    </SWRConfig>
  );
}

function SettingsBody({ teamId, teamName, role, userId }: { teamId: string; teamName: string; role: Role; userId: string }) {
  const isOwner = role === "owner";
  return (
    <div className="space-y-6">
      {isOwner ? (
        <RenameTeam teamId={teamId} teamName={teamName} />
      ) : (
        <Notice>Only owners can change members, roles, invites and the team name. You are {role === "editor" ? "an editor" : "a viewer"} here.</Notice>
      )}
      <Members teamId={teamId} isOwner={isOwner} userId={userId} />
      {isOwner ? <Invites teamId={teamId} /> : null}
    </div>
  );
}

function RenameTeam({ teamId, teamName }: { teamId: string; teamName: string }) {
  const router = useRouter();
  const [errors, setErrors] = useState<string[] | undefined>();
  const [status, setStatus] = useState<string | null>(null);
  async function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const name = String(new FormData(e.currentTarget).get("name") ?? "");
    setErrors(undefined);
    setStatus(null);
    try {
      await apiSend("PATCH", `/api/teams/${teamId}`, { name });
      setStatus("Saved.");
      router.refresh();
    } catch (err) {
      setErrors(err instanceof ApiRequestError && err.fields.name ? err.fields.name : [errorMessage(err)]);
    }
  }
  return (
    <Card title="Team">
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-3 sm:flex-row sm:items-start">
        <TextField label="Team name" name="name" defaultValue={teamName} maxLength={80} required errors={errors} className="sm:w-80" />
        <button type="submit" className={buttonClass("secondary", "sm:mt-6")}>
          Rename
        </button>
        {status ? (
          <p role="status" className="text-sm text-good sm:mt-7">
            {status}
          </p>
        ) : null}
      </form>
    </Card>
  );
}

/** The members' and the invites' tables: same header look, a hidden caption, an actions column last. */
function TeamTable({ caption, columns, className = "", children }: { caption: string; columns: string[]; className?: string; children: ReactNode }) {
  return (
    <table className={`${className} w-full text-sm`.trim()}>
      <caption className="sr-only">{caption}</caption>
      <TableHead
        rowClassName="border-b border-rule text-left text-xs uppercase tracking-wide text-muted"
        cell="py-1.5 pr-3"
        lastCell="py-1.5"
        columns={[...columns, { label: "Actions", srOnly: true }]}
      />
      <tbody className="divide-y divide-rule">{children}</tbody>
    </table>
  );
}

function Members({ teamId, isOwner, userId }: { teamId: string; isOwner: boolean; userId: string }) {
  const router = useRouter();
  const key = swrKeys.teamMembers(teamId);
  const { data, mutate } = useSWR<MembersBody>(key);
  const [error, setError] = useState<string | null>(null);
  const members = data?.members ?? [];

  async function changeRole(m: Member, role: Role) {
    setError(null);
    try {
      await apiSend("PATCH", `${key}/${m.userId}`, { role });
      await mutate();
      if (m.userId === userId) router.refresh();
    } catch (err) {
      setError(errorMessage(err));
      await mutate();
    }
  }
  async function remove(m: Member) {
    const self = m.userId === userId;
    if (!window.confirm(self ? "Leave this team? You lose access to its data." : `Remove ${m.name} (${m.email}) from the team?`)) return;
    setError(null);
    try {
      await apiSend("DELETE", `${key}/${m.userId}`);
      if (self) {
        router.push("/teams");
        router.refresh();
      } else await mutate();
    } catch (err) {
      setError(errorMessage(err));
    }
  }

  return (
    <Card title={`Members (${members.length})`}>
      {error ? (
        <div className="mb-3">
          <Notice tone="bad">{error}</Notice>
        </div>
      ) : null}
      <TeamTable caption="Team members and their roles" columns={["Name", "E-mail", "Role", "Joined"]}>
        {members.map((m) => (
          <tr key={m.userId}>
            <td className="py-1.5 pr-3 font-medium text-ink">
              {m.name}
              {m.userId === userId ? <span className="ml-1 text-xs text-muted">(you)</span> : null}
            </td>
            <td className="py-1.5 pr-3 text-muted">{m.email}</td>
            <td className="py-1.5 pr-3">
              {isOwner ? (
                <select
                  aria-label={`Role of ${m.name}`}
                  value={m.role}
                  onChange={(e) => changeRole(m, e.target.value as Role)}
                  className="rounded-md border border-rule-strong bg-panel px-2 py-1 text-sm"
                >
                  <option value="owner">owner</option>
                  <option value="editor">editor</option>
                  <option value="viewer">viewer</option>
                </select>
              ) : (
                <Badge tone={m.role === "owner" ? "copper" : "neutral"}>{m.role}</Badge>
              )}
            </td>
            <td className="py-1.5 pr-3 text-muted tabular">{dateFmt.format(new Date(m.joinedAt))}</td>
            <td className="py-1.5 text-right">
              {m.userId === userId ? (
                <Button variant="ghost" onClick={() => remove(m)}>
                  Leave team
                </Button>
              ) : isOwner ? (
                <Button variant="danger" onClick={() => remove(m)} aria-label={`Remove ${m.name}`}>
                  Remove
                </Button>
              ) : null}
            </td>
          </tr>
        ))}
      </TeamTable>
      <dl className="mt-4 grid gap-1 text-xs text-muted sm:grid-cols-3">
        {(Object.keys(ROLE_HELP) as Role[]).map((r) => (
          <div key={r}>
            <dt className="inline font-semibold text-ink">{r}: </dt>
            <dd className="inline">{ROLE_HELP[r]}</dd>
          </div>
        ))}
      </dl>
    </Card>
  );
}

function Invites({ teamId }: { teamId: string }) {
  const key = swrKeys.teamInvites(teamId);
  const { data, mutate } = useSWR<InvitesBody>(key);
  const [fields, setFields] = useState<Record<string, string[]>>({});
  const [message, setMessage] = useState<{ tone: "good" | "bad"; text: string } | null>(null);
  const [busy, setBusy] = useState(false);
  const invites = data?.invites ?? [];

  async function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = e.currentTarget;
    const body = Object.fromEntries(new FormData(form));
    setBusy(true);
    setFields({});
    setMessage(null);
    try {
      const r = await apiSend<{ invite: PublicInvite; mail: { status: string } }>("POST", key, body);
      setMessage(
        r.mail.status === "sent"
          ? { tone: "good", text: `Invite sent to ${r.invite.email}.` }
          : { tone: "bad", text: `The invite was created, but the e-mail to ${r.invite.email} could not be sent. Check the outbox.` },
      );
      form.reset();
      await mutate();
    } catch (err) {
      if (err instanceof ApiRequestError && err.hasFields) setFields(err.fields);
      else setMessage({ tone: "bad", text: errorMessage(err) });
    } finally {
      setBusy(false);
    }
  }
  async function revoke(i: PublicInvite) {
    setMessage(null);
    try {
      await apiSend("DELETE", `${key}/${i.id}`);
      await mutate();
    } catch (err) {
      setMessage({ tone: "bad", text: errorMessage(err) });
    }
  }

  return (
    <Card title="Invites">
      <form onSubmit={onSubmit} noValidate aria-label="Invite a member" className="flex flex-col gap-3 sm:flex-row sm:items-start">
        <TextField label="E-mail" name="email" type="email" required autoComplete="off" errors={fields.email} className="sm:w-80" />
        <SelectField label="Role" name="role" defaultValue="editor" errors={fields.role}>
          <option value="viewer">viewer</option>
          <option value="editor">editor</option>
          <option value="owner">owner</option>
        </SelectField>
        <button type="submit" disabled={busy} className={buttonClass("primary", "sm:mt-6")}>
          {busy ? "Sending…" : "Send invite"}
        </button>
      </form>
      <p className="mt-2 text-xs text-muted">
        The link in the e-mail works once and expires after 7 days. A new invite to the same address replaces the old link.
      </p>
      {message ? (
        <div className="mt-3">
          <Notice tone={message.tone}>{message.text}</Notice>
        </div>
      ) : null}
      {invites.length ? (
        <TeamTable className="mt-4" caption="Invites sent from this team" columns={["E-mail", "Role", "Status", "Expires"]}>
          {invites.map((i) => (
            <tr key={i.id}>
              <td className="py-1.5 pr-3">{i.email}</td>
              <td className="py-1.5 pr-3">{i.role}</td>
              <td className="py-1.5 pr-3">
                <Badge tone={i.status === "pending" ? "copper" : i.status === "accepted" ? "good" : "neutral"}>{i.status}</Badge>
              </td>
              <td className="py-1.5 pr-3 text-muted tabular">{dateFmt.format(new Date(i.expiresAt))}</td>
              <RevokeCell className="py-1.5" live={i.status === "pending"} onRevoke={() => revoke(i)} label={`Revoke invite to ${i.email}`} />
            </tr>
          ))}
        </TeamTable>
      ) : null}
    </Card>
  );
}
