/** One meter's channel set from the header channels found for it, with a choice noted per decision. */
import type { ChannelSet, ReactiveMapping } from '../mapping-schema';
import type { HeaderChannel } from './channels';
import type { Confidence, ProposalNeed } from './types';

export function channelSet(
  label: string,
  list: { i: number; ch: HeaderChannel }[],
  data: string[][],
  ref: (i: number) => string | number,
  choose: (field: string, value: unknown, c: Confidence, note: string) => void,
  needs: ProposalNeed[],
  several: boolean,
): ChannelSet | null {
  const meterId = label || 'Meter 1';
  const by = (role: string) => list.find((x) => x.ch.role === role);
  const active = by('active');
  const prefix = several ? `meters[${meterId}]` : 'meters[0]';
  if (!active) {
    needs.push({ field: `${prefix}.active`, message: `No kW or kWh column found${label ? ` for meter ${label}` : ''}. Say which column holds active power or energy.`, options: [] });
    return null;
  }
  const activeUnit = (active.ch.unit?.family === 'active' ? active.ch.unit.unit : 'kWh') as ChannelSet['active']['unit'];
  choose(`${prefix}.active`, { column: ref(active.i), unit: activeUnit }, active.ch.unit ? 'high' : 'low', active.ch.unit ? `Unit ${activeUnit} from the header (${activeUnit.endsWith('h') ? 'energy per interval' : 'average demand'}).` : 'No unit in the header: kWh per interval assumed. Check it.');
  const reactiveUnit = (list.find((x) => x.ch.unit?.family === 'reactive')?.ch.unit?.unit ?? 'kvarh') as 'kvarh';
  const qs = ['q1', 'q2', 'q3', 'q4'].map(by);
  const lag = by('lag');
  const lead = by('lead');
  const net = by('net');
  const plain = by('reactive');
  let reactive: ReactiveMapping;
  let note: string;
  let confidence: Confidence = 'high';
  if (qs.every(Boolean)) {
    reactive = { kind: 'quadrants', q1: ref(qs[0]!.i), q2: ref(qs[1]!.i), q3: ref(qs[2]!.i), q4: ref(qs[3]!.i), unit: reactiveUnit };
    note = 'Four quadrant registers: lagging = Q1 + Q2, leading = Q3 + Q4.';
  } else if (lag && lead) {
    reactive = { kind: 'lag-lead', lag: ref(lag.i), lead: ref(lead.i), unit: reactiveUnit };
    note = 'Separate lagging and leading registers.';
  } else if (net || plain) {
    const col = (net ?? plain)!;
    const negatives = data.some((r) => /^\s*-/.test(r[col.i]));
    reactive = { kind: 'net', column: ref(col.i), unit: reactiveUnit };
    confidence = net || negatives ? 'high' : 'medium';
    note = net ? 'One net signed channel (positive = lagging, negative = leading).' : negatives ? 'One reactive column with negative values: read as net signed (negative = leading).' : 'One reactive column with no sign shown in the sample: read as net signed. If it is a lagging-only register, say so.';
  } else if (lag) {
    reactive = { kind: 'lagging-only', lag: ref(lag.i), unit: reactiveUnit };
    note = 'Only a lagging register; leading is taken as zero.';
  } else {
    reactive = { kind: 'none' };
    note = 'No reactive column: PF cannot be computed from this file.';
    confidence = 'medium';
  }
  choose(`${prefix}.reactive`, reactive, confidence, note);
  const set: ChannelSet = { meterId, active: { column: ref(active.i), unit: activeUnit }, reactive, multiplier: 1 };
  const apparent = by('apparent');
  if (apparent) set.apparent = { column: ref(apparent.i), unit: (apparent.ch.unit?.unit ?? 'kVA') as 'kVA' };
  const pf = by('pf');
  if (pf) set.powerFactor = { column: ref(pf.i) };
  choose(`${prefix}.multiplier`, 1, 'low', 'Values taken as primary units (multiplier 1). Enter CT ratio x PT ratio if the export is in secondary units.');
  return set;
}
