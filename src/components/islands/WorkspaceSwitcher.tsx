import { useState } from 'react';
import { api, ApiClientError } from './api';

type Ws = { id: string; name: string; role: string };
const ROLE: Record<string, string> = { owner: 'Owner', energy_manager: 'Energy manager', consultant: 'Consultant', finance: 'Finance' };

/** Switches the active workspace; a consultant reaches each client workspace from here. */
export default function WorkspaceSwitcher({ workspaces, activeId }: { workspaces: Ws[]; activeId: string | null }) {
  const [error, setError] = useState<string | null>(null);
  if (workspaces.length === 0) return <a href="/workspaces/new" className="text-sm">Create a workspace</a>;

  async function change(id: string) {
    if (id === '__new') return window.location.assign('/workspaces/new');
    try {
      await api('/api/workspaces/active', { method: 'PUT', body: { workspaceId: id } });
      window.location.assign('/');
    } catch (e) {
      setError(e instanceof ApiClientError ? e.message : 'Could not switch workspace.');
    }
  }

  return (
    <div className="flex items-center gap-2">
      <label htmlFor="workspace-switcher" className="sr-only">Workspace</label>
      <select id="workspace-switcher" className="rounded border border-rule bg-surface px-2 py-1 text-sm" value={activeId ?? ''} onChange={(e) => change(e.target.value)}>
        {workspaces.map((w) => (
          <option key={w.id} value={w.id}>{w.name} ({ROLE[w.role] ?? w.role})</option>
        ))}
        <option value="__new">+ New workspace…</option>
      </select>
      {error && <span role="alert" className="text-sm text-cost">{error}</span>}
    </div>
  );
}
