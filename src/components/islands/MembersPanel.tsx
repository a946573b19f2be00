import { useState, type FormEvent } from 'react';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { InviteSchema } from '@/lib/schemas/workspace';
import { QueryRoot } from './QueryRoot';
import { Field } from './Field';
import { api, ApiClientError, fieldErrors } from './api';

type Member = { id: string; userId: string; name: string; email: string; role: string; createdAt: string };
type MailState = { status: 'sent' | 'sending' | 'delayed' | 'failed'; message: string } | null;
type Invitation = { id: string; email: string; role: string | null; status: string; expiresAt: string; mail?: MailState };
const ROLES = [
  ['owner', 'Owner'],
  ['energy_manager', 'Energy manager'],
  ['consultant', 'Consultant'],
  ['finance', 'Finance'],
] as const;
const label = (r: string | null) => ROLES.find(([k]) => k === r)?.[1] ?? r ?? '';

function Members({ canManage, meId }: { canManage: boolean; meId: string }) {
  const qc = useQueryClient();
  const members = useQuery({ queryKey: ['members'], queryFn: () => api<{ members: Member[] }>('/api/members') });
  const invitations = useQuery({ queryKey: ['invitations'], queryFn: () => api<{ invitations: Invitation[] }>('/api/invitations'), enabled: canManage });
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [notice, setNotice] = useState<{ ok: boolean; text: string } | null>(null);
  const fail = (e: unknown) => setNotice({ ok: false, text: e instanceof ApiClientError ? e.message : 'That did not work. Try again.' });
  const refresh = () => { qc.invalidateQueries({ queryKey: ['members'] }); qc.invalidateQueries({ queryKey: ['invitations'] }); };

  const invite = useMutation({
    mutationFn: (body: { email: string; role: string }) => api<{ invitation: Invitation }>('/api/invitations', { method: 'POST', body }),
    onSuccess: ({ invitation }) => { setErrors({}); setNotice(invitation.mail && invitation.mail.status !== 'sent' && invitation.mail.status !== 'sending' ? { ok: false, text: `Invitation saved for ${invitation.email} as ${label(invitation.role)}. ${invitation.mail.message}` } : { ok: true, text: `Invitation sent to ${invitation.email} as ${label(invitation.role)}.` }); refresh(); },
    onError: (e) => (e instanceof ApiClientError && Object.keys(e.fields).length ? setErrors(e.fields) : fail(e)),
  });
  const changeRole = useMutation({
    mutationFn: ({ id, role }: { id: string; role: string }) => api(`/api/members/${id}`, { method: 'PATCH', body: { role } }),
    onSuccess: () => { setNotice({ ok: true, text: 'Role changed.' }); refresh(); },
    onError: (e) => { fail(e); refresh(); },
  });
  const remove = useMutation({
    mutationFn: (m: Member) => api(`/api/members/${m.id}`, { method: 'DELETE' }).then(() => m),
    onSuccess: (m) => { setNotice({ ok: true, text: `${m.name} was removed from the workspace.` }); refresh(); },
    onError: fail,
  });
  const cancel = useMutation({
    mutationFn: (i: Invitation) => api(`/api/invitations/${i.id}`, { method: 'DELETE' }),
    onSuccess: () => { setNotice({ ok: true, text: 'Invitation cancelled.' }); refresh(); },
    onError: fail,
  });

  function submit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const parsed = InviteSchema.safeParse(Object.fromEntries(new FormData(e.currentTarget)));
    if (!parsed.success) return setErrors(fieldErrors(parsed.error.issues));
    invite.mutate(parsed.data);
  }

  if (members.isPending) return <p className="text-muted" aria-busy="true">Loading members…</p>;
  if (members.isError) return <p className="notice notice-error" role="alert">Could not load members: {(members.error as Error).message}</p>;

  return (
    <div className="flex flex-col gap-6">
      {notice && <p className={`notice ${notice.ok ? 'notice-ok' : 'notice-error'}`} role={notice.ok ? 'status' : 'alert'}>{notice.text}</p>}
      <div className="overflow-x-auto rounded border border-rule">
        <table className="ledger">
          <thead><tr><th scope="col">Name</th><th scope="col">E-mail</th><th scope="col">Role</th>{canManage && <th scope="col"><span className="sr-only">Actions</span></th>}</tr></thead>
          <tbody>
            {members.data.members.map((m) => (
              <tr key={m.id}>
                <td>{m.name}{m.userId === meId && <span className="text-muted"> (you)</span>}</td>
                <td>{m.email}</td>
                <td>
                  {canManage ? (
                    <>
                      <label htmlFor={`role-${m.id}`} className="sr-only">Role of {m.name}</label>
                      <select id={`role-${m.id}`} className="rounded border border-rule bg-surface px-2 py-1" value={m.role} disabled={changeRole.isPending} onChange={(e) => changeRole.mutate({ id: m.id, role: e.target.value })}>
                        {ROLES.map(([k, l]) => <option key={k} value={k}>{l}</option>)}
                      </select>
                    </>
                  ) : label(m.role)}
                </td>
                {canManage && <td className="text-right">{m.userId !== meId && <button className="btn btn-danger text-sm" aria-label={`Remove ${m.name}`} onClick={() => { if (window.confirm(`Remove ${m.name} from this workspace?`)) remove.mutate(m); }}>Remove</button>}</td>}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {canManage && (
        <section className="card p-4" aria-labelledby="invite-h">
          <h2 id="invite-h" className="mb-3">Invite someone</h2>
          <form onSubmit={submit} noValidate className="flex flex-wrap items-end gap-3">
            <Field label="E-mail" name="email" type="email" error={errors.email} required />
            <div className="field">
              <label htmlFor="invite-role">Role</label>
              <select id="invite-role" name="role" defaultValue="energy_manager" aria-invalid={errors.role ? true : undefined}>
                {ROLES.map(([k, l]) => <option key={k} value={k}>{l}</option>)}
              </select>
              {errors.role && <span className="error" role="alert">{errors.role}</span>}
            </div>
            <button className="btn btn-primary" disabled={invite.isPending}>{invite.isPending ? 'Sending…' : 'Send invitation'}</button>
          </form>
          <h3 className="mt-5 mb-2 text-sm font-medium">Pending invitations</h3>
          {invitations.data?.invitations.length ? (
            <ul className="flex flex-col gap-1 text-sm">
              {invitations.data.invitations.map((i) => (
                <li key={i.id} className="flex items-center gap-3">
                  <span>{i.email}</span><span className="tag">{label(i.role)}</span>
                  <span className="text-muted">until {new Date(i.expiresAt).toLocaleDateString('en-GB', { day: 'numeric', month: 'short', year: 'numeric' })}</span>
                  {i.mail && (i.mail.status === 'delayed' || i.mail.status === 'failed') && <span className="tag" title={i.mail.message}>{i.mail.status === 'delayed' ? 'E-mail delayed, retrying' : 'E-mail not delivered'}</span>}
                  <button className="btn btn-quiet text-sm" onClick={() => cancel.mutate(i)} aria-label={`Cancel invitation to ${i.email}`}>Cancel</button>
                </li>
              ))}
            </ul>
          ) : <p className="text-sm text-muted">None.</p>}
        </section>
      )}
    </div>
  );
}

export default function MembersPanel(props: { canManage: boolean; meId: string }) {
  return <QueryRoot><Members {...props} /></QueryRoot>;
}
