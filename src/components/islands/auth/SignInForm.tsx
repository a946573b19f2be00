import { useState, type FormEvent } from 'react';
import { useHydrated } from '../useHydrated';
import { authClient } from '@/lib/auth/auth-client';
import { SignInSchema } from '@/lib/schemas/auth';
import { Field } from '../Field';
import { fieldErrors } from '../api';

/** Only same-site paths are followed after sign-in (no open redirects). */
export function safeNext(next: string | undefined): string {
  return next && next.startsWith('/') && !next.startsWith('//') ? next : '/';
}

export default function SignInForm({ next }: { next?: string }) {
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [busy, setBusy] = useState(false);
  const hydrated = useHydrated();

  async function submit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const parsed = SignInSchema.safeParse(Object.fromEntries(new FormData(e.currentTarget)));
    if (!parsed.success) return setErrors(fieldErrors(parsed.error.issues));
    setErrors({});
    setBusy(true);
    const { error } = await authClient.signIn.email({ ...parsed.data, callbackURL: `/verify?verified=1&next=${encodeURIComponent(safeNext(next))}` });
    setBusy(false);
    if (error) {
      if (error.code === 'EMAIL_NOT_VERIFIED') return setErrors({ form: 'Confirm your e-mail address first: we have just sent you a new link.' });
      if (error.status === 429) return setErrors({ form: 'Too many attempts. Wait a minute and try again.' });
      if ((error.status ?? 0) >= 500) return setErrors({ form: 'The server could not sign you in just now; nothing was changed. Try again in a moment.' });
      return setErrors({ form: 'That e-mail and password do not match an account.' });
    }
    window.location.assign(safeNext(next));
  }

  return (
    <form method="post" onSubmit={submit} noValidate className="flex flex-col gap-3">
      <Field label="E-mail" name="email" type="email" autoComplete="email" error={errors.email} required />
      <Field label="Password" name="password" type="password" autoComplete="current-password" error={errors.password} required />
      {errors.form && <p className="notice notice-error" role="alert">{errors.form}</p>}
      <button className="btn btn-primary self-start" disabled={busy || !hydrated}>{busy ? 'Signing in…' : 'Sign in'}</button>
    </form>
  );
}
