import { describe, expect, it } from 'vitest';
import { existsSync, mkdirSync, mkdtempSync, utimesSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

describe('upload temp files left by a killed server', () => {
  it('are swept once old enough; fresh ones (another instance uploading) and other files stay', async () => {
    const dataDir = mkdtempSync(join(tmpdir(), 'varledger-sweep-'));
    process.env.DATA_DIR = dataDir;
    const { sweepTemp } = await import('../../../src/lib/files/store');
    const tmp = join(dataDir, 'tmp');
    mkdirSync(tmp, { recursive: true });
    const old = (Date.now() - 20 * 60_000) / 1000;
    for (const [name, ageOld] of [['killed.part', true], ['receiving.part', false], ['notes.txt', true]] as const) {
      writeFileSync(join(tmp, name), 'x');
      if (ageOld) utimesSync(join(tmp, name), old, old);
    }
    expect(await sweepTemp(15 * 60_000)).toBe(1);
    expect(existsSync(join(tmp, 'killed.part'))).toBe(false);
    expect(existsSync(join(tmp, 'receiving.part'))).toBe(true);
    expect(existsSync(join(tmp, 'notes.txt'))).toBe(true);
  });
});
