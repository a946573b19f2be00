import type { InputHTMLAttributes, ReactNode } from 'react';

type Props = InputHTMLAttributes<HTMLInputElement> & { label: string; name: string; error?: string; hint?: ReactNode };

/** A labelled input with its error and hint tied to it for screen readers. */
export function Field({ label, name, error, hint, id, ...rest }: Props) {
  const inputId = id ?? `f-${name}`;
  const describedBy = [error ? `${inputId}-err` : '', hint ? `${inputId}-hint` : ''].filter(Boolean).join(' ') || undefined;
  return (
    <div className="field">
      <label htmlFor={inputId}>{label}</label>
      <input id={inputId} name={name} aria-invalid={error ? true : undefined} aria-describedby={describedBy} {...rest} />
      {hint && <span id={`${inputId}-hint`} className="hint">{hint}</span>}
      {error && <span id={`${inputId}-err`} className="error" role="alert">{error}</span>}
    </div>
  );
}
