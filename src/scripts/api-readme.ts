/** `npm run docs:api`: rewrites the README's API table from the documented routes. */
import { readFileSync, writeFileSync } from 'node:fs';
import { ROUTES } from '../lib/api/openapi';
import { readmeApiTable } from '../lib/api/readme-table';
import { ROOT } from './lib/app-server';

const file = `${ROOT}README.md`;
const text = readFileSync(file, 'utf8');
const start = '<!-- api-table:start -->';
const end = '<!-- api-table:end -->';
const i = text.indexOf(start);
const j = text.indexOf(end);
if (i < 0 || j < i) throw new Error('README.md has no api-table markers');
writeFileSync(file, `${text.slice(0, i + start.length)}\n${readmeApiTable(ROUTES)}\n${text.slice(j)}`);
console.log(`README API table: ${ROUTES.length} routes`);
