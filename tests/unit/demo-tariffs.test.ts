import { describe, expect, it } from 'vitest';
import { EXAMPLE_TARIFFS, DEMO_SITE_TARIFF } from '../../src/lib/demo/tariffs';
import { TariffVersionSchema } from '../../src/lib/schemas/tariff';
import { DEMO_WORKSPACES } from '../../src/lib/demo/scenario';

describe('invented example tariffs', () => {
  it.each(EXAMPLE_TARIFFS.map((t) => [t.key, t] as const))('%s parses with the engine schema', (_k, t) => {
    const parsed = TariffVersionSchema.safeParse(t.tariff);
    expect(parsed.success, JSON.stringify(parsed.error?.issues)).toBe(true);
  });
  it('every demo site has an example tariff in its own currency', () => {
    for (const ws of DEMO_WORKSPACES)
      for (const s of ws.sites) {
        const t = EXAMPLE_TARIFFS.find((e) => e.key === DEMO_SITE_TARIFF[s.name]);
        expect(t, s.name).toBeTruthy();
        expect(t!.tariff.currency).toBe(s.currency);
      }
  });
});
