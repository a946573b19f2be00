/** Repeatable rows: objects (tiers, PF bands, time ranges) and single values (holiday dates). */
import type { z } from 'zod';
import { get, useFieldArray, useFormContext, useFormState, useWatch } from 'react-hook-form';
import { fieldId, useEditor } from './form-context';
import { initialValue, keyOf, kindOf, unwrap } from './schema-walk';
import { nounFor, readableError } from './labels';
import { GroupError, ObjectFields } from './schema-fields';

type Schema = z.ZodType;

/** Repeatable rows of objects (tiers, PF bands, time ranges). */
export function ObjectArray({ path, label, hint, optional, element, min }: { path: string; label: string; hint?: string; optional: boolean; element: Schema; min: number }) {
  const { readOnly } = useEditor();
  const { control, setValue } = useFormContext();
  const { fields, append, remove } = useFieldArray({ control, name: path, keyName: '_key' });
  const rowSchema = unwrap(element).schema;
  const noun = nounFor(path);
  return (
    <fieldset className="col-span-full min-w-0 rounded border border-rule p-3">
      <legend className="px-1 text-[0.8125rem] font-medium">{label}{optional && <span className="font-normal text-muted"> (optional)</span>}</legend>
      {hint && <p className="mb-2 text-[0.8125rem] text-muted">{hint}</p>}
      <ol className="flex flex-col gap-2">
        {fields.map((f, i) => (
          <li key={f._key as string} className="flex flex-wrap items-end gap-3 border-b border-rule pb-2 last:border-b-0">
            <span className="figure w-6 self-center text-muted" aria-hidden="true">{i + 1}.</span>
            <div className="grid min-w-0 flex-1 grid-cols-1 gap-3 sm:grid-cols-2">
              <ObjectFields path={`${path}.${i}`} schema={rowSchema} inline />
              <RowNote path={`${path}.${i}`} />
            </div>
            {!readOnly && (
              <button
                type="button"
                className="btn btn-quiet text-sm"
                disabled={!optional && fields.length <= min}
                aria-label={`Remove ${noun} ${i + 1}`}
                onClick={() => {
                  remove(i);
                  if (optional && fields.length === 1) setValue(path, undefined, { shouldDirty: true, shouldValidate: true });
                }}
              >Remove</button>
            )}
          </li>
        ))}
      </ol>
      {fields.length === 0 && <p className="text-sm text-muted">None: {optional ? 'the rule is not limited by this.' : 'add one.'}</p>}
      <GroupError path={path} />
      {!readOnly && (
        <button type="button" className="btn btn-quiet mt-2 text-sm" onClick={() => append(initialValue(rowSchema, keyOf(path), false) as Record<string, unknown>)}>
          Add {noun}
        </button>
      )}
    </fieldset>
  );
}

/** A note under a row that says what its values mean, e.g. a time range that runs past midnight. */
function RowNote({ path }: { path: string }) {
  const row = useWatch({ name: path }) as Record<string, unknown> | undefined;
  const from = row?.from;
  const to = row?.to;
  if (typeof from !== 'string' || typeof to !== 'string' || !/^\d\d:\d\d$/.test(from) || !/^\d\d:\d\d$/.test(to)) return null;
  const text = from === to ? 'Same start and end: the whole day.' : from > to ? `Runs past midnight: ${from} to 24:00, then 00:00 to ${to}.` : null;
  return text ? <p className="col-span-full text-[0.8125rem] text-muted">{text}</p> : null;
}

/** A list of single values (holiday dates): one input per row. */
export function ValueList({ path, label, hint, element }: { path: string; label: string; hint?: string; optional: boolean; element: Schema }) {
  const { readOnly } = useEditor();
  const { setValue } = useFormContext();
  const { errors } = useFormState({ name: path });
  const list = ((useWatch({ name: path }) as string[] | undefined) ?? []).slice();
  const k = kindOf(unwrap(element).schema);
  const date = k.kind === 'string' && k.date;
  const put = (next: string[]) => setValue(path, next, { shouldDirty: true, shouldValidate: true });
  const noun = nounFor(path);
  return (
    <fieldset className="col-span-full min-w-0 rounded border border-rule p-3">
      <legend className="px-1 text-[0.8125rem] font-medium">{label}</legend>
      {hint && <p className="mb-2 text-[0.8125rem] text-muted">{hint}</p>}
      {list.length === 0 && <p className="text-sm text-muted">None listed.</p>}
      <ul className="flex flex-wrap gap-3">
        {list.map((v, i) => {
          const id = fieldId(`${path}.${i}`);
          const err = readableError((get(errors, `${path}.${i}`) as { message?: string } | undefined)?.message);
          return (
            <li key={i} className="field">
              <label htmlFor={id}>{noun.charAt(0).toUpperCase() + noun.slice(1)} {i + 1}</label>
              <span className="flex items-center gap-1">
                <input id={id} type={date ? 'date' : 'text'} value={v} readOnly={readOnly} aria-invalid={err ? true : undefined} aria-describedby={err ? `${id}-err` : undefined} onChange={(e) => put(list.map((x, j) => (j === i ? e.target.value : x)))} />
                {!readOnly && <button type="button" className="btn btn-quiet text-sm" aria-label={`Remove ${noun} ${i + 1}`} onClick={() => put(list.filter((_, j) => j !== i))}>×</button>}
              </span>
              {err && <span id={`${id}-err`} className="error" role="alert">{err}</span>}
            </li>
          );
        })}
      </ul>
      {!readOnly && <button type="button" className="btn btn-quiet mt-2 text-sm" onClick={() => put([...list, ''])}>Add {noun}</button>}
      <GroupError path={path} />
    </fieldset>
  );
}
