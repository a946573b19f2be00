/**
 * `npm test`: builds the app (the integration and browser tests run the built server),
 * runs every Vitest project, and prints a plain `N passed, N failed` line at the end.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, rmSync } from 'node:fs';
import { ROOT } from './lib/app-server';

const REPORT = `${ROOT}data/test-report.json`;
const extra = process.argv.slice(2);

const build = spawnSync('npx', ['astro', 'build'], { cwd: ROOT, stdio: ['ignore', 'pipe', 'inherit'], encoding: 'utf8' });
if (build.status !== 0) {
  console.error(build.stdout);
  console.error('The build failed, so no test ran.');
  console.log('0 passed, 1 failed');
  process.exit(1);
}

mkdirSync(`${ROOT}data`, { recursive: true });
rmSync(REPORT, { force: true });
const run = spawnSync('npx', ['vitest', 'run', '--config', 'tests/vitest.config.ts', '--reporter=default', '--reporter=json', `--outputFile.json=${REPORT}`, ...extra], { cwd: ROOT, stdio: 'inherit' });

let passed = 0;
let failed = 0;
if (existsSync(REPORT)) {
  const r = JSON.parse(readFileSync(REPORT, 'utf8')) as { numPassedTests: number; numFailedTests: number; testResults: { status: string; assertionResults: unknown[] }[] };
  passed = r.numPassedTests;
  failed = r.numFailedTests;
  // A file that failed to load has no tests in it: count it as one failure.
  failed += r.testResults.filter((t) => t.status === 'failed' && t.assertionResults.length === 0).length;
} else failed = 1;
if (run.status !== 0 && failed === 0) failed = 1;
console.log(`${passed} passed, ${failed} failed`);
process.exit(failed === 0 && run.status === 0 ? 0 : 1);
