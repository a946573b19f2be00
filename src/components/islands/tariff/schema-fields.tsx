/**
 * The generic part of the editor: renders any part of a tariff from its zod schema.
 * Objects become fieldsets, discriminated unions a choice plus the chosen option's fields,
 * optional groups a tick box, arrays repeatable rows; leaves are labelled inputs.
 */
import type { z } from 'zod';
import { get, useFormContext, useFormState, useWatch } from 'react-hook-form';
import { fieldId, useEditor } from './form-context';
import { initialValue, keyOf, kindOf, unionOption, unwrap } from './schema-walk';
import { labelFor, optionLabel as optionLabelFor, readableError, RELEVANT, unitFor } from './labels';
import { IntSetField, NumberField, SelectField, TextField } from './leaf-fields';
import { ObjectArray, ValueList } from './list-fields';

type Schema = z.ZodType;

/** Error message set on a container (an array's own rule, a union, a server message). */
function useGroupError(path: string): string | undefined {
  const { errors } = useFormState({ name: path });
  const e = get(errors, path) as { message?: string; root?: { message?: string } } | undefined;
  return readableError(e?.message ?? e?.root?.message);
}

export function GroupError({ path }: { path: string }) {
  const error = useGroupError(path);
  return error ? <p id={`${fieldId(path)}-err`} className="text-[0.8125rem] text-cost" role="alert">{error}</p> : null;
}

const isGroup = (s: Schema) => {
  const k = kindOf(unwrap(s).schema);
  return k.kind === 'object' || k.kind === 'union' || (k.kind === 'array' && !k.intSet);
};

/** One field of any kind, by its path in the form and its schema. */
export function SchemaField({ path, schema, label, hint }: { path: string; schema: Schema; label?: string; hint?: string }) {
  const { currency } = useEditor();
  const u = unwrap(schema);
  const k = kindOf(u.schema);
  const text = label ?? labelFor(path);
  const common = { path, label: text, hint: u.description ?? hint, optional: u.optional };
  switch (k.kind) {
    case 'literal':
    case 'other':
      return null;
    case 'number':
      return <NumberField {...common} unit={unitFor(path, currency)} int={k.int} />;
    case 'string':
      return <TextField {...common} date={k.date} time={k.time} maxLength={k.maxLength} upper={k.upper} />;
    case 'enum':
      return <SelectField {...common} options={k.options} />;
    case 'array':
      if (k.intSet) return <IntSetField {...common} from={k.intSet.from} to={k.intSet.to} />;
      return kindOf(unwrap(k.element).schema).kind === 'object' ? <ObjectArray {...common} element={k.element} min={k.min} /> : <ValueList {...common} element={k.element} />;
    case 'object':
    case 'union':
      return u.optional ? <OptionalGroup {...common} schema={u.schema} /> : <Group {...common} schema={u.schema} />;
  }
}

/** A fieldset around an object or union. */
function Group({ path, label, hint, schema }: { path: string; label: string; hint?: string; schema: Schema }) {
  return (
    <fieldset className="col-span-full min-w-0 rounded border border-rule p-3">
      <legend className="px-1 text-[0.8125rem] font-medium">{label}</legend>
      {hint && <p className="mb-2 text-[0.8125rem] text-muted">{hint}</p>}
      <GroupBody path={path} schema={schema} />
    </fieldset>
  );
}

function GroupBody({ path, schema }: { path: string; schema: Schema }) {
  const k = kindOf(schema);
  if (k.kind === 'union') return <UnionFields path={path} schema={schema} />;
  return <ObjectFields path={path} schema={schema} />;
}

/** An optional object (ratchet, credit, rounding, window): a tick box adds or removes it. */
function OptionalGroup({ path, label, hint, schema }: { path: string; label: string; hint?: string; schema: Schema }) {
  const { readOnly } = useEditor();
  const { setValue } = useFormContext();
  const value = useWatch({ name: path });
  const present = value !== undefined && value !== null;
  const id = `${fieldId(path)}-on`;
  return (
    <div className={`col-span-full min-w-0 rounded border p-3 ${present ? 'border-rule' : 'border-dashed border-rule'}`}>
      <div className="flex items-start gap-2">
        <input
          id={id}
          type="checkbox"
          className="mt-1"
          checked={present}
          disabled={readOnly}
          aria-describedby={hint ? `${id}-hint` : undefined}
          onChange={(e) => setValue(path, e.target.checked ? initialValue(schema, keyOf(path), true) : undefined, { shouldDirty: true, shouldValidate: true })}
        />
        <div>
          <label htmlFor={id} className="text-[0.8125rem] font-medium">{label}</label>
          {hint && <p id={`${id}-hint`} className="text-[0.8125rem] text-muted">{hint}</p>}
        </div>
      </div>
      {present && (
        <div className="mt-3" role="group" aria-label={label}>
          <GroupBody path={path} schema={schema} />
        </div>
      )}
    </div>
  );
}

/** A discriminated union: the choice of option, then that option's own fields. */
function UnionFields({ path, schema }: { path: string; schema: Schema }) {
  const k = kindOf(schema);
  const { setValue } = useFormContext();
  const { readOnly } = useEditor();
  const current = useWatch({ name: path }) as Record<string, unknown> | undefined;
  if (k.kind !== 'union') return null;
  const choicePath = `${path}.${k.discriminator}`;
  const chosen = String(current?.[k.discriminator] ?? k.options[0]!.value);
  const option = unionOption(schema, chosen) ?? k.options[0]!.schema;
  const labels = k.options.map((o) => o.value);
  return (
    <div className="grid grid-cols-1 gap-3 sm:grid-cols-2">
      <div className="field min-w-0">
        <label htmlFor={fieldId(choicePath)}>{labelFor(choicePath)}</label>
        <select
          id={fieldId(choicePath)}
          value={chosen}
          disabled={readOnly}
          onChange={(e) => setValue(path, initialValue(unionOption(schema, e.target.value)!), { shouldDirty: true, shouldValidate: true })}
        >
          {labels.map((v) => <option key={v} value={v}>{optionLabelFor(choicePath, v)}</option>)}
        </select>
      </div>
      <ObjectFields path={path} schema={option} skip={[k.discriminator]} inline />
      <GroupError path={path} />
    </div>
  );
}

/**
 * The fields of an object: single values in a grid, groups full width. `order` puts named
 * keys first; `last` moves keys to the end; fields that do not apply to the current choices are hidden.
 */
export function ObjectFields({ path, schema, skip = [], inline = false, last = [] }: { path: string; schema: Schema; skip?: string[]; inline?: boolean; last?: string[] }) {
  const value = (useWatch({ name: path }) ?? {}) as Record<string, unknown>;
  const k = kindOf(schema);
  if (k.kind !== 'object') return null;
  const entries = Object.entries(k.shape).filter(([key]) => !skip.includes(key) && (RELEVANT[key]?.(value) ?? true));
  const ordered = [...entries.filter(([key]) => !last.includes(key)), ...entries.filter(([key]) => last.includes(key))];
  const leaves = ordered.filter(([, s]) => !isGroup(s));
  const groups = ordered.filter(([, s]) => isGroup(s));
  const at = (key: string) => (path ? `${path}.${key}` : key);
  const grid = leaves.map(([key, s]) => <SchemaField key={key} path={at(key)} schema={s} />);
  if (inline) return <>{grid}{groups.map(([key, s]) => <SchemaField key={key} path={at(key)} schema={s} />)}</>;
  return (
    <div className="flex flex-col gap-3">
      {grid.length > 0 && <div className="grid grid-cols-1 gap-3 sm:grid-cols-2">{grid}</div>}
      {groups.map(([key, s]) => <SchemaField key={key} path={at(key)} schema={s} />)}
    </div>
  );
}
