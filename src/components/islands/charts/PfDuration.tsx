import { Line } from 'react-chartjs-2';
import { registerCharts } from './register';

registerCharts();

type D = { share: number; pf: number; sense: 'lag' | 'lead' }[];

/** PF duration curve: interval PF sorted from worst lagging through unity to leading, over the share of importing time. */
export function PfDuration({ before, after, thresholdPf, height = 260 }: { before: D; after?: D | null; thresholdPf: number; height?: number }) {
  // Lagging PF rises to unity at 1.0; leading PF continues above it (2 - PF) and is labelled as leading.
  const pt = (d: D) => d.map((p) => ({ x: p.share * 100, y: p.sense === 'lead' ? 2 - p.pf : p.pf }));
  const ys = [...pt(before), ...(after ? pt(after) : [])].map((p) => p.y);
  const min = Math.max(0, Math.floor((Math.min(thresholdPf, ...ys) - 0.02) * 20) / 20);
  const max = Math.max(1.0, Math.ceil(Math.max(...ys) * 20) / 20);
  const tick = (v: number) => (v > 1.0001 ? `${(2 - v).toFixed(2)} lead` : v > 0.9999 ? '1.00' : `${v.toFixed(2)} lag`);
  const datasets: any[] = [
    { label: 'Interval PF as metered', data: pt(before), borderColor: '#6b3fa0', pointRadius: 0, borderWidth: 2 },
    { label: `Threshold ${thresholdPf.toFixed(2)}`, data: [{ x: 0, y: thresholdPf }, { x: 100, y: thresholdPf }], borderColor: '#1d2430', borderDash: [6, 4], pointRadius: 0, borderWidth: 1.5 },
  ];
  if (after) datasets.push({ label: 'After the proposed bank', data: pt(after), borderColor: '#4f7a28', pointRadius: 0, borderWidth: 2, borderDash: [2, 2] });
  return (
    <div style={{ height }}>
      <Line
        data={{ datasets }}
        options={{ maintainAspectRatio: false, parsing: false, plugins: { legend: { position: 'bottom', labels: { boxWidth: 12 } } }, scales: { x: { type: 'linear', min: 0, max: 100, title: { display: true, text: 'Share of importing time (%)' } }, y: { min, max, ticks: { callback: (v) => tick(Number(v)) }, title: { display: true, text: 'Interval PF' } } } }}
        aria-label="PF duration curve"
        role="img"
      />
    </div>
  );
}
