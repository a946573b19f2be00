/** A tariff rule in one sentence, for the version list (our wording, figures filled in). */
import type { TariffRule } from '@/lib/domain/tariff/rule-registry';
import type { Allowance, Ratchet } from '@/lib/domain/tariff/common-schemas';
import { describeWindow } from '@/lib/domain/tariff/tou-window';
import { rate } from '@/lib/domain/tariff/format';
import { tanPhi } from '@/lib/domain/power/quantities';

const allowance = (a: Allowance) => (a.basis === 'pf' ? `PF ${a.pf} (k = ${tanPhi(a.pf).toFixed(4)})` : `${Number(a.kvarPerKw.toFixed(4))} kvar per kW`);
const ratchet = (r: Ratchet | undefined) => (r ? `; ratchet ${Math.round(r.fraction * 100)} % of the highest ${r.basis === 'billed' ? 'billed' : 'measured'} demand of the previous ${r.lookbackPeriods} periods` : '');
const pfBasis = (b: string) => (b === 'at-peak' ? 'PF at the kW peak' : 'average PF');

export function ruleSummary(rule: TariffRule, currency: string): string {
  let text: string;
  switch (rule.type) {
    case 'pf-billing-demand': {
      const f = rule.formula === 'ratio' ? 'demand × target ÷ PF' : rule.formula === 'linear' ? 'demand × (1 + target − PF)' : `+${rule.percentPerPoint} % of demand per point below target`;
      text = `When the ${pfBasis(rule.pfBasis)} is below ${rule.targetPf}, billing demand = ${f}${rule.maxIncreasePct !== undefined ? ` (at most +${rule.maxIncreasePct} %)` : ''}, the extra kW at ${rate(rule.demandRatePerKw, currency, 'kW')}${ratchet(rule.ratchet)}.`;
      break;
    }
    case 'kva-billing-demand': {
      const unit = rule.mode === 'greater-of-kw-or-kva-share' ? 'kW' : 'kVA';
      const m = rule.mode === 'peak-kva' ? 'Demand billed on peak kVA' : rule.mode === 'kw-over-average-pf' ? 'Demand billed as peak kW ÷ average PF' : `Demand billed as the greater of peak kW and ${rule.kvaShare ?? 0.9} × peak kVA`;
      text = `${m} at ${rate(rule.demandRate, currency, unit)}; PF cost against ${rule.reference === 'target-pf' ? `a ${rule.targetPf ?? 1} PF` : 'unity PF'}${ratchet(rule.ratchet)}.`;
      break;
    }
    case 'excess-kvar-demand':
      text = `${rate(rule.ratePerKvar, currency, 'kvar')} on the ${rule.kvarSource === 'coincident' ? 'kvar at the kW peak' : "period's highest kvar"} above the allowance of ${allowance(rule.allowance)}${ratchet(rule.ratchet)}.`;
      break;
    case 'excess-kvarh': {
      const price = rule.pricing.kind === 'flat' ? rate(rule.pricing.ratePerKvarh, currency, 'kvarh') : `a price by PF band (${rule.pricing.bands.map((b) => `below ${b.pfBelow}: ${rate(b.ratePerKvarh, currency, 'kvarh')}`).join(', ')})`;
      text = `${rule.kvarhBasis === 'lagging' ? 'Lagging' : rule.kvarhBasis === 'net' ? 'Net' : 'Absolute'} kvarh above the allowance of ${allowance(rule.allowance)} at ${price}.`;
      break;
    }
    case 'pf-percent-adjustment': {
      const base = rule.base.source === 'energy-rate' ? `the energy charge (${rate(rule.base.ratePerKwh, currency, 'kWh')})` : rule.base.source === 'demand-rate' ? `the demand charge (${rate(rule.base.ratePerKw, currency, 'kW')})` : `the bill's ${{ energyCharge: 'energy charge', demandCharge: 'demand charge', totalBill: 'total' }[rule.base.field]}`;
      const tiers = rule.tiers.map((t) => `${t.pctPerStep} %${t.downToPf !== undefined ? ` down to ${t.downToPf}` : ''}`).join(', then ');
      const credit = rule.credit ? `; credit ${rule.credit.pctPerStep} % per step above ${rule.credit.abovePf}, at most ${rule.credit.maxPct} %` : '';
      text = `Surcharge of ${tiers} of ${base} per ${rule.stepPf} of ${pfBasis(rule.pfBasis)} below ${rule.thresholdPf}${credit}.`;
      break;
    }
    case 'leading-kvarh':
      text = `${rate(rule.ratePerKvarh, currency, 'kvarh')} on leading kvarh${rule.condition === 'zero-kw-only' ? ' recorded while kW is zero' : ''}.`;
      break;
  }
  return rule.window ? `${text} Only in: ${describeWindow(rule.window)}.` : text;
}
