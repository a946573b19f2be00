import { useState, type FormEvent } from 'react';
import { useHydrated } from '../useHydrated';
import { authClient } from '@/lib/auth/auth-client';
import { SignUpSchema } from '@/lib/schemas/auth';
import { Field } from '../Field';
import { fieldErrors } from '../api';

export default function SignUpForm({ next }: { next?: string }) {
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [busy, setBusy] = useState(false);
  const hydrated = useHydrated();
  const [sentTo, setSentTo] = useState<string | null>(null);

  async function submit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = Object.fromEntries(new FormData(e.currentTarget));
    const parsed = SignUpSchema.safeParse(form);
    if (!parsed.success) return setErrors(fieldErrors(parsed.error.issues));
    setErrors({});
    setBusy(true);
    const callbackURL = `/verify?verified=1${next ? `&next=${encodeURIComponent(next)}` : ''}`;
    const { error } = await authClient.signUp.email({ ...parsed.data, callbackURL });
    setBusy(false);
    if (error) return setErrors({ form: error.code === 'USER_ALREADY_EXISTS' || error.code === 'USER_ALREADY_EXISTS_USE_ANOTHER_EMAIL' ? 'An account with this e-mail address exists. Sign in instead, or reset the password.' : (error.message ?? 'Sign-up failed. Try again.') });
    setSentTo(parsed.data.email);
  }

  if (sentTo)
    return (
      <div className="notice notice-ok" role="status">
        <p>We sent a confirmation link to <strong>{sentTo}</strong>. Open it to activate your account; it works for one hour.</p>
      </div>
    );

  return (
    <form method="post" onSubmit={submit} noValidate className="flex flex-col gap-3">
      <Field label="Your name" name="name" autoComplete="name" error={errors.name} required />
      <Field label="Work e-mail" name="email" type="email" autoComplete="email" error={errors.email} required />
      <Field label="Password" name="password" type="password" autoComplete="new-password" error={errors.password} hint="At least 10 characters." required />
      {errors.form && <p className="notice notice-error" role="alert">{errors.form}</p>}
      <button className="btn btn-primary self-start" disabled={busy || !hydrated}>{busy ? 'Creating account…' : 'Create account'}</button>
    </form>
  );
}
