/**
 * The Phase dial: the power angle phi = acos(PF) drawn from the kW axis (horizontal), lagging
 * above the axis and leading below, with the tariff's threshold as a dashed arc. The PF value
 * is always printed beside it, so the dial never carries meaning by colour alone.
 */
type Props = { pf: number | null; sense?: 'lag' | 'lead' | 'unity'; thresholdPf?: number; size?: number; label?: string };

const R = 26;
const OX = 6;
const OY = 32;
const pt = (deg: number, r = R) => [OX + r * Math.cos((deg * Math.PI) / 180), OY - r * Math.sin((deg * Math.PI) / 180)] as const;
const arc = (from: number, to: number, r = R) => {
  const [x1, y1] = pt(from, r);
  const [x2, y2] = pt(to, r);
  return `M ${x1.toFixed(2)} ${y1.toFixed(2)} A ${r} ${r} 0 0 ${to > from ? 0 : 1} ${x2.toFixed(2)} ${y2.toFixed(2)}`;
};

export function PhaseDial({ pf, sense = 'lag', thresholdPf = 0.9, size = 40, label }: Props) {
  const deg = pf === null ? null : (Math.acos(Math.min(1, Math.max(0, pf))) * 180) / Math.PI * (sense === 'lead' ? -1 : 1);
  const th = (Math.acos(thresholdPf) * 180) / Math.PI;
  const colour = sense === 'lead' ? 'var(--color-leading)' : 'var(--color-lagging)';
  const text = label ?? (pf === null ? 'No PF' : `PF ${pf.toFixed(3)} ${sense === 'lead' ? 'leading' : 'lagging'}, threshold ${thresholdPf.toFixed(2)}`);
  return (
    <svg width={size} height={size * (44 / 40)} viewBox="0 0 40 44" role="img" aria-label={text} className="inline-block align-middle">
      <title>{text}</title>
      {/* quarter circle of lagging angles, a small band of leading below the axis */}
      <path d={`${arc(0, 90)} L ${OX} ${OY} Z`} fill="var(--color-paper)" stroke="var(--color-rule)" strokeWidth="0.8" />
      <path d={`${arc(-25, 0)} L ${OX} ${OY} Z`} fill="var(--color-paper)" stroke="var(--color-rule)" strokeWidth="0.8" />
      {/* beyond the threshold: the charged region, hatched by a dashed arc */}
      <path d={arc(th, 90, R - 2)} fill="none" stroke="var(--color-ink)" strokeWidth="1.2" strokeDasharray="2 1.5" />
      <line x1={OX} y1={OY} x2={OX + R + 2} y2={OY} stroke="var(--color-active)" strokeWidth="1" />
      {deg !== null && <line x1={OX} y1={OY} x2={pt(deg)[0]} y2={pt(deg)[1]} stroke={colour} strokeWidth="2.2" strokeLinecap="round" />}
      {deg !== null && <circle cx={pt(deg)[0]} cy={pt(deg)[1]} r="1.6" fill={colour} />}
    </svg>
  );
}
