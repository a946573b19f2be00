/**
 * An invented constant load for hand-checkable tests: 400 kW and 240 kvar lagging (100 kWh and
 * 60 kvarh per quarter-hour, PF 0.857), ISO 8601 UTC interval-start stamps, and its mapping.
 */
export function constantLoadCsv(fromIso: string, days: number): string {
  const t0 = Date.parse(fromIso);
  const lines = ['Start,kWh,kvarh lag,kvarh lead'];
  for (let i = 0; i < days * 96; i++) lines.push(`${new Date(t0 + i * 900_000).toISOString()},100,60,0`);
  return lines.join('\n') + '\n';
}

export const constantLoadMapping = {
  version: 1,
  delimiter: ',',
  decimalSeparator: '.',
  timestamp: { column: 'Start', format: 'iso', zone: 'offset-in-stamp', stampAt: 'start' },
  meters: [{ meterId: 'Main meter', active: { column: 'kWh', unit: 'kWh' }, reactive: { kind: 'lag-lead', lag: 'kvarh lag', lead: 'kvarh lead', unit: 'kvarh' } }],
};
