/** Saved tariff versions by start date, each rule summarised in words. */
import { useState } from 'react';
import type { TariffDto } from '@/lib/db/tariffs';
import { RULE_TYPES } from '@/lib/domain/tariff/rule-registry';
import { ruleSummary } from './rule-summary';

const typeLabel = (type: string) => RULE_TYPES.find((t) => t.type === type)?.label ?? type;

type Props = { tariffs: TariffDto[]; canEdit: boolean; onEdit: (t: TariffDto) => void; onCopy: (t: TariffDto) => void; onDelete: (t: TariffDto) => void; deleting: string | null };

export function VersionList({ tariffs, canEdit, onEdit, onCopy, onDelete, deleting }: Props) {
  const [confirming, setConfirming] = useState<string | null>(null);
  if (tariffs.length === 0) {
    return <p className="card p-4 text-muted">No tariff yet: without its power-factor rules no charge can be computed.{canEdit ? ' Start from an example above and change the rates to those of the site’s tariff sheet.' : ' An Energy manager or Consultant can enter it.'}</p>;
  }
  const today = new Date().toISOString().slice(0, 10);
  const inForce = [...tariffs].reverse().find((t) => t.effectiveFrom <= today)?.id;
  return (
    <section aria-labelledby="versions-heading" className="flex flex-col gap-3">
      <h2 id="versions-heading">Versions <span className="font-normal text-muted">· by start date</span></h2>
      <ol className="flex flex-col gap-3">
        {tariffs.map((t, i) => {
          const next = tariffs[i + 1];
          const d = t.definition;
          return (
            <li key={t.id}>
              <article className="card p-4" aria-label={`${t.name}, from ${t.effectiveFrom}`}>
                <div className="flex flex-wrap items-start justify-between gap-2">
                  <div>
                    <h3 className="font-semibold">{t.name} {t.id === inForce && <span className="tag ml-1 align-middle text-active">in force today</span>}</h3>
                    <p className="text-sm text-muted">
                      From <span className="figure inline">{t.effectiveFrom}</span>{next ? <> until <span className="figure inline">{next.effectiveFrom}</span></> : ' onwards'} · {d.currency}
                      {d.demandWindowMinutes ? ` · ${d.demandWindowMinutes}-minute ${d.demandMethod ?? 'block'} demand` : ' · demand on the meter interval'}
                      {d.holidays?.length ? ` · ${d.holidays.length} holiday${d.holidays.length > 1 ? 's' : ''}` : ''}
                    </p>
                  </div>
                  {canEdit && (
                    <div className="flex flex-wrap gap-2">
                      <button type="button" className="btn btn-quiet text-sm" onClick={() => onEdit(t)} aria-label={`Edit ${t.name} from ${t.effectiveFrom}`}>Edit</button>
                      <button type="button" className="btn btn-quiet text-sm" onClick={() => onCopy(t)} aria-label={`Copy ${t.name} from ${t.effectiveFrom} as a new version`}>Copy as new</button>
                      {confirming === t.id ? (
                        <span className="flex items-center gap-2" role="group" aria-label="Confirm deletion">
                          <span className="text-sm">Delete this version?</span>
                          <button type="button" className="btn btn-danger text-sm" disabled={deleting === t.id} onClick={() => { setConfirming(null); onDelete(t); }}>Yes, delete</button>
                          <button type="button" className="btn btn-quiet text-sm" onClick={() => setConfirming(null)}>Keep it</button>
                        </span>
                      ) : (
                        <button type="button" className="btn btn-danger text-sm" onClick={() => setConfirming(t.id)} aria-label={`Delete ${t.name} from ${t.effectiveFrom}`}>Delete</button>
                      )}
                    </div>
                  )}
                </div>
                {d.rules.length === 0 ? (
                  <p className="mt-2 text-sm text-muted">No rules: this version charges nothing for PF.</p>
                ) : (
                  <ol className="mt-2 flex flex-col gap-1 text-sm">
                    {d.rules.map((r, k) => (
                      <li key={r.id} className="grid grid-cols-[1.5rem_minmax(0,1fr)]">
                        <span className="figure text-left text-muted">{k + 1}.</span>
                        <span><span className="font-medium">{r.name ?? typeLabel(r.type)}</span> <span className="text-muted">({typeLabel(r.type)})</span>: {ruleSummary(r, d.currency)}</span>
                      </li>
                    ))}
                  </ol>
                )}
              </article>
            </li>
          );
        })}
      </ol>
    </section>
  );
}
