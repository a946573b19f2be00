import { useState } from 'react';
import { api, ApiClientError } from './api';

type Props = { invitationId: string; workspaceName: string; inviterName: string; roleLabel: string; status: string; expired: boolean };

export default function AcceptInvitation(p: Props) {
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  if (p.status !== 'pending' || p.expired)
    return <p className="notice notice-error" role="alert">This invitation is {p.expired ? 'expired' : p.status}. Ask an Owner of {p.workspaceName} for a new one.</p>;

  async function accept() {
    setBusy(true);
    try {
      await api(`/api/invitations/${p.invitationId}/accept`, { method: 'POST' });
      window.location.assign('/');
    } catch (e) {
      setError(e instanceof ApiClientError ? e.message : 'Could not accept the invitation. Try again.');
      setBusy(false);
    }
  }

  return (
    <div className="flex flex-col gap-3">
      <p><strong>{p.inviterName}</strong> invited you to the workspace <strong>{p.workspaceName}</strong> as <strong>{p.roleLabel}</strong>.</p>
      {error && <p className="notice notice-error" role="alert">{error}</p>}
      <p><button className="btn btn-primary" onClick={accept} disabled={busy}>{busy ? 'Joining…' : `Join ${p.workspaceName}`}</button></p>
    </div>
  );
}
