import { useState, type FormEvent } from 'react';
import { useHydrated } from '../useHydrated';
import { authClient } from '@/lib/auth/auth-client';
import { ResetRequestSchema, ResetSchema } from '@/lib/schemas/auth';
import { Field } from '../Field';
import { fieldErrors } from '../api';

/** Without a token: ask for the reset link. With one: choose the new password. */
export default function ResetPasswordForm({ token, tokenError }: { token?: string; tokenError?: string }) {
  const [errors, setErrors] = useState<Record<string, string>>(tokenError ? { form: 'This reset link is invalid or has expired. Ask for a new one below.' } : {});
  const [busy, setBusy] = useState(false);
  const hydrated = useHydrated();
  const [done, setDone] = useState<string | null>(null);

  async function request(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const parsed = ResetRequestSchema.safeParse(Object.fromEntries(new FormData(e.currentTarget)));
    if (!parsed.success) return setErrors(fieldErrors(parsed.error.issues));
    setBusy(true);
    await authClient.requestPasswordReset({ email: parsed.data.email, redirectTo: '/reset-password' });
    setBusy(false);
    setErrors({});
    setDone(`If ${parsed.data.email} has an account, a reset link is on its way. It works for one hour.`);
  }

  async function reset(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const parsed = ResetSchema.safeParse(Object.fromEntries(new FormData(e.currentTarget)));
    if (!parsed.success) return setErrors(fieldErrors(parsed.error.issues));
    setBusy(true);
    const { error } = await authClient.resetPassword({ newPassword: parsed.data.password, token: token! });
    setBusy(false);
    if (error) return setErrors({ form: 'This reset link is invalid or has expired. Ask for a new one.' });
    setErrors({});
    setDone('Your password is changed. Sign in with the new one.');
  }

  if (done)
    return (
      <div className="notice notice-ok" role="status">
        <p>{done}</p>
        {token && <p className="mt-2"><a href="/sign-in">Sign in</a></p>}
      </div>
    );

  if (token && !tokenError)
    return (
      <form method="post" onSubmit={reset} noValidate className="flex flex-col gap-3">
        <Field label="New password" name="password" type="password" autoComplete="new-password" error={errors.password} hint="At least 10 characters." required />
        <Field label="New password again" name="confirm" type="password" autoComplete="new-password" error={errors.confirm} required />
        {errors.form && <p className="notice notice-error" role="alert">{errors.form}</p>}
        <button className="btn btn-primary self-start" disabled={busy || !hydrated}>Set new password</button>
      </form>
    );

  return (
    <form method="post" onSubmit={request} noValidate className="flex flex-col gap-3">
      {errors.form && <p className="notice notice-error" role="alert">{errors.form}</p>}
      <Field label="E-mail of your account" name="email" type="email" autoComplete="email" error={errors.email} required />
      <button className="btn btn-primary self-start" disabled={busy || !hydrated}>Send reset link</button>
    </form>
  );
}
