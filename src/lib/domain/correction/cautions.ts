/** A caution the UI and every savings report show beside correction figures. */
export interface Caution {
  id: string;
  title: string;
  text: string;
}

/** Cautions for capacitor work, shown, never hidden. */
export const CAUTIONS: readonly Caution[] = [
  {
    id: 'qualified-persons',
    title: 'Qualified persons',
    text: 'Capacitor banks must be designed and installed by qualified persons under local electrical codes and the utility\'s rules.',
  },
  {
    id: 'harmonic-resonance',
    title: 'Harmonic resonance',
    text: 'A capacitor bank and the supply transformer form a resonant circuit. Check the resonance order against the site\'s harmonics; a detuned bank may be needed.',
  },
  {
    id: 'switching-transients',
    title: 'Switching transients',
    text: 'Energising capacitor steps causes inrush and voltage transients that can trip drives and stress equipment. Check them in the design.',
  },
  {
    id: 'voltage-rise',
    title: 'Voltage rise at light load',
    text: 'Capacitors raise the voltage, most at light load, and a fixed bank can make the site leading. Check voltage and leading operation at minimum load.',
  },
  {
    id: 'protection-discharge',
    title: 'Protection and discharge',
    text: 'Banks need protection, conductors and disconnects rated for capacitor current, and discharge devices so stored charge falls to a safe voltage before anyone works on them.',
  },
  {
    id: 'estimates',
    title: 'Estimates, not a design',
    text: 'The figures are estimates from interval averages and the tariff as entered; switching within an interval is not seen. Confirm them with the utility\'s tariff text.',
  },
  {
    id: 'displacement-only',
    title: 'Displacement PF only',
    text: 'Capacitors correct the displacement part of PF; with harmonic currents the true PF stays lower.',
  },
];
