import type { Period } from '../../../../src/lib/domain';

/** A stand-in period for rule tests that only need a label. */
export const TEST_PERIOD: Period = {
  id: '2025-03',
  label: 'March 2025',
  kind: 'month',
  zone: 'UTC',
  startMs: Date.UTC(2025, 2, 1),
  endMs: Date.UTC(2025, 3, 1),
  hours: 744,
};
