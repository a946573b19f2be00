/** The method notes every Savings report carries: each formula with where it comes from. */
export const METHOD_NOTES: { title: string; formula: string; source: string }[] = [
  { title: 'Average power factor of a period', formula: 'PF = kWh / √(kWh² + kvarh²) from the period’s energy totals; interval PFs are never averaged.', source: 'Common practice; displacement PF as defined in IEEE Std 1459-2010.' },
  { title: 'PF at peak demand', formula: 'PF = P_max / √(P_max² + Q²), Q being the kvar of the same demand interval as the kW peak.', source: 'Common practice (coincident kvar).' },
  { title: 'Capacitor needed', formula: 'Qc = P × (tan φ1 − tan φ2), φ = acos(PF).', source: 'IEEE Std 141 (Red Book), chapter 8, and capacitor application guides.' },
  { title: 'Corrected series', formula: 'Each interval’s kvar minus the bank’s kvar × (V/V_rated)²; a switched bank adds steps while PF is below its target and never past unity.', source: 'Formula-derived; simulated on interval averages.' },
  { title: 'Parallel resonance order', formula: 'h = √(kVA_sc / kvar), kVA_sc = transformer kVA / Z (per unit); warning within 10 % of the 5th, 7th, 11th or 13th harmonic.', source: 'IEEE Std 141 and common practice (source impedance ignored).' },
  { title: 'Voltage rise', formula: 'ΔV % ≈ kvar × Z % / transformer kVA.', source: 'IEEE Std 141 (from memory).' },
  { title: 'Economics', formula: 'Capex = kvar × cost per kvar + installation (+ detuning premium); payback = capex / (annual saving − O&M); NPV and IRR of the yearly cash flows over the life.', source: 'Standard discounted cash flow; NPV and IRR checked against the financial npm package (a port of numpy-financial).' },
];
