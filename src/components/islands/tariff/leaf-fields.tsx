/** Inputs for single values (text, number, choice, small sets), each labelled with its hint and error. */
import { useEffect, useState, type ReactNode } from 'react';
import { useController } from 'react-hook-form';
import { fieldId, useEditor } from './form-context';
import { optionLabel, readableError, setItemLabel } from './labels';

type LeafProps = { path: string; label: string; hint?: string; optional: boolean; unit?: string };

function Shell({ path, label, hint, error, children, optional }: { path: string; label: string; hint?: string; error?: string; children: ReactNode; optional: boolean }) {
  const id = fieldId(path);
  return (
    <div className="field min-w-0">
      <label htmlFor={id}>
        {label}
        {optional && <span className="font-normal text-muted"> (optional)</span>}
      </label>
      {children}
      {hint && <span id={`${id}-hint`} className="hint">{hint}</span>}
      {error && <span id={`${id}-err`} className="error" role="alert">{readableError(error)}</span>}
    </div>
  );
}

const describedBy = (path: string, hint?: string, error?: string) => [error ? `${fieldId(path)}-err` : '', hint ? `${fieldId(path)}-hint` : ''].filter(Boolean).join(' ') || undefined;

/** The stored value for what was typed: a number when it reads as one, else the text (zod then says why). */
function numberValue(text: string, optional: boolean): unknown {
  const t = text.trim();
  if (t === '') return optional ? undefined : '';
  const n = Number(t);
  return Number.isFinite(n) ? n : t;
}

export function NumberField({ path, label, hint, optional, unit, int }: LeafProps & { int: boolean }) {
  const { readOnly } = useEditor();
  const { field, fieldState } = useController({ name: path });
  const [text, setText] = useState(field.value === undefined || field.value === null ? '' : String(field.value));
  // Follow values set from outside (a reset, a changed choice) without fighting the typing.
  useEffect(() => {
    if (numberValue(text, optional) !== field.value) setText(field.value === undefined || field.value === null ? '' : String(field.value));
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [field.value]);
  const error = fieldState.error?.message;
  return (
    <Shell path={path} label={label} hint={hint} error={error} optional={optional}>
      <span className="flex items-center gap-1">
        <input
          id={fieldId(path)}
          ref={field.ref}
          name={path}
          type="text"
          inputMode={int ? 'numeric' : 'decimal'}
          autoComplete="off"
          className="figure w-full min-w-0"
          value={text}
          readOnly={readOnly}
          aria-invalid={error ? true : undefined}
          aria-describedby={describedBy(path, hint, error)}
          onChange={(e) => {
            setText(e.target.value);
            field.onChange(numberValue(e.target.value, optional));
          }}
          onBlur={field.onBlur}
        />
        {unit && <span className="unit shrink-0 whitespace-nowrap">{unit}</span>}
      </span>
    </Shell>
  );
}

export function TextField({ path, label, hint, optional, date, time, maxLength, upper }: LeafProps & { date: boolean; time: boolean; maxLength?: number; upper: boolean }) {
  const { readOnly } = useEditor();
  const { field, fieldState } = useController({ name: path });
  const error = fieldState.error?.message;
  return (
    <Shell path={path} label={label} hint={hint} error={error} optional={optional}>
      <input
        id={fieldId(path)}
        ref={field.ref}
        name={path}
        type={date ? 'date' : 'text'}
        inputMode={time ? 'numeric' : undefined}
        placeholder={time ? 'HH:MM' : undefined}
        maxLength={maxLength}
        autoComplete="off"
        className={time || date || upper ? 'figure text-left' : undefined}
        value={(field.value as string | undefined) ?? ''}
        readOnly={readOnly}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(path, hint, error)}
        onChange={(e) => {
          const v = upper ? e.target.value.toUpperCase() : e.target.value;
          field.onChange(v === '' && optional ? undefined : v);
        }}
        onBlur={field.onBlur}
      />
    </Shell>
  );
}

export function SelectField({ path, label, hint, optional, options }: LeafProps & { options: string[] }) {
  const { readOnly } = useEditor();
  const { field, fieldState } = useController({ name: path });
  const error = fieldState.error?.message;
  return (
    <Shell path={path} label={label} hint={hint} error={error} optional={optional}>
      <select
        id={fieldId(path)}
        ref={field.ref}
        name={path}
        value={(field.value as string | undefined) ?? ''}
        disabled={readOnly}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(path, hint, error)}
        onChange={(e) => field.onChange(e.target.value === '' && optional ? undefined : e.target.value)}
        onBlur={field.onBlur}
      >
        {optional && <option value="">Not set</option>}
        {options.map((o) => <option key={o} value={o}>{optionLabel(path, o)}</option>)}
      </select>
    </Shell>
  );
}

/** Weekdays or months as checkboxes; none ticked means the condition is absent (when optional). */
export function IntSetField({ path, label, hint, optional, from, to }: LeafProps & { from: number; to: number }) {
  const { readOnly } = useEditor();
  const { field, fieldState } = useController({ name: path });
  const chosen = new Set<number>(Array.isArray(field.value) ? (field.value as number[]) : []);
  const error = fieldState.error?.message ?? (fieldState.error as { root?: { message?: string } } | undefined)?.root?.message;
  const id = fieldId(path);
  const items = Array.from({ length: to - from + 1 }, (_, i) => from + i);
  return (
    <fieldset className="min-w-0 sm:col-span-2" aria-describedby={describedBy(path, hint, error)}>
      <legend className="text-[0.8125rem] font-medium">
        {label}
        {optional && <span className="font-normal text-muted"> (none ticked: every {label.toLowerCase().replace(/s$/, '')})</span>}
      </legend>
      <div className="mt-1 flex flex-wrap gap-x-3 gap-y-1">
        {items.map((n) => (
          <label key={n} className="inline-flex items-center gap-1 text-sm">
            <input
              type="checkbox"
              name={path}
              value={n}
              checked={chosen.has(n)}
              disabled={readOnly}
              ref={n === from ? field.ref : undefined}
              onChange={(e) => {
                const next = new Set(chosen);
                if (e.target.checked) next.add(n);
                else next.delete(n);
                const list = [...next].sort((a, b) => a - b);
                field.onChange(list.length === 0 && optional ? undefined : list);
              }}
            />
            {setItemLabel(path, n)}
          </label>
        ))}
      </div>
      {hint && <span id={`${id}-hint`} className="hint block text-[0.8125rem] text-muted">{hint}</span>}
      {error && <span id={`${id}-err`} className="block text-[0.8125rem] text-cost" role="alert">{readableError(error)}</span>}
    </fieldset>
  );
}
