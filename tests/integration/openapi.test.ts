import { describe, expect, it } from 'vitest';
import { readdirSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { Client } from '../support/http';

/** Every endpoint file under src/pages/api, as an OpenAPI path ("[siteId]" -> "{siteId}"). */
function apiFiles(dir = 'src/pages/api'): string[] {
  return readdirSync(dir).flatMap((f) => {
    const p = join(dir, f);
    return statSync(p).isDirectory() ? apiFiles(p) : [p];
  });
}
function toPath(file: string) {
  const rel = relative('src/pages', file).replace(/\.(ts|js)$/, '').replace(/\/index$/, '');
  return `/${rel}`.replace(/\[([^\]]+)\]/g, '{$1}');
}

describe('OpenAPI document', () => {
  it('is served and lists every route file under src/pages/api (auth catch-all aside)', async () => {
    const r = await new Client().get('/api/openapi.json');
    expect(r.status).toBe(200);
    expect(r.json.openapi).toBe('3.1.0');
    const documented = Object.keys(r.json.paths);
    const files = apiFiles().map(toPath).filter((p) => !p.startsWith('/api/auth/'));
    expect(files.length).toBeGreaterThan(5);
    for (const p of files) expect(documented, `route ${p} missing from the OpenAPI document`).toContain(p);
  });

  it('describes request bodies from the zod schemas (site create has its fields and limits)', async () => {
    const doc = (await new Client().get('/api/openapi.json')).json;
    const body = doc.paths['/api/sites'].post.requestBody.content['application/json'].schema;
    const schema = body.$ref ? doc.components.schemas[body.$ref.split('/').pop()] : body;
    expect(schema.required).toEqual(expect.arrayContaining(['name', 'timeZone']));
    expect(schema.properties.transformerImpedancePct).toBeTruthy();
    expect(schema.additionalProperties).toBe(false);
  });
});
