export interface CapexInput {
  kvar: number;
  /** Installed cost per kvar. */
  costPerKvar: number;
  /** Fixed installation cost per bank (switchboard work, protection, commissioning). */
  fixedCost: number;
  /** Extra cost per kvar of a detuned (reactor) bank, when one is chosen. */
  detuningPremiumPerKvar?: number;
}

export interface CostLine {
  label: string;
  amount: number;
}

/** Capex = kvar x cost per kvar + fixed cost (+ kvar x detuning premium), itemised. */
export function capexOf(input: CapexInput): { total: number; lines: CostLine[] } {
  const lines: CostLine[] = [
    { label: `Capacitors: ${input.kvar} kvar × ${input.costPerKvar} per kvar`, amount: input.kvar * input.costPerKvar },
    { label: 'Fixed installation', amount: input.fixedCost },
  ];
  if (input.detuningPremiumPerKvar) {
    lines.push({ label: `Detuning reactors: ${input.kvar} kvar × ${input.detuningPremiumPerKvar} per kvar`, amount: input.kvar * input.detuningPremiumPerKvar });
  }
  return { total: lines.reduce((s, l) => s + l.amount, 0), lines };
}
