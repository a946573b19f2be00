import { describe, expect, it } from 'vitest';
import { CAPACITOR_LIMITS, capacitorDuty, CAUTIONS, detunedTuningOrder, screenResonance, screenResonanceSteps, voltageRise } from '../../../../src/lib/domain';

describe('parallel resonance order h = sqrt(kVA_sc / kvar)', () => {
  it.each<[number, number, number, number, number, number | null, string]>([
    // kVA, Z %, kvar, h, decimals given, near harmonic, source
    [1000, 5.3, 100, 13.7, 1, 13, 'hand-computed from h = sqrt(kVA_sc / kvar), common practice (1000 kVA, 5.3 %, 100 kvar -> 13.7)'],
    [1500, 5.75, 600, 6.59, 2, 7, 'hand-computed from h = sqrt(kVA_sc / kvar), common practice (1500 kVA, 5.75 %, 600 kvar -> 6.59)'],
    [2000, 6, 500, 8.16, 2, null, 'hand-computed from h = sqrt(kVA_sc / kvar), common practice (2000 kVA, 6 %, 500 kvar -> 8.16)'],
  ])('%s kVA, Z %s, %s kvar -> h %s', (kva, z, kvar, h, decimals, near) => {
    const s = screenResonance({ transformerKva: kva, impedancePct: z, bankKvar: kvar });
    expect(s.order).toBeCloseTo(h, decimals);
    expect(s.nearHarmonic).toBe(near);
    expect(s.warning).toBe(near !== null);
  });

  it.each([
    // h exactly at the band edges: 10 % of 5 is 0.5
    [4.5, true, 'common practice: warn within 10 % of 5 (lower edge 4.5)'],
    [5.5, true, 'common practice: warn within 10 % of 5 (upper edge 5.5)'],
    [5.6, false, 'common practice: 5.6 is outside 10 % of 5 and of 7'],
    [9.5, false, 'common practice: 9.5 lies between the bands of 7 (7.7) and 11 (9.9)'],
  ])('order %s warns: %s', (h, warns) => {
    // Choose kvar so that h comes out as given: kvar = kVA_sc / h^2.
    const kvaSc = 1000 / 0.05;
    const s = screenResonance({ transformerKva: 1000, impedancePct: 5, bankKvar: kvaSc / (h * h) });
    expect(s.order).toBeCloseTo(h, 9);
    expect(s.warning).toBe(warns);
  });

  it('a warning message suggests a detuned bank', () => {
    const s = screenResonance({ transformerKva: 1500, impedancePct: 5.75, bankKvar: 600 });
    expect(s.message).toMatch(/detuned/);
  });

  it('screens every cumulative step of a switched bank (common practice: the same formula per step)', () => {
    const steps = screenResonanceSteps({ transformerKva: 1500, impedancePct: 5.75 }, [150, 150, 150, 150]);
    expect(steps.map((s) => Number(s.order.toFixed(2)))).toEqual([13.19, 9.33, 7.61, 6.59]);
    expect(steps.map((s) => s.nearHarmonic)).toEqual([13, null, 7, 7]);
  });
});

describe('detuned bank tuning order 1/sqrt(p)', () => {
  it.each([
    [7, 3.78, 'common practice: tuning order 1/sqrt(p), 7 % reactor -> 3.78'],
    [5.67, 4.2, 'common practice: tuning order 1/sqrt(p), 5.67 % reactor -> 4.20'],
    [14, 2.67, 'common practice: tuning order 1/sqrt(p), 14 % reactor -> 2.67'],
  ])('%s percent reactor', (p, h) => {
    expect(detunedTuningOrder(p)).toBeCloseTo(h, 2);
  });
});

describe('voltage rise dV% ~ kvar x Z% / kVA', () => {
  it.each([
    [300, 1500, 5.75, 1.15, 'from memory (IEEE Std 141): 300 kvar on 1500 kVA at 5.75 % -> 1.15 %'],
    [100, 1000, 5.3, 0.53, 'same formula, hand-computed'],
  ])('%s kvar on %s kVA at Z %s', (kvar, kva, z, rise) => {
    expect(voltageRise({ bankKvar: kvar, transformerKva: kva, impedancePct: z }).risePct).toBeCloseTo(rise, 2);
  });
});

describe('capacitor duty (IEEE Std 18 limits, NEC Article 460 conductor sizing)', () => {
  it.each([
    [480, 528, true, 'IEEE Std 18: 110 % of rated voltage is the limit (528 V on 480 V is exactly 110 %)'],
    [480, 535, false, 'IEEE Std 18: 535 V on a 480 V unit exceeds 110 %'],
    [480, 460, true, 'IEEE Std 18: under-voltage is within limits'],
  ])('%s V capacitor on %s V', (rated, service, ok) => {
    expect(capacitorDuty({ ratedKvar: 100, ratedVoltageV: rated, serviceVoltageV: service }).withinLimits).toBe(ok);
  });

  it('300 kvar at 480 V draws 360.8 A; conductors need 135 % = 487.14 A (NEC Article 460; I = kvar / (sqrt 3 x kV))', () => {
    const d = capacitorDuty({ ratedKvar: 300, ratedVoltageV: 480, serviceVoltageV: 480 });
    expect(d.ratedCurrentA).toBeCloseTo(360.84, 2);
    expect(d.minConductorAmpacityA).toBeCloseTo(487.14, 2);
  });

  it('limits carry the published figures (IEEE Std 18: 110 % V, 135 % kvar and current; NEC 460: 50 V within 1 min)', () => {
    expect(CAPACITOR_LIMITS).toMatchObject({ maxVoltageRatio: 1.1, maxKvarRatio: 1.35, maxCurrentRatio: 1.35, conductorCurrentRatio: 1.35, dischargeVolts: 50, dischargeSeconds: 60 });
  });
});

describe('cautions shown beside correction figures', () => {
  it.each([
    [/qualified persons/i, 'required caution topic'],
    [/local electrical codes/i, 'required caution topic'],
    [/utility's rules/i, 'required caution topic'],
    [/harmonic/i, 'required caution topic'],
    [/switching transients|transients/i, 'required caution topic'],
    [/voltage rise|raise the voltage/i, 'required caution topic'],
    [/protection/i, 'required caution topic'],
    [/discharge/i, 'required caution topic'],
    [/interval averages/i, 'required caution topic'],
    [/tariff text/i, 'required caution topic'],
  ])('mention %s', (pattern) => {
    expect(CAUTIONS.some((c) => pattern.test(c.text))).toBe(true);
  });
  it('have unique ids and non-empty titles', () => {
    expect(new Set(CAUTIONS.map((c) => c.id)).size).toBe(CAUTIONS.length);
    expect(CAUTIONS.every((c) => c.title.length > 0)).toBe(true);
  });
});
