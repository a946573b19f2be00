import { useMemo, useState, type FormEvent } from 'react';
import { SiteCreateSchema, type SiteDto } from '@/lib/schemas/site';
import { Field } from './Field';
import { fieldErrors } from './api';

const num = (v: FormDataEntryValue | null) => (v === null || String(v).trim() === '' ? null : Number(String(v).replace(',', '.')));

/** Reads the form into the shape SiteCreateSchema expects (numbers as numbers, blanks as null). */
export function readSiteForm(form: HTMLFormElement) {
  const d = new FormData(form);
  return {
    name: String(d.get('name') ?? ''),
    address: String(d.get('address') ?? ''),
    timeZone: String(d.get('timeZone') ?? ''),
    utility: String(d.get('utility') ?? ''),
    accountNumber: String(d.get('accountNumber') ?? ''),
    serviceVoltageV: num(d.get('serviceVoltageV')),
    transformerKva: num(d.get('transformerKva')),
    transformerImpedancePct: num(d.get('transformerImpedancePct')),
    currency: String(d.get('currency') ?? ''),
  };
}

type Props = { initial?: Partial<SiteDto>; submitLabel: string; busy: boolean; serverErrors: Record<string, string>; onSubmit: (v: ReturnType<typeof readSiteForm>) => void; onCancel?: () => void };

/** The site form, checked in the browser with the same schema the endpoint uses. */
export function SiteForm({ initial = {}, submitLabel, busy, serverErrors, onSubmit, onCancel }: Props) {
  const [errors, setErrors] = useState<Record<string, string>>({});
  const zones = useMemo(() => (typeof Intl.supportedValuesOf === 'function' ? Intl.supportedValuesOf('timeZone') : []), []);
  const shown = { ...serverErrors, ...errors };
  function submit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const values = readSiteForm(e.currentTarget);
    const parsed = SiteCreateSchema.safeParse(values);
    if (!parsed.success) return setErrors(fieldErrors(parsed.error.issues));
    setErrors({});
    onSubmit(values);
  }
  const v = (x: unknown) => (x === null || x === undefined ? '' : String(x));
  return (
    <form onSubmit={submit} noValidate className="grid grid-cols-1 gap-3 md:grid-cols-3">
      <Field label="Site name" name="name" defaultValue={v(initial.name)} error={shown.name} required />
      <Field label="Time zone (IANA)" name="timeZone" list="tz-list" defaultValue={v(initial.timeZone)} placeholder="America/Chicago" error={shown.timeZone} required hint="Used for calendar months and time-of-use hours." />
      <datalist id="tz-list">{zones.map((z) => <option key={z} value={z} />)}</datalist>
      <Field label="Currency" name="currency" defaultValue={v(initial.currency ?? 'USD')} maxLength={3} error={shown.currency} hint="ISO code, e.g. USD, GBP, AUD." />
      <Field label="Address" name="address" defaultValue={v(initial.address)} error={shown.address} />
      <Field label="Utility" name="utility" defaultValue={v(initial.utility)} error={shown.utility} />
      <Field label="Account number" name="accountNumber" defaultValue={v(initial.accountNumber)} error={shown.accountNumber} />
      <Field label="Service voltage (V)" name="serviceVoltageV" inputMode="decimal" defaultValue={v(initial.serviceVoltageV)} error={shown.serviceVoltageV} />
      <Field label="Transformer rating (kVA)" name="transformerKva" inputMode="decimal" defaultValue={v(initial.transformerKva)} error={shown.transformerKva} />
      <Field label="Transformer impedance (%)" name="transformerImpedancePct" inputMode="decimal" defaultValue={v(initial.transformerImpedancePct)} error={shown.transformerImpedancePct} hint="Used to screen capacitor resonance." />
      {shown.form && <p className="notice notice-error md:col-span-3" role="alert">{shown.form}</p>}
      <div className="flex gap-2 md:col-span-3">
        <button className="btn btn-primary" disabled={busy}>{busy ? 'Saving…' : submitLabel}</button>
        {onCancel && <button type="button" className="btn btn-quiet" onClick={onCancel}>Cancel</button>}
      </div>
    </form>
  );
}
