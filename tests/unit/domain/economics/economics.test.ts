import { irr as refIrr, npv as refNpv } from 'financial';
import { describe, expect, it } from 'vitest';
import { capexOf, type CapexInput, economics, irr, levelFlows, lossSavingBenefit, npv, releasedCapacityBenefit, simplePayback } from '../../../../src/lib/domain';

describe('NPV against numpy-financial (npm `financial`)', () => {
  it.each([
    [0.08, [-12000, 3000, 3000, 3000, 3000, 3000, 3000, 3000, 3000, 3000, 3000], 'financial.npv reference'],
    [0.05, [-100, 39, 59, 55, 20], 'financial.npv reference, numpy-financial docs cash flows'],
    [0.12, [-50000, 8000, 9000, 10000, 11000, 12000, 13000], 'financial.npv reference, growing savings'],
    [0, [-10, 4, 4, 4], 'financial.npv reference, zero rate is the plain sum'],
  ])('rate %s', (rate, flows) => {
    expect(npv(rate, flows)).toBeCloseTo(refNpv(rate, flows), 8);
  });

  it('level savings match the annuity formula (textbook: NPV = -C + A (1 - (1+r)^-n) / r)', () => {
    const c = 25000;
    const a = 6000;
    const r = 0.07;
    const n = 12;
    expect(npv(r, levelFlows(c, a, n))).toBeCloseTo(-c + (a * (1 - (1 + r) ** -n)) / r, 8);
  });
});

describe('IRR against numpy-financial (npm `financial`)', () => {
  it.each([
    [[-100, 39, 59, 55, 20], 'financial.irr reference, numpy-financial docs example (0.2809)'],
    [[-12000, 3000, 3000, 3000, 3000, 3000, 3000, 3000, 3000, 3000, 3000], 'financial.irr reference'],
    [[-50000, 8000, 9000, 10000, 11000, 12000, 13000], 'financial.irr reference'],
    [[-1000, 100, 100, 100, 100, 100, 100, 100, 100, 100, 100, 100, 100], 'financial.irr reference, low return'],
  ])('flows %j', (flows) => {
    const ours = irr(flows);
    expect(ours).not.toBeNull();
    expect(ours as number).toBeCloseTo(refIrr(flows), 7);
  });

  it('numpy-financial documentation example gives 0.2809 (numpy-financial irr docstring)', () => {
    expect(irr([-100, 39, 59, 55, 20]) as number).toBeCloseTo(0.2809, 4);
  });

  it('returns null when savings never repay the capex (no sign change)', () => {
    expect(irr([-1000, -10, -10])).toBeNull();
  });
});

describe('simple payback', () => {
  it.each([
    [12000, 3000, 4, 'common practice: capex / net annual saving'],
    [9000, 0, Number.POSITIVE_INFINITY, 'common practice: no net saving -> never pays back'],
    [9000, -500, Number.POSITIVE_INFINITY, 'common practice: savings below O&M never pay back (infinite, not negative)'],
  ])('%s / %s', (capex, net, years) => {
    expect(simplePayback(capex, net)).toBe(years);
  });
});

describe('economics of a plan', () => {
  const base = { capex: 12000, annualSaving: 3500, omPerYear: 500, lifeYears: 10, discountRate: 0.08 };

  it('net flows, payback, NPV and IRR agree with the reference library (financial)', () => {
    const e = economics(base);
    const flows = [-12000, ...Array(10).fill(3000)];
    expect(e.cashFlows).toEqual(flows);
    expect(e.paybackYears).toBe(4);
    expect(e.npv).toBeCloseTo(refNpv(0.08, flows), 8);
    expect(e.irr as number).toBeCloseTo(refIrr(flows), 7);
  });

  it('payback is infinite, not negative, when savings do not cover O&M (common practice)', () => {
    const e = economics({ ...base, annualSaving: 400 });
    expect(e.paybackYears).toBe(Number.POSITIVE_INFINITY);
    expect(e.npv).toBeLessThan(-12000);
    expect(e.irr).toBeNull();
  });

  it.each([
    [0.8, 2800 - 500, 'common practice: -20 % savings sensitivity'],
    [1, 3500 - 500, 'base case'],
    [1.2, 4200 - 500, 'common practice: +20 % savings sensitivity'],
  ])('sensitivity at %s x savings', (factor, net) => {
    const row = economics(base).sensitivity.find((s) => s.savingsFactor === factor);
    expect(row?.netAnnual).toBeCloseTo(net, 9);
    expect(row?.npv).toBeCloseTo(refNpv(0.08, [-12000, ...Array(10).fill(net)]), 8);
    expect(row?.paybackYears).toBeCloseTo(12000 / net, 9);
  });

  it('optional benefits are reported but not counted unless asked', () => {
    const optionalBenefits = [lossSavingBenefit(0.8, 0.95, 2000)];
    const shown = economics({ ...base, optionalBenefits });
    const counted = economics({ ...base, optionalBenefits, includeOptional: true });
    // common practice: 1 - (PF1/PF2)^2, 0.80 -> 0.95 cuts losses by 29.09 %, so $2000 of losses -> $581.7 a year.
    expect(shown.optionalPerYear).toBeCloseTo(581.7, 1);
    expect(shown.netAnnual).toBe(3000);
    expect(counted.netAnnual).toBeCloseTo(3581.7, 1);
    expect(optionalBenefits[0].label).toMatch(/optional/);
  });

  it('released capacity line values 197.4 kVA (common practice: kW/PF1 - kW/PF2) at the given price', () => {
    const b = releasedCapacityBenefit(1000, 0.8, 0.95, 10);
    expect(b.perYear).toBeCloseTo(1973.7, 1);
    expect(b.label).toMatch(/197\.4 kVA.*optional/);
  });
});

describe('capex', () => {
  it.each<[CapexInput, number, string]>([
    [{ kvar: 300, costPerKvar: 35, fixedCost: 5000 }, 15500, 'common practice: kvar x cost per kvar + fixed installation'],
    [{ kvar: 300, costPerKvar: 60, fixedCost: 5000, detuningPremiumPerKvar: 40 }, 35000, 'common practice: + detuning premium'],
  ])('%j', (input, total) => {
    expect(capexOf(input).total).toBe(total);
  });
});
