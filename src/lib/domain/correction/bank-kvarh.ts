import { ZERO_KWH } from '../power/aggregate-fields';
import { CONTROLLER_EPS, type ReactiveCorrection } from '../power/aggregate-kernel';
import { tanPhi } from '../power/quantities';
import type { IntervalSeries } from '../series/interval-series';
import { voltageScale } from './formulas';
import type { FixedBank, SwitchedBank } from './bank-spec';

/** Leading kvarh a fixed bank supplies in every interval, after voltage scaling. */
export function fixedBankKvarhPerInterval(series: Pick<IntervalSeries, 'intervalMinutes'>, bank: FixedBank): number {
  return bank.kvar * voltageScale(bank.serviceVoltageV, bank.ratedVoltageV) * (series.intervalMinutes / 60);
}

const EPS = CONTROLLER_EPS;

/**
 * Fills `out` with the kvarh a switched bank supplies in each interval and returns
 * the number of step-switchings. The controller looks at each interval's average kW
 * and kvar: it adds steps in order while PF is below the target and stops before a
 * step would take the site past unity (or past the leading limit). No load or export:
 * all steps off. Allocates nothing, so the sizing search can call it per candidate.
 */
export function switchedBankKvarhInto(series: IntervalSeries, bank: SwitchedBank, out: Float64Array): number {
  const scale = voltageScale(bank.serviceVoltageV, bank.ratedVoltageV);
  const toPower = 60 / series.intervalMinutes;
  const toEnergy = 1 / toPower;
  const tanTarget = tanPhi(bank.targetPf);
  const tanLimit = bank.leadingLimitPf >= 1 ? 0 : tanPhi(bank.leadingLimitPf);
  const steps = bank.stepsKvar.map((k) => k * scale);
  const n = steps.length;
  const equal = steps.every((s) => Math.abs(s - steps[0]) < 1e-12);
  const step = steps[0];
  const cum = new Float64Array(n + 1);
  for (let k = 0; k < n; k++) cum[k + 1] = cum[k] + steps[k];
  const { kwh, kvarhLag, kvarhLead } = series;
  const invStep = 1 / step;
  const stepKvarh = step * toEnergy;
  let previous = 0;
  let switchings = 0;
  for (let i = 0; i < series.length; i++) {
    const e = kwh[i];
    let k = 0;
    if (e > ZERO_KWH) {
      // Work in energy per interval: the ratios are the same as in power.
      const q = kvarhLag[i] - kvarhLead[i];
      const need = (q - e * tanTarget) * toPower;
      const room = (q + e * tanLimit) * toPower;
      if (equal) {
        // Steps to reach the target, capped by the steps that stay within the leading
        // limit and by the bank; min/max of whole numbers via |a - b| to avoid
        // data-dependent branches (the controller's decision flips all day long).
        const kTarget = Math.ceil(need * invStep - EPS);
        const kRoom = Math.floor(room * invStep + EPS);
        k = (kTarget + kRoom - Math.abs(kTarget - kRoom)) * 0.5;
        k = (k + n - Math.abs(k - n)) * 0.5;
        k = (k + Math.abs(k)) * 0.5;
      } else if (need > EPS && room > EPS) {
        const qk = q * toPower;
        const target = e * toPower * tanTarget + EPS;
        while (k < n && qk - cum[k] > target && cum[k + 1] <= room + EPS) k++;
      }
    }
    out[i] = equal ? k * stepKvarh : cum[k] * toEnergy;
    switchings += Math.abs(k - previous);
    previous = k;
  }
  return switchings;
}

/**
 * The kernel correction for a switched bank: equal steps are decided inside the
 * aggregation pass; listed unequal steps are filled into `scratch` first.
 */
export function switchedBankCorrection(series: IntervalSeries, bank: SwitchedBank, scratch: Float64Array): ReactiveCorrection {
  const scale = voltageScale(bank.serviceVoltageV, bank.ratedVoltageV);
  const steps = bank.stepsKvar.map((k) => k * scale);
  const equal = steps.every((s) => Math.abs(s - steps[0]) < 1e-12);
  if (!equal) {
    switchedBankKvarhInto(series, bank, scratch);
    return { kind: 'per-interval', kvarh: scratch };
  }
  return {
    kind: 'equal-steps',
    steps: steps.length,
    stepKvarh: steps[0] * (series.intervalMinutes / 60),
    invStepKvar: 1 / steps[0],
    tanTarget: tanPhi(bank.targetPf),
    tanLimit: bank.leadingLimitPf >= 1 ? 0 : tanPhi(bank.leadingLimitPf),
    toPower: 60 / series.intervalMinutes,
  };
}
