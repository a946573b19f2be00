/**
 * The form for one tariff version. Validation is the engine's own: zodResolver over
 * TariffVersionSchema in the browser, the same schema on the server, whose 400 field
 * paths are put back next to the fields.
 */
import { useEffect, useMemo, useRef, useState } from 'react';
import { FormProvider, useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useMutation } from '@tanstack/react-query';
import type { z } from 'zod';
import { api, ApiClientError } from '../api';
import { TariffVersionSchema } from '@/lib/schemas/tariff';
import { tariffSchema } from '@/lib/domain/tariff/tariff-schema';
import { EditorCtx } from './form-context';
import { SchemaField } from './schema-fields';
import { unwrap } from './schema-walk';
import { RuleList } from './RuleList';
import { labelFor } from './labels';
import { PreviewPanel } from './PreviewPanel';
import { usePreview } from './usePreview';

type Input = z.input<typeof TariffVersionSchema>;
type Output = z.output<typeof TariffVersionSchema>;

// The version schema is the engine's tariff with the start date made required.
const TARIFF_SHAPE = tariffSchema.shape as Record<string, z.ZodType>;
const START_DATE = TariffVersionSchema.shape.effectiveFrom as z.ZodType;

export type EditTarget = { id: string | null; title: string; values: Input; compareTo: string | null };

export function TariffEditor({ siteId, target, onDone, onCancel }: { siteId: string; target: EditTarget; onDone: (saved: { name: string; effectiveFrom: string }) => void; onCancel: () => void }) {
  // Start from the parsed values, so every default the engine would apply shows in its field.
  const [initial] = useState(() => {
    const parsed = TariffVersionSchema.safeParse(target.values);
    return (parsed.success ? parsed.data : target.values) as Input;
  });
  const form = useForm<Input, unknown, Output>({ resolver: zodResolver(TariffVersionSchema), defaultValues: initial, mode: 'onChange' });
  const [discarding, setDiscarding] = useState(false);
  // Read during render so react-hook-form tracks it (its form state is a subscription proxy).
  const { isDirty } = form.formState;
  const [serverError, setServerError] = useState<{ message: string; fields: Record<string, string> } | null>(null);
  const values = useWatch({ control: form.control });
  const currency = typeof values.currency === 'string' && /^[A-Z]{3}$/.test(values.currency) ? values.currency : 'USD';
  const preview = usePreview(siteId, values, target.compareTo);
  const ctx = useMemo(() => ({ currency, readOnly: false }), [currency]);
  // The editor replaces the list: move focus to its heading so keyboard and screen-reader users follow.
  const heading = useRef<HTMLHeadingElement>(null);
  useEffect(() => heading.current?.focus(), []);

  const save = useMutation({
    mutationFn: (body: Output) => api(target.id ? `/api/sites/${siteId}/tariffs/${target.id}` : `/api/sites/${siteId}/tariffs`, { method: target.id ? 'PUT' : 'POST', body }),
    onSuccess: (_d, body) => onDone({ name: body.name, effectiveFrom: body.effectiveFrom }),
    onError: (e) => {
      const fields = e instanceof ApiClientError ? e.fields : {};
      for (const [path, message] of Object.entries(fields)) form.setError(path as never, { type: 'server', message });
      setServerError({ message: e instanceof ApiClientError ? e.message : 'Could not save the version. Try again.', fields });
    },
  });

  const onInvalid = () => setServerError(null);
  const submit = form.handleSubmit((body) => {
    setServerError(null);
    save.mutate(body);
  }, onInvalid);

  return (
    <EditorCtx.Provider value={ctx}>
      <FormProvider {...form}>
        <div className="grid grid-cols-1 items-start gap-4 lg:grid-cols-[minmax(0,1fr)_26rem]">
          <form onSubmit={submit} noValidate className="flex min-w-0 flex-col gap-4" aria-labelledby="editor-heading">
            <section className="card flex flex-col gap-3 p-4">
              <h2 id="editor-heading" ref={heading} tabIndex={-1}>{target.title}</h2>
              <div className="grid grid-cols-1 gap-3 sm:grid-cols-2 lg:grid-cols-3">
                <SchemaField path="name" schema={TARIFF_SHAPE.name!} />
                <SchemaField path="effectiveFrom" schema={START_DATE} hint={unwrap(TARIFF_SHAPE.effectiveFrom!).description} />
                <SchemaField path="currency" schema={TARIFF_SHAPE.currency!} />
                <SchemaField path="demandWindowMinutes" schema={TARIFF_SHAPE.demandWindowMinutes!} />
                <SchemaField path="demandMethod" schema={TARIFF_SHAPE.demandMethod!} />
              </div>
              <SchemaField path="holidays" schema={TARIFF_SHAPE.holidays!} />
            </section>
            <RuleList />
            {serverError && (
              <div className="notice notice-error" role="alert">
                <p>The version was not saved: {serverError.message}</p>
                {Object.keys(serverError.fields).length > 1 && (
                  <ul className="mt-1 list-disc pl-5 text-sm">
                    {Object.entries(serverError.fields).map(([k, v]) => <li key={k}>{describePath(k)}: {v}</li>)}
                  </ul>
                )}
              </div>
            )}
            {form.formState.isSubmitted && !form.formState.isValid && !serverError && <p className="notice notice-error" role="alert">Some fields need fixing before the version can be saved; each is marked in red.</p>}
            <div className="flex flex-wrap gap-2 border-t border-rule pt-3">
              <button type="submit" className="btn btn-primary" disabled={save.isPending}>{save.isPending ? 'Saving…' : 'Save version'}</button>
              {discarding ? (
                <span className="flex flex-wrap items-center gap-2" role="group" aria-label="Discard the changes?">
                  <span className="text-sm">Discard the changes to this version?</span>
                  <button type="button" className="btn btn-danger text-sm" onClick={onCancel}>Discard</button>
                  <button type="button" className="btn btn-quiet text-sm" onClick={() => setDiscarding(false)}>Keep editing</button>
                </span>
              ) : (
                <button type="button" className="btn btn-quiet" onClick={() => (isDirty ? setDiscarding(true) : onCancel())}>Cancel</button>
              )}
            </div>
          </form>
          <div className="lg:sticky lg:top-4">
            <PreviewPanel q={preview.q} valid={preview.valid} waiting={preview.waiting} siteId={siteId} />
          </div>
        </div>
      </FormProvider>
    </EditorCtx.Provider>
  );
}

/** `rules.0.targetPf` -> "Rule 1, Target PF". */
function describePath(path: string): string {
  const m = /^rules\.(\d+)\.?(.*)$/.exec(path);
  if (!m) return labelFor(path);
  return m[2] ? `Rule ${Number(m[1]) + 1}, ${labelFor(path)}` : `Rule ${Number(m[1]) + 1}`;
}
