/** The ordered rules of a tariff version: add from the six types, move, duplicate, remove. */
import { useState } from 'react';
import { useFieldArray, useFormContext, useWatch } from 'react-hook-form';
import { RULE_TYPES, tariffRuleSchema, type TariffRuleType } from '@/lib/domain/tariff/rule-registry';
import { useEditor } from './form-context';
import { initialValue, unionOption } from './schema-walk';
import { ObjectFields } from './schema-fields';

const schemaOf = (type: string) => unionOption(tariffRuleSchema, type);
const typeLabel = (type: string) => RULE_TYPES.find((t) => t.type === type)?.label ?? type;

function uniqueId(base: string, taken: string[]): string {
  if (!taken.includes(base)) return base;
  let n = 2;
  while (taken.includes(`${base}-${n}`)) n++;
  return `${base}-${n}`;
}

export function RuleList() {
  const { readOnly } = useEditor();
  const { control, getValues } = useFormContext();
  const { fields, append, remove, move, insert } = useFieldArray({ control, name: 'rules', keyName: '_key' });
  const [picking, setPicking] = useState(false);
  const ids = () => ((getValues('rules') as { id: string }[] | undefined) ?? []).map((r) => r.id);

  function add(type: TariffRuleType) {
    const start = initialValue(schemaOf(type)!) as Record<string, unknown>;
    append({ ...start, type, id: uniqueId(type, ids()) });
    setPicking(false);
  }
  function duplicate(i: number) {
    const copy = structuredClone(getValues(`rules.${i}`)) as Record<string, unknown>;
    insert(i + 1, { ...copy, id: uniqueId(`${copy.id}-copy`, ids()), name: copy.name ? `${copy.name} (copy)` : undefined });
  }

  return (
    <section aria-labelledby="rules-heading" className="flex flex-col gap-3">
      <div className="flex items-baseline justify-between gap-2">
        <h3 id="rules-heading" tabIndex={-1} className="font-semibold">Rules <span className="font-normal text-muted">· evaluated in this order</span></h3>
      </div>
      {fields.length === 0 && <p className="notice">No rules yet: add the tariff’s power-factor clauses below.</p>}
      <ol className="flex flex-col gap-3">
        {fields.map((f, i) => (
          <li key={f._key as string}>
            <RuleCard index={i} count={fields.length} onUp={() => move(i, i - 1)} onDown={() => move(i, i + 1)} onDuplicate={() => duplicate(i)} onRemove={() => {
                remove(i);
                // The removed card held the focus: hand it to the list's heading.
                document.getElementById('rules-heading')?.focus();
              }} />
          </li>
        ))}
      </ol>
      {!readOnly && (
        <div>
          <button type="button" className="btn btn-quiet" aria-expanded={picking} aria-controls="rule-picker" onClick={() => setPicking(!picking)}>
            {picking ? 'Close the rule types' : 'Add a rule'}
          </button>
          {picking && (
            <div id="rule-picker" role="group" aria-label="Rule types" className="mt-2 grid grid-cols-1 gap-2 sm:grid-cols-2">
              {RULE_TYPES.map((t) => (
                <button key={t.type} type="button" className="card flex flex-col items-start gap-1 p-3 text-left hover:border-ink" onClick={() => add(t.type)}>
                  <span className="font-medium">{t.label}</span>
                  <span className="text-[0.8125rem] text-muted">{t.summary}</span>
                </button>
              ))}
            </div>
          )}
        </div>
      )}
    </section>
  );
}

function RuleCard({ index, count, onUp, onDown, onDuplicate, onRemove }: { index: number; count: number; onUp: () => void; onDown: () => void; onDuplicate: () => void; onRemove: () => void }) {
  const { readOnly } = useEditor();
  const path = `rules.${index}`;
  const type = useWatch({ name: `${path}.type` }) as string;
  const name = useWatch({ name: `${path}.name` }) as string | undefined;
  const schema = schemaOf(type);
  const n = index + 1;
  const title = `Rule ${n}: ${name || typeLabel(type)}`;
  return (
    <article className="card p-4" aria-label={title}>
      <header className="mb-3 flex flex-wrap items-start justify-between gap-2 border-b border-rule pb-2">
        <div>
          <h4 className="font-medium"><span className="figure inline text-muted">{n}.</span> {name || typeLabel(type)}</h4>
          <p className="text-[0.8125rem] text-muted">{typeLabel(type)}</p>
        </div>
        {!readOnly && (
          <div className="flex flex-wrap gap-1">
            <button type="button" className="btn btn-quiet text-sm" disabled={index === 0} onClick={onUp} aria-label={`Move rule ${n} up`}>↑ Up</button>
            <button type="button" className="btn btn-quiet text-sm" disabled={index === count - 1} onClick={onDown} aria-label={`Move rule ${n} down`}>↓ Down</button>
            <button type="button" className="btn btn-quiet text-sm" onClick={onDuplicate} aria-label={`Duplicate rule ${n}`}>Duplicate</button>
            <button type="button" className="btn btn-danger text-sm" onClick={onRemove} aria-label={`Remove rule ${n}`}>Remove</button>
          </div>
        )}
      </header>
      {schema ? <ObjectFields path={path} schema={schema} skip={['type']} last={['window']} /> : <p className="notice notice-error">Unknown rule type “{type}”: remove this rule.</p>}
    </article>
  );
}
