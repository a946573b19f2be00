/** The README's API table: one example request per documented route, generated from ROUTES. */
import type { RouteDoc } from './route-doc';

function example(r: RouteDoc): string {
  const path = r.path.replace(/\{(\w+)\}/g, (_m, p: string) => `<${p}>`);
  const auth = r.permission === 'public' ? '' : '-b jar ';
  const origin = r.method === 'get' ? '' : '-H "Origin: $B" ';
  if (r.multipart) {
    const fields = Object.keys(r.multipart.shape).map((k) => (k === 'file' ? `-F file=@export.csv` : k === 'mapping' ? `-F mapping=@mapping.json` : `-F ${k}=…`));
    return `curl ${auth}${origin}${fields.join(' ')} $B${path}`;
  }
  const q = r.query ? `?${Object.keys(r.query.shape).slice(0, 2).map((k) => `${k}=…`).join('&')}` : '';
  if (r.method === 'get') return `curl ${auth}"$B${path}${q}"`;
  const body = r.body ? `-H 'content-type: application/json' -d @body.json ` : '';
  const x = r.method === 'post' ? '' : `-X ${r.method.toUpperCase()} `;
  return `curl ${auth}${x}${origin}${body}$B${path}`;
}

export function readmeApiTable(routes: RouteDoc[]): string {
  const rows = routes.map((r) => `| \`${r.method.toUpperCase()} ${r.path}\` | ${r.summary.replace(/\|/g, '\\|')} | ${r.permission} | \`${example(r)}\` |`);
  return ['| route | what it does | permission | example |', '| --- | --- | --- | --- |', ...rows].join('\n');
}
