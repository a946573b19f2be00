import { useState, type FormEvent } from 'react';
import { WorkspaceCreateSchema } from '@/lib/schemas/workspace';
import { Field } from './Field';
import { api, ApiClientError, fieldErrors } from './api';

export default function NewWorkspaceForm() {
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [busy, setBusy] = useState(false);
  async function submit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const parsed = WorkspaceCreateSchema.safeParse(Object.fromEntries(new FormData(e.currentTarget)));
    if (!parsed.success) return setErrors(fieldErrors(parsed.error.issues));
    setBusy(true);
    try {
      await api('/api/workspaces', { method: 'POST', body: parsed.data });
      window.location.assign('/');
    } catch (err) {
      setBusy(false);
      setErrors(err instanceof ApiClientError ? { ...err.fields, form: err.message } : { form: 'Could not create the workspace.' });
    }
  }
  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-3">
      <Field label="Workspace name" name="name" placeholder="e.g. the company or client name" error={errors.name} required />
      {errors.form && !errors.name && <p className="notice notice-error" role="alert">{errors.form}</p>}
      <button className="btn btn-primary self-start" disabled={busy}>{busy ? 'Creating…' : 'Create workspace'}</button>
    </form>
  );
}
