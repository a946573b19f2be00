import { useEffect, useRef, useState } from 'react';
import { authClient } from '@/lib/auth/auth-client';

type Props = { name: string; email: string; roleLabel: string; canManage: boolean };

/** The signed-in person's menu: who and in which role, members, sign out. */
export default function UserMenu({ name, email, roleLabel, canManage }: Props) {
  const [open, setOpen] = useState(false);
  const ref = useRef<HTMLDivElement>(null);
  useEffect(() => {
    const close = (e: MouseEvent | KeyboardEvent) => {
      if (e instanceof KeyboardEvent ? e.key === 'Escape' : !ref.current?.contains(e.target as Node)) setOpen(false);
    };
    document.addEventListener('click', close);
    document.addEventListener('keydown', close);
    return () => {
      document.removeEventListener('click', close);
      document.removeEventListener('keydown', close);
    };
  }, []);

  async function signOut() {
    await authClient.signOut();
    window.location.assign('/sign-in');
  }

  return (
    <div ref={ref} className="relative">
      <button className="btn btn-quiet text-sm" aria-haspopup="menu" aria-expanded={open} onClick={() => setOpen((o) => !o)}>
        {name} <span aria-hidden="true">▾</span>
      </button>
      {open && (
        <div role="menu" className="absolute right-0 z-20 mt-1 w-64 rounded border border-rule bg-surface p-2 text-sm" style={{ boxShadow: '0 1px 0 #d9d4c7' }}>
          <p className="px-2 py-1 text-muted">{email}</p>
          {roleLabel && <p className="px-2 pb-2 text-muted">Role here: <strong className="text-ink">{roleLabel}</strong></p>}
          <a role="menuitem" className="block rounded px-2 py-1 no-underline hover:bg-paper" href="/members">{canManage ? 'Members and invitations' : 'Members'}</a>
          <a role="menuitem" className="block rounded px-2 py-1 no-underline hover:bg-paper" href="/workspaces/new">New workspace</a>
          <a role="menuitem" className="block rounded px-2 py-1 no-underline hover:bg-paper" href="/api/openapi.json">API reference (OpenAPI)</a>
          <button role="menuitem" className="block w-full rounded px-2 py-1 text-left hover:bg-paper" onClick={signOut}>Sign out</button>
        </div>
      )}
    </div>
  );
}
