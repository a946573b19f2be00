import { describe, it, expect } from 'vitest';
import { DateTime } from 'luxon';
describe('toolchain', () => {
  it('luxon knows DST: 2026-03-08 in New York has 23 hours (common practice)', () => {
    const d = DateTime.fromISO('2026-03-08', { zone: 'America/New_York' });
    expect(d.endOf('day').diff(d.startOf('day'), 'hours').hours).toBeCloseTo(23, 3);
  });
});
