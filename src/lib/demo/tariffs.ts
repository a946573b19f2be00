/**
 * Invented example tariffs: the demo sites' tariffs and the starting points offered in the
 * tariff editor. Our own names, rates and clause wording; no real utility's tariff.
 */
import type { TariffInput } from '../domain/tariff/tariff-schema';

export type ExampleTariff = { key: string; title: string; summary: string; tariff: TariffInput & { effectiveFrom: string } };

export const EXAMPLE_TARIFFS: ExampleTariff[] = [
  {
    key: 'ratio-billing-demand',
    title: 'Billing demand raised by target PF / actual PF',
    summary: 'A US-style large power service: billing demand × 0.90 / average PF when PF is under 0.90, with an 80 % ratchet.',
    tariff: {
      name: 'Large Power Service, PF rider (example)',
      currency: 'USD',
      effectiveFrom: '2025-01-01',
      demandWindowMinutes: 15,
      rules: [
        { type: 'pf-billing-demand', id: 'pf-adjusted-demand', name: 'PF adjustment of billing demand', targetPf: 0.9, pfBasis: 'average', kvarhBasis: 'lagging', formula: 'ratio', demandRatePerKw: 14.2, ratchet: { fraction: 0.8, lookbackPeriods: 11 } },
        { type: 'leading-kvarh', id: 'leading-idle', name: 'Leading kvarh while idle', ratePerKvarh: 0.02, condition: 'zero-kw-only' },
      ],
    },
  },
  {
    key: 'kvarh-allowance',
    title: 'Reactive energy above an allowance, plus kVA capacity',
    summary: 'Reactive energy above 0.33 kvarh per kWh priced per kvarh, and a capacity charge on peak kVA.',
    tariff: {
      name: 'High Voltage Supply, reactive terms (example)',
      currency: 'GBP',
      effectiveFrom: '2025-01-01',
      demandWindowMinutes: 30,
      rules: [
        { type: 'excess-kvarh', id: 'excess-kvarh', name: 'Excess reactive energy', allowance: { basis: 'ratio', kvarPerKw: 0.33 }, kvarhBasis: 'lagging', pricing: { kind: 'flat', ratePerKvarh: 0.0245 } },
        { type: 'kva-billing-demand', id: 'kva-capacity', name: 'Capacity charge on peak kVA', mode: 'peak-kva', reference: 'unity', demandRate: 2.1 },
      ],
    },
  },
  {
    key: 'kva-demand',
    title: 'Demand billed in kVA',
    summary: 'Monthly demand charge on peak kVA; the PF cost is the bill at actual kVA minus the bill at 0.90 PF. Leading kvarh charged at night.',
    tariff: {
      name: 'Business Demand, kVA (example)',
      currency: 'AUD',
      effectiveFrom: '2025-01-01',
      demandWindowMinutes: 15,
      rules: [
        { type: 'kva-billing-demand', id: 'kva-demand', name: 'kVA demand charge above 0.90 PF', mode: 'peak-kva', reference: 'target-pf', targetPf: 0.9, demandRate: 11.5 },
        { type: 'leading-kvarh', id: 'leading-night', name: 'Leading kvarh at night', ratePerKvarh: 0.015, condition: 'any-load', window: { name: 'Night', timeRanges: [{ from: '22:00', to: '06:00' }] } },
      ],
    },
  },
  {
    key: 'percent-surcharge',
    title: 'Percentage surcharge in tiers, with a credit',
    summary: '0.5 % of the demand charge per 0.01 below 0.95 down to 0.90, then 1 % per 0.01; a 0.25 % credit per 0.01 above 0.97, up to 1 %.',
    tariff: {
      name: 'General Service, PF adjustment (example)',
      currency: 'USD',
      effectiveFrom: '2025-01-01',
      demandWindowMinutes: 15,
      rules: [
        {
          type: 'pf-percent-adjustment',
          id: 'pf-surcharge',
          name: 'PF surcharge and credit',
          base: { source: 'demand-rate', ratePerKw: 12.75 },
          thresholdPf: 0.95,
          stepPf: 0.01,
          stepRounding: 'up',
          tiers: [
            { downToPf: 0.9, pctPerStep: 0.5 },
            { pctPerStep: 1 },
          ],
          credit: { abovePf: 0.97, pctPerStep: 0.25, maxPct: 1, stepRounding: 'down' },
        },
      ],
    },
  },
  {
    key: 'excess-kvar-demand',
    title: 'Excess kvar demand above one third of kW',
    summary: 'Charge per kvar of the peak-kW interval above kW / 3, with a ratchet on the billable kvar.',
    tariff: {
      name: 'Industrial Demand, reactive demand charge (example)',
      currency: 'USD',
      effectiveFrom: '2025-01-01',
      demandWindowMinutes: 15,
      rules: [{ type: 'excess-kvar-demand', id: 'excess-kvar', name: 'Excess kvar demand', allowance: { basis: 'ratio', kvarPerKw: 1 / 3 }, kvarSource: 'coincident', ratePerKvar: 0.4 }],
    },
  },
];

/** Which example each demo site uses. */
export const DEMO_SITE_TARIFF: Record<string, string> = {
  'Brackwater Kiln Works': 'ratio-billing-demand',
  'Tarn Valley Glaze Plant': 'kvarh-allowance',
  'Kestrel Bay Packaging': 'kva-demand',
  'Harrow Creamery': 'percent-surcharge',
  'Harrow Butter Works': 'excess-kvar-demand',
};
