import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { ROUTES } from '../../src/lib/api/openapi';

describe('README API section', () => {
  it('has one example row for every documented route (regenerate with npm run docs:api)', () => {
    const readme = readFileSync('README.md', 'utf8');
    const missing = ROUTES.filter((r) => !readme.includes(`| \`${r.method.toUpperCase()} ${r.path}\` |`)).map((r) => `${r.method.toUpperCase()} ${r.path}`);
    expect(missing).toEqual([]);
  });
});
