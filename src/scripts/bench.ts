/**
 * `npm run bench`: speed and memory figures, printed (never asserted in tests).
 * Each bench is a script of its own under src/scripts/; this runs them in turn.
 */
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { ROOT } from './lib/app-server';

const BENCHES = ['src/scripts/bench-engine.ts', 'src/scripts/bench-import.ts', 'src/scripts/bench-import-http.ts', 'src/scripts/bench-load.ts', 'src/scripts/bench-bundle.ts'];
let failed = 0;
for (const b of BENCHES) {
  if (!existsSync(`${ROOT}${b}`)) {
    console.log(`(skipped ${b}: not present)`);
    continue;
  }
  console.log(`\n== ${b}`);
  const r = spawnSync('npx', ['tsx', b], { cwd: ROOT, stdio: 'inherit' });
  if (r.status !== 0) failed++;
}
process.exit(failed ? 1 : 0);
