import { useState, type FormEvent } from 'react';
import { BillDeterminantsSchema } from '@/lib/import/bills/bill-schema';
import { Field } from '../Field';
import { fieldErrors } from '../api';

const num = (v: FormDataEntryValue | null) => (v === null || String(v).trim() === '' ? undefined : Number(String(v).replace(/,/g, '')));

/** One bill's billed determinants, checked with the same schema as the endpoint. */
export function BillForm({ currency, busy, serverErrors, onSubmit }: { currency: string; busy: boolean; serverErrors: Record<string, string>; onSubmit: (b: unknown) => void }) {
  const [errors, setErrors] = useState<Record<string, string>>({});
  const shown = { ...serverErrors, ...errors };
  function submit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const d = new FormData(e.currentTarget);
    const demand = num(d.get('billedDemand'));
    const value = {
      periodStart: String(d.get('periodStart') ?? ''),
      periodEnd: String(d.get('periodEnd') ?? ''),
      kwh: num(d.get('kwh')),
      billedDemand: demand,
      billedDemandUnit: demand === undefined ? undefined : String(d.get('billedDemandUnit')),
      kvarh: num(d.get('kvarh')),
      powerFactor: num(d.get('powerFactor')),
      pfCharge: num(d.get('pfCharge')),
      total: num(d.get('total')),
      currency,
    };
    const parsed = BillDeterminantsSchema.safeParse(value);
    if (!parsed.success) return setErrors(fieldErrors(parsed.error.issues));
    setErrors({});
    onSubmit(parsed.data);
  }
  return (
    <form onSubmit={submit} noValidate className="grid grid-cols-2 gap-3 md:grid-cols-5">
      <Field label="Period from" name="periodStart" type="date" error={shown.periodStart} required />
      <Field label="Period to (inclusive)" name="periodEnd" type="date" error={shown.periodEnd} required />
      <Field label="Energy (kWh)" name="kwh" inputMode="decimal" error={shown.kwh} required />
      <Field label="Billed demand" name="billedDemand" inputMode="decimal" error={shown.billedDemand} />
      <div className="field"><label htmlFor="b-unit">Demand unit</label><select id="b-unit" name="billedDemandUnit" defaultValue="kW"><option>kW</option><option>kVA</option></select></div>
      <Field label="Reactive (kvarh)" name="kvarh" inputMode="decimal" error={shown.kvarh} hint="As printed, if any." />
      <Field label="Power factor" name="powerFactor" inputMode="decimal" error={shown.powerFactor} hint="As printed, 0 to 1." />
      <Field label={`PF charge (${currency})`} name="pfCharge" inputMode="decimal" error={shown.pfCharge} hint="Negative for a credit." />
      <Field label={`Bill total (${currency})`} name="total" inputMode="decimal" error={shown.total} />
      <div className="flex items-end"><button className="btn btn-primary" disabled={busy}>{busy ? 'Saving…' : 'Add bill'}</button></div>
      {shown.form && <p className="notice notice-error col-span-full" role="alert">{shown.form}</p>}
    </form>
  );
}
