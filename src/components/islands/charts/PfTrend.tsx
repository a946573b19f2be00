import { Line } from 'react-chartjs-2';
import { registerCharts } from './register';

registerCharts();

/** Average PF and PF at peak per month against the tariff threshold (dashed ink line). */
export function PfTrend({ months, thresholdPf, height = 240 }: { months: { label: string; avg: number | null; atPeak: number | null }[]; thresholdPf: number; height?: number }) {
  const all = months.flatMap((m) => [m.avg, m.atPeak]).filter((x): x is number => x !== null);
  const min = Math.max(0, Math.floor((Math.min(thresholdPf, ...all) - 0.03) * 50) / 50);
  return (
    <div style={{ height }}>
      <Line
        data={{
          labels: months.map((m) => m.label),
          datasets: [
            { label: 'Average PF', data: months.map((m) => m.avg), borderColor: '#6b3fa0', backgroundColor: '#6b3fa0', pointStyle: 'circle', pointRadius: 3 },
            { label: 'PF at peak demand', data: months.map((m) => m.atPeak), borderColor: '#0f6e6e', backgroundColor: '#0f6e6e', pointStyle: 'rect', pointRadius: 3, borderDash: [1, 0] },
            { label: `Tariff threshold ${thresholdPf.toFixed(2)}`, data: months.map(() => thresholdPf), borderColor: '#1d2430', borderDash: [6, 4], pointRadius: 0, borderWidth: 1.5 },
          ],
        }}
        options={{ maintainAspectRatio: false, plugins: { legend: { position: 'bottom', labels: { boxWidth: 12 } } }, scales: { y: { min, max: 1, title: { display: true, text: 'Power factor (lagging)' } }, x: { grid: { display: false } } } }}
        aria-label="Average PF and PF at peak by month against the tariff threshold"
        role="img"
      />
    </div>
  );
}
