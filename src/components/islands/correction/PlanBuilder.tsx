/** The plan form: Fixed bank or Switched bank, its costs and finance terms, validated by the shared plan schema. */
import { useEffect, useState } from 'react';
import { useForm, useWatch, type FieldErrors, type UseFormReturn } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { PlanSpecSchema, type PlanSpec, type PlanSpecInput } from '@/lib/correction-plans/plan-spec';

export type PlanForm = UseFormReturn<PlanSpecInput, unknown, PlanSpec>;

const toNum = (v: unknown) => (v === '' || v === null || v === undefined ? undefined : typeof v === 'number' ? v : Number(String(v).replace(',', '.')));
const toList = (v: unknown) => {
  if (Array.isArray(v)) return v;
  const s = String(v ?? '').trim();
  return s ? s.split(/[\s,;]+/).filter(Boolean).map(Number) : undefined;
};

export const DEFAULT_SPEC: PlanSpecInput = {
  name: '',
  bank: { kind: 'switched', totalKvar: 150, steps: 6, targetPf: 0.95, leadingLimitPf: 1 },
  costs: { perKvar: 70, fixedInstallation: 4000, omPctOfCapex: 1 },
  finance: { discountRate: 0.08, lifeYears: 15 },
};

function errorAt(errors: FieldErrors<PlanSpecInput>, path: string): string | undefined {
  let cur: unknown = errors;
  for (const k of path.split('.')) cur = cur && typeof cur === 'object' ? (cur as Record<string, unknown>)[k] : undefined;
  const m = cur && typeof cur === 'object' ? (cur as { message?: unknown }).message : undefined;
  return typeof m === 'string' ? m : undefined;
}

export function usePlanForm(): PlanForm {
  return useForm<PlanSpecInput, unknown, PlanSpec>({ resolver: zodResolver(PlanSpecSchema), defaultValues: DEFAULT_SPEC, mode: 'onChange' });
}

/** The form values, debounced, when they pass the schema (else null). */
export function useValidSpec(form: PlanForm, delayMs = 400): PlanSpec | null {
  const values = useWatch({ control: form.control });
  const [spec, setSpec] = useState<PlanSpec | null>(null);
  const key = JSON.stringify(values);
  useEffect(() => {
    const t = setTimeout(() => {
      const parsed = PlanSpecSchema.safeParse({ ...values, name: values.name?.trim() ? values.name : 'Unsaved plan' });
      setSpec(parsed.success ? parsed.data : null);
    }, delayMs);
    return () => clearTimeout(t);
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [key, delayMs]);
  return spec;
}

type NumProps = { form: PlanForm; path: string; label: string; unit?: string; hint?: string; step?: string };

function NumField({ form, path, label, unit, hint, step = 'any' }: NumProps) {
  const id = `plan-${path.replace(/\./g, '-')}`;
  const error = errorAt(form.formState.errors, path);
  const describedBy = [error ? `${id}-err` : '', hint ? `${id}-hint` : ''].filter(Boolean).join(' ') || undefined;
  return (
    <div className="field">
      <label htmlFor={id}>{label}{unit && <span className="unit">{unit}</span>}</label>
      <input id={id} type="number" inputMode="decimal" step={step} className="figure" aria-invalid={error ? true : undefined} aria-describedby={describedBy} {...form.register(path as never, { setValueAs: toNum })} />
      {hint && <span id={`${id}-hint`} className="hint">{hint}</span>}
      {error && <span id={`${id}-err`} className="error" role="alert">{error}</span>}
    </div>
  );
}

export function PlanBuilder({ form, readOnly, currency }: { form: PlanForm; readOnly: boolean; currency: string }) {
  const kind = useWatch({ control: form.control, name: 'bank.kind' });
  const bank = useWatch({ control: form.control, name: 'bank' }) as Record<string, unknown>;
  const detuned = useWatch({ control: form.control, name: 'costs.detuned' });
  const benefits = useWatch({ control: form.control, name: 'benefits' });
  const rate = useWatch({ control: form.control, name: 'finance.discountRate' });
  const listed = kind === 'switched' && Array.isArray(bank.stepsKvar);
  const nameError = errorAt(form.formState.errors, 'name');

  const setKind = (k: 'fixed' | 'switched') => {
    const total = Number(bank.kind === 'fixed' ? bank.kvar : bank.totalKvar) || 150;
    form.setValue('bank', k === 'fixed' ? { kind: 'fixed', kvar: total } : { kind: 'switched', totalKvar: total, steps: 6, targetPf: 0.95, leadingLimitPf: 1 }, { shouldValidate: true });
  };
  const setListed = (on: boolean) => {
    const total = Number(bank.totalKvar) || 150;
    const n = Number(bank.steps) || 6;
    const b = { kind: 'switched' as const, targetPf: Number(bank.targetPf) || 0.95, leadingLimitPf: Number(bank.leadingLimitPf) || 1 };
    form.setValue('bank', on ? { ...b, stepsKvar: Array.from({ length: n }, () => Math.round((total / n) * 100) / 100) } : { ...b, totalKvar: total, steps: n }, { shouldValidate: true });
  };

  return (
    <form aria-labelledby="builder-h" onSubmit={(e) => e.preventDefault()} className="card p-3">
      <h2 id="builder-h" className="mb-2">Plan builder</h2>
      <fieldset disabled={readOnly} className="flex flex-col gap-3">
        <div className="field">
          <label htmlFor="plan-name">Plan name</label>
          <input id="plan-name" aria-invalid={nameError ? true : undefined} aria-describedby={nameError ? 'plan-name-err' : undefined} {...form.register('name')} placeholder="e.g. Main switchboard 200 kvar" />
          {nameError && <span id="plan-name-err" className="error" role="alert">{nameError}</span>}
        </div>
        <fieldset>
          <legend className="text-sm font-medium">Bank type</legend>
          <div className="flex gap-4 text-sm">
            <label className="flex items-center gap-1.5"><input type="radio" name="bank-kind" checked={kind === 'fixed'} onChange={() => setKind('fixed')} /> Fixed bank</label>
            <label className="flex items-center gap-1.5"><input type="radio" name="bank-kind" checked={kind === 'switched'} onChange={() => setKind('switched')} /> Switched bank (n steps)</label>
          </div>
        </fieldset>
        {kind === 'fixed' ? (
          <div className="grid grid-cols-2 gap-3 sm:grid-cols-3">
            <NumField form={form} path="bank.kvar" label="Bank size" unit="kvar" />
            <NumField form={form} path="bank.ratedVoltageV" label="Rated voltage (optional)" unit="V" />
            <NumField form={form} path="bank.serviceVoltageV" label="Service voltage (optional)" unit="V" />
          </div>
        ) : (
          <div className="flex flex-col gap-3">
            <div className="flex gap-4 text-sm" role="group" aria-label="Step sizes">
              <label className="flex items-center gap-1.5"><input type="radio" name="steps-mode" checked={!listed} onChange={() => setListed(false)} /> Equal steps</label>
              <label className="flex items-center gap-1.5"><input type="radio" name="steps-mode" checked={listed} onChange={() => setListed(true)} /> Listed step sizes</label>
            </div>
            <div className="grid grid-cols-2 gap-3 sm:grid-cols-3">
              {listed ? (
                <div className="field col-span-2">
                  <label htmlFor="plan-bank-stepsKvar">Step sizes in switching order<span className="unit">kvar, comma separated</span></label>
                  <input id="plan-bank-stepsKvar" className="figure text-left" {...form.register('bank.stepsKvar' as never, { setValueAs: toList })} />
                  {errorAt(form.formState.errors, 'bank.stepsKvar') && <span className="error" role="alert">{errorAt(form.formState.errors, 'bank.stepsKvar')}</span>}
                </div>
              ) : (
                <>
                  <NumField form={form} path="bank.totalKvar" label="Total size" unit="kvar" />
                  <NumField form={form} path="bank.steps" label="Number of equal steps" step="1" />
                </>
              )}
              <NumField form={form} path="bank.targetPf" label="Controller target PF" step="0.01" hint="Steps go in while PF is below it." />
              <NumField form={form} path="bank.leadingLimitPf" label="Leading limit PF" step="0.01" hint="1 = never past unity." />
              <NumField form={form} path="bank.ratedVoltageV" label="Rated voltage (optional)" unit="V" />
              <NumField form={form} path="bank.serviceVoltageV" label="Service voltage (optional)" unit="V" />
            </div>
          </div>
        )}
        <fieldset className="border-t border-rule pt-2">
          <legend className="text-sm font-medium">Costs, {currency}</legend>
          <div className="grid grid-cols-2 gap-3 sm:grid-cols-3">
            <NumField form={form} path="costs.perKvar" label="Installed cost" unit={`${currency}/kvar`} />
            <NumField form={form} path="costs.fixedInstallation" label="Fixed installation" unit={currency} />
            <NumField form={form} path="costs.omPctOfCapex" label="O&M per year" unit="% of capex" step="0.1" />
          </div>
          <label className="mt-2 flex items-center gap-1.5 text-sm">
            <input type="checkbox" checked={!!detuned} onChange={(e) => form.setValue('costs.detuned', e.target.checked ? { premiumPerKvar: 35, reactorPct: 7 } : undefined, { shouldValidate: true })} /> Detuned bank (series reactors)
          </label>
          {detuned && (
            <div className="mt-2 grid grid-cols-2 gap-3 sm:grid-cols-3">
              <NumField form={form} path="costs.detuned.premiumPerKvar" label="Reactor premium" unit={`${currency}/kvar`} />
              <NumField form={form} path="costs.detuned.reactorPct" label="Reactor" unit="%" step="0.01" hint="5.67, 7 or 14 % are usual." />
            </div>
          )}
        </fieldset>
        <fieldset className="border-t border-rule pt-2">
          <legend className="text-sm font-medium">Finance</legend>
          <div className="grid grid-cols-2 gap-3 sm:grid-cols-3">
            <NumField form={form} path="finance.discountRate" label="Discount rate" unit="fraction" step="0.005" hint={typeof rate === 'number' && Number.isFinite(rate) ? `${(rate * 100).toFixed(1)} % a year` : '0.08 means 8 % a year'} />
            <NumField form={form} path="finance.lifeYears" label="Life" unit="years" step="1" />
          </div>
        </fieldset>
        <fieldset className="border-t border-rule pt-2">
          <legend className="text-sm font-medium">Optional benefits (not tariff savings)</legend>
          <label className="flex items-center gap-1.5 text-sm">
            <input type="checkbox" checked={!!benefits} onChange={(e) => form.setValue('benefits', e.target.checked ? { countInFigures: false } : undefined, { shouldValidate: true })} /> Show optional benefit lines
          </label>
          {benefits && (
            <div className="mt-2 grid grid-cols-2 gap-3 sm:grid-cols-3">
              <NumField form={form} path="benefits.lineLossCostPerYear" label="Line-loss reduction (optional): yearly cost of losses" unit={currency} />
              <NumField form={form} path="benefits.releasedCapacityValuePerKvaYear" label="Released capacity (optional): value" unit={`${currency}/kVA-year`} />
              <label className="flex items-center gap-1.5 self-end text-sm"><input type="checkbox" {...form.register('benefits.countInFigures')} /> Count them in payback, NPV and IRR</label>
            </div>
          )}
        </fieldset>
      </fieldset>
    </form>
  );
}
