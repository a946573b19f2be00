import type { MeterMappingInput } from '@/lib/import/mapping-schema';
import { ACTIVE_UNITS, REACTIVE_UNITS } from '@/lib/import/mapping-schema';

export type Column = { index: number; header: string; samples: string[] };
type Mapping = MeterMappingInput;
type ChannelSet = Mapping['meters'][number];
type Reactive = ChannelSet['reactive'];

const sel = 'rounded border border-rule bg-surface px-2 py-1';

function ColumnSelect({ id, label, value, columns, hasHeader, onChange, optional }: { id: string; label: string; value: string | number | undefined; columns: Column[]; hasHeader: boolean; onChange: (v: string | number | undefined) => void; optional?: boolean }) {
  const key = (c: Column) => (hasHeader ? c.header : c.index);
  return (
    <div className="field">
      <label htmlFor={id}>{label}</label>
      <select id={id} className={sel} value={value === undefined ? '' : String(value)} onChange={(e) => {
        const c = columns.find((x) => String(key(x)) === e.target.value);
        onChange(c ? key(c) : undefined);
      }}>
        <option value="">{optional ? '(none)' : 'Choose a column…'}</option>
        {columns.map((c) => <option key={c.index} value={String(key(c))}>{c.index}. {c.header || `column ${c.index}`}{c.samples[0] ? ` (e.g. ${c.samples[0]})` : ''}</option>)}
      </select>
    </div>
  );
}

function reactiveOf(kind: Reactive['kind'], prev: Reactive): Reactive {
  const unit = 'unit' in prev ? prev.unit : 'kvarh';
  switch (kind) {
    case 'none': return { kind: 'none' };
    case 'net': return { kind: 'net', column: '', unit };
    case 'lagging-only': return { kind: 'lagging-only', lag: '', unit };
    case 'lag-lead': return { kind: 'lag-lead', lag: '', lead: '', unit };
    case 'quadrants': return { kind: 'quadrants', q1: '', q2: '', q3: '', q4: '', unit };
  }
}

/** The confirmed mapping, edited field by field; the server validates it with the same schema. */
export function MappingForm({ mapping, columns, siteZone, onChange }: { mapping: Mapping; columns: Column[]; siteZone: string; onChange: (m: Mapping) => void }) {
  const set = (patch: Partial<Mapping>) => onChange({ ...mapping, ...patch });
  const ts = mapping.timestamp;
  const setTs = (patch: Partial<Mapping['timestamp']>) => set({ timestamp: { ...ts, ...patch } });
  const hasHeader = mapping.hasHeader ?? true;
  const setMeter = (i: number, patch: Partial<ChannelSet>) => set({ meters: mapping.meters.map((m, k) => (k === i ? { ...m, ...patch } : m)) });

  return (
    <div className="flex flex-col gap-4">
      <fieldset className="grid grid-cols-2 gap-3 md:grid-cols-5">
        <legend className="mb-1 text-sm font-medium">File layout</legend>
        <div className="field"><label htmlFor="m-delim">Delimiter</label>
          <select id="m-delim" className={sel} value={mapping.delimiter} onChange={(e) => set({ delimiter: e.target.value as Mapping['delimiter'] })}>
            <option value=",">Comma ,</option><option value=";">Semicolon ;</option><option value={'\t'}>Tab</option><option value="|">Bar |</option>
          </select></div>
        <div className="field"><label htmlFor="m-dec">Decimal separator</label>
          <select id="m-dec" className={sel} value={mapping.decimalSeparator} onChange={(e) => set({ decimalSeparator: e.target.value as Mapping['decimalSeparator'] })}>
            <option value=".">Point 12.5</option><option value=",">Comma 12,5</option>
          </select></div>
        <div className="field"><label htmlFor="m-skip">Lines above the header</label>
          <input id="m-skip" type="number" min={0} value={mapping.skipRows ?? 0} onChange={(e) => set({ skipRows: Number(e.target.value) })} /></div>
        <div className="field"><label htmlFor="m-after">Lines after the header</label>
          <input id="m-after" type="number" min={0} value={mapping.skipRowsAfterHeader ?? 0} onChange={(e) => set({ skipRowsAfterHeader: Number(e.target.value) })} /></div>
        <div className="field"><label htmlFor="m-hdr">Header row</label>
          <select id="m-hdr" className={sel} value={hasHeader ? 'yes' : 'no'} onChange={(e) => set({ hasHeader: e.target.value === 'yes' })}><option value="yes">Yes</option><option value="no">No (columns by position)</option></select></div>
      </fieldset>

      <fieldset className="grid grid-cols-2 gap-3 md:grid-cols-4">
        <legend className="mb-1 text-sm font-medium">Timestamps</legend>
        <ColumnSelect id="m-ts" label="Date and time column" value={ts.column} columns={columns} hasHeader={hasHeader} onChange={(v) => setTs({ column: v ?? '' })} />
        <ColumnSelect id="m-time" label="Separate time column" optional value={ts.timeColumn} columns={columns} hasHeader={hasHeader} onChange={(v) => setTs({ timeColumn: v })} />
        <div className="field"><label htmlFor="m-fmt">Format</label>
          <select id="m-fmt" className={sel} value={ts.format} onChange={(e) => setTs({ format: e.target.value as Mapping['timestamp']['format'] })}>
            <option value="iso">ISO 8601 (2026-03-14 09:45)</option><option value="date-time">Date and time (14/03/2026 09:45)</option><option value="excel-serial">Spreadsheet serial number</option>
          </select></div>
        <div className="field"><label htmlFor="m-order">Date order</label>
          <select id="m-order" className={sel} value={ts.dateOrder ?? ''} aria-invalid={ts.format === 'date-time' && !ts.dateOrder ? true : undefined} onChange={(e) => setTs({ dateOrder: (e.target.value || undefined) as Mapping['timestamp']['dateOrder'] })}>
            <option value="">Not stated</option><option value="dmy">Day first (14/03/2026)</option><option value="mdy">Month first (03/14/2026)</option><option value="ymd">Year first (2026/03/14)</option>
          </select>
          {ts.format === 'date-time' && !ts.dateOrder && <span className="error">State the date order: it is never guessed.</span>}</div>
        <div className="field"><label htmlFor="m-zone">Time basis</label>
          <select id="m-zone" className={sel} value={ts.zone} onChange={(e) => setTs({ zone: e.target.value as Mapping['timestamp']['zone'], timeZone: e.target.value.startsWith('local') ? (ts.timeZone ?? siteZone) : ts.timeZone })}>
            <option value="offset-in-stamp">Offset in each stamp (Z, +01:00)</option><option value="utc">UTC</option><option value="local">Local time, clocks change</option><option value="local-standard">Local standard time all year</option>
          </select></div>
        {ts.zone.startsWith('local') && (
          <div className="field"><label htmlFor="m-tz">Time zone</label><input id="m-tz" value={ts.timeZone ?? ''} placeholder={siteZone} onChange={(e) => setTs({ timeZone: e.target.value })} /></div>
        )}
        <div className="field"><label htmlFor="m-at">A stamp marks</label>
          <select id="m-at" className={sel} value={ts.stampAt} onChange={(e) => setTs({ stampAt: e.target.value as 'start' | 'end' })}><option value="start">the start of its interval</option><option value="end">the end of its interval</option></select></div>
        <div className="field"><label htmlFor="m-int">Interval length</label>
          <select id="m-int" className={sel} value={mapping.intervalMinutes ?? ''} onChange={(e) => set({ intervalMinutes: e.target.value ? Number(e.target.value) : undefined })}>
            <option value="">Detect from the stamps</option>{[1, 5, 10, 15, 30, 60].map((m) => <option key={m} value={m}>{m} minutes</option>)}
          </select></div>
      </fieldset>

      <ColumnSelect id="m-meterid" label="Meter-id column (several meters stacked in rows)" optional value={mapping.meterIdColumn} columns={columns} hasHeader={hasHeader} onChange={(v) => set({ meterIdColumn: v })} />

      {mapping.meters.map((m, i) => (
        <fieldset key={i} className="grid grid-cols-2 gap-3 rounded border border-rule p-3 md:grid-cols-4">
          <legend className="px-1 text-sm font-medium">Meter {i + 1}</legend>
          <div className="field"><label htmlFor={`m${i}-name`}>Meter name</label><input id={`m${i}-name`} value={m.meterId} onChange={(e) => setMeter(i, { meterId: e.target.value })} /></div>
          <ColumnSelect id={`m${i}-act`} label="Active column" value={m.active.column} columns={columns} hasHeader={hasHeader} onChange={(v) => setMeter(i, { active: { ...m.active, column: v ?? '' } })} />
          <div className="field"><label htmlFor={`m${i}-au`}>Active unit</label>
            <select id={`m${i}-au`} className={sel} value={m.active.unit} onChange={(e) => setMeter(i, { active: { ...m.active, unit: e.target.value as ChannelSet['active']['unit'] } })}>
              {ACTIVE_UNITS.map((u) => <option key={u} value={u}>{u}{u.endsWith('h') ? ' per interval' : ' average demand'}</option>)}
            </select></div>
          <div className="field"><label htmlFor={`m${i}-mult`}>Meter multiplier</label><input id={`m${i}-mult`} type="number" min={0} step="any" value={m.multiplier ?? 1} onChange={(e) => setMeter(i, { multiplier: Number(e.target.value) })} /><span className="hint">CT ratio × PT ratio; 1 if the file is in primary units.</span></div>
          <div className="field"><label htmlFor={`m${i}-rk`}>Reactive channels</label>
            <select id={`m${i}-rk`} className={sel} value={m.reactive.kind} onChange={(e) => setMeter(i, { reactive: reactiveOf(e.target.value as Reactive['kind'], m.reactive) })}>
              <option value="lag-lead">Lagging and leading columns</option><option value="lagging-only">Lagging only</option><option value="net">One signed net column</option><option value="quadrants">Four quadrant columns</option><option value="none">None</option>
            </select></div>
          {m.reactive.kind !== 'none' && (
            <div className="field"><label htmlFor={`m${i}-ru`}>Reactive unit</label>
              <select id={`m${i}-ru`} className={sel} value={m.reactive.unit} onChange={(e) => setMeter(i, { reactive: { ...m.reactive, unit: e.target.value } as Reactive })}>
                {REACTIVE_UNITS.map((u) => <option key={u} value={u}>{u}</option>)}
              </select></div>
          )}
          {(['column', 'lag', 'lead', 'q1', 'q2', 'q3', 'q4'] as const).filter((k) => k in m.reactive).map((k) => (
            <ColumnSelect key={k} id={`m${i}-r-${k}`} label={{ column: 'Net kvarh column', lag: 'Lagging column', lead: 'Leading column', q1: 'Quadrant 1', q2: 'Quadrant 2', q3: 'Quadrant 3', q4: 'Quadrant 4' }[k]} value={(m.reactive as Record<string, string | number>)[k]} columns={columns} hasHeader={hasHeader} onChange={(v) => setMeter(i, { reactive: { ...m.reactive, [k]: v ?? '' } as Reactive })} />
          ))}
        </fieldset>
      ))}
    </div>
  );
}
