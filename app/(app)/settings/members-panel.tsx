"use client";

import { useState } from "react";
import { useForm, Controller } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { newMemberSchema, type NewMemberInput } from "@/lib/validation/firm";
import { ROLES, ROLE_LABELS, type Role } from "@/lib/auth/roles";
import { apiFetch, ApiError } from "@/app/_components/api";
import { primaryButtonClass, secondaryButtonClass } from "@/app/_components/field";
import { TextField, setFieldErrors } from "@/app/_components/form/fields";
import { StatusBadge } from "@/app/_components/status-badge";
import type { Member } from "@/lib/data/members";

function RolePicker({ value, onChange, idPrefix }: { value: Role[]; onChange: (roles: Role[]) => void; idPrefix: string }) {
  return (
    <div className="flex flex-wrap gap-x-4 gap-y-1">
      {ROLES.map((role) => (
        <label key={role} className="flex items-center gap-1.5 text-sm" htmlFor={`${idPrefix}-${role}`}>
          <input
            id={`${idPrefix}-${role}`}
            type="checkbox"
            checked={value.includes(role)}
            onChange={(e) => onChange(e.target.checked ? ROLES.filter((r) => r === role || value.includes(r)) : value.filter((r) => r !== role))}
          />
          {ROLE_LABELS[role]}
        </label>
      ))}
    </div>
  );
}

interface Invitation {
  mail: { status: "sent" } | { status: "failed"; message: string } | { status: "not_configured" };
  link: string | null;
  expiresAt: string | null;
}

/** What the administrator is told after an invitation: sent, not sent (and why), or the link to pass on. */
function invitationStatus(name: string, email: string, invitation: Invitation): string {
  if (invitation.mail.status === "sent") return `Invitation sent to ${email}.`;
  if (invitation.mail.status === "failed") return `${name} was added, but the invitation was not sent: ${invitation.mail.message} Use "Send invitation again" when mail works.`;
  return invitation.link
    ? `No mail server is configured. Pass this single-use link to ${name} yourself (valid until ${invitation.expiresAt?.slice(0, 16).replace("T", " ")} UTC): ${invitation.link}`
    : `${name} was added; they sign in with their existing Ballast password.`;
}

function MemberRow({ member, isSelf, onChanged }: { member: Member; isSelf: boolean; onChanged: (m: Member) => void }) {
  const [roles, setRoles] = useState<Role[]>(member.roles);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const dirty = roles.join() !== member.roles.join();

  async function save(body: { roles?: Role[]; active?: boolean }) {
    setBusy(true);
    setError(null);
    try {
      const { member: updated } = await apiFetch<{ member: Member }>(`/api/members/${member.id}`, { method: "PATCH", body });
      setRoles(updated.roles);
      onChanged(updated);
    } catch (e) {
      setError(e instanceof Error ? e.message : "Could not save.");
    } finally {
      setBusy(false);
    }
  }

  return (
    <li className="rounded-lg border border-ink-line bg-paper-raised p-4" data-testid="member-row">
      <div className="flex flex-wrap items-start justify-between gap-2">
        <div>
          <p className="font-medium">
            {member.name} {isSelf ? <span className="text-sm text-ink-muted">(you)</span> : null}
          </p>
          <p className="text-sm text-ink-muted">{member.email}</p>
        </div>
        {!member.active ? (
          <StatusBadge tone="neutral">Deactivated</StatusBadge>
        ) : member.invitationExpiresAt ? (
          <StatusBadge tone="caution">Invited</StatusBadge>
        ) : (
          <StatusBadge tone="ok">Active</StatusBadge>
        )}
      </div>
      {member.active && member.invitationExpiresAt ? <InvitationLine member={member} onChanged={onChanged} /> : null}
      <fieldset className="mt-3" disabled={busy || !member.active}>
        <legend className="sr-only">Roles of {member.name}</legend>
        <RolePicker value={roles} onChange={setRoles} idPrefix={`m-${member.id}`} />
      </fieldset>
      <div className="mt-3 flex flex-wrap gap-2">
        {member.active ? (
          <>
            <button type="button" className={secondaryButtonClass} disabled={!dirty || busy || roles.length === 0} onClick={() => save({ roles })}>
              Save roles
            </button>
            <button type="button" className={secondaryButtonClass} disabled={busy} onClick={() => save({ active: false })}>
              Deactivate
            </button>
          </>
        ) : (
          <button type="button" className={secondaryButtonClass} disabled={busy} onClick={() => save({ active: true })}>
            Reactivate
          </button>
        )}
      </div>
      {roles.length === 0 ? <p className="mt-2 text-sm text-alert">Give at least one role.</p> : null}
      {error ? (
        <p role="alert" className="mt-2 text-sm text-alert">
          {error}
        </p>
      ) : null}
    </li>
  );
}

/** A pending invitation: until when its link works, and a way to send a fresh one. */
function InvitationLine({ member, onChanged }: { member: Member; onChanged: (m: Member) => void }) {
  const [message, setMessage] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const expiresAt = member.invitationExpiresAt!;
  const expired = expiresAt <= new Date().toISOString();
  async function resend() {
    setBusy(true);
    setMessage(null);
    try {
      const { invitation } = await apiFetch<{ invitation: Invitation }>(`/api/members/${member.id}/invitation`, { method: "POST", body: {} });
      setMessage(invitationStatus(member.name, member.email, invitation));
      if (invitation.expiresAt) onChanged({ ...member, invitationExpiresAt: invitation.expiresAt });
    } catch (e) {
      setMessage(e instanceof Error ? e.message : "Could not send the invitation.");
    } finally {
      setBusy(false);
    }
  }
  return (
    <div className="mt-2 flex flex-wrap items-center gap-3 text-sm text-ink-soft">
      <span>
        {expired ? "The invitation link expired on" : "Has not chosen a password yet; the link works until"} {expiresAt.slice(0, 16).replace("T", " ")} UTC.
      </span>
      <button type="button" className={secondaryButtonClass} disabled={busy} onClick={resend}>
        {busy ? "Sending…" : "Send invitation again"}
      </button>
      {message ? (
        <p role="status" className="basis-full break-all">
          {message}
        </p>
      ) : null}
    </div>
  );
}

export function MembersPanel({ initial, currentUserId }: { initial: Member[]; currentUserId: string }) {
  const [members, setMembers] = useState(initial);
  const [status, setStatus] = useState<string | null>(null);
  const form = useForm<NewMemberInput>({ resolver: zodResolver(newMemberSchema), defaultValues: { name: "", email: "", roles: [] } });
  const {
    control,
    handleSubmit,
    reset,
    formState: { errors, isSubmitting },
  } = form;

  const onSubmit = handleSubmit(async (values) => {
    setStatus(null);
    try {
      const { member, invitation } = await apiFetch<{ member: Member; invitation: Invitation }>("/api/members", { method: "POST", body: values });
      setMembers((list) => [...list, member]);
      reset();
      setStatus(invitationStatus(member.name, member.email, invitation));
    } catch (e) {
      if (e instanceof ApiError) setFieldErrors(form, e.fields);
      setStatus(e instanceof Error ? e.message : "Could not add the person.");
    }
  });

  return (
    <div className="flex flex-col gap-4">
      <ul className="flex flex-col gap-3" aria-label="Members">
        {members.map((m) => (
          <MemberRow key={m.id} member={m} isSelf={m.userId === currentUserId} onChanged={(u) => setMembers((list) => list.map((x) => (x.id === u.id ? u : x)))} />
        ))}
      </ul>
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4 rounded-lg border border-ink-line bg-paper-raised p-5" aria-labelledby="add-member-heading">
        <h3 id="add-member-heading" className="font-semibold">
          Invite a person
        </h3>
        <div className="grid gap-4 sm:grid-cols-2">
          <TextField form={form} name="name" id="new-name" label="Name" />
          <TextField form={form} name="email" id="new-email" label="E-mail" type="email" />
        </div>
        <p className="text-sm text-ink-muted">
          Ballast e-mails them a link to choose their own password; it works once, for 72 hours. Someone who already has a Ballast account signs in with
          their existing password.
        </p>
        <fieldset>
          <legend className="mb-1 text-sm font-medium">Roles</legend>
          <Controller control={control} name="roles" render={({ field }) => <RolePicker value={field.value} onChange={field.onChange} idPrefix="new-role" />} />
          {errors.roles?.message ? (
            <p role="alert" className="mt-1 text-sm text-alert">
              {errors.roles.message}
            </p>
          ) : null}
        </fieldset>
        <div className="flex items-center gap-3">
          <button type="submit" className={primaryButtonClass} disabled={isSubmitting}>
            {isSubmitting ? "Inviting…" : "Send invitation"}
          </button>
          {status ? (
            <p role="status" className="text-sm text-ink-soft break-all" data-testid="invite-status">
              {status}
            </p>
          ) : null}
        </div>
      </form>
    </div>
  );
}
