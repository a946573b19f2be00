import { Scatter } from 'react-chartjs-2';
import { registerCharts } from './register';

registerCharts();

type Pt = [number, number];
const RAYS = [0.8, 0.9, 0.95, 1];

/**
 * The Quadrant cloud: every interval as a point, kW across and kvar up (lagging above the axis,
 * leading below), with labelled rays of constant PF and the tariff threshold ray dashed.
 */
export function QuadrantCloud({ points, after, thresholdPf, height = 380 }: { points: Pt[]; after?: Pt[] | null; thresholdPf: number; height?: number }) {
  const all = after ? points.concat(after) : points;
  const xmax = Math.max(1, ...all.map((p) => p[0])) * 1.05;
  const ray = (pf: number, label: string, style: { color: string; dash?: number[]; width?: number }) => ({
    type: 'line' as const,
    label,
    data: [{ x: 0, y: 0 }, { x: xmax, y: xmax * Math.tan(Math.acos(pf)) }],
    showLine: true,
    pointRadius: 0,
    borderColor: style.color,
    borderDash: style.dash,
    borderWidth: style.width ?? 1,
    order: 0,
  });
  const toXY = (ps: Pt[]) => ps.map(([x, y]) => ({ x, y }));
  const lag = points.filter((p) => p[1] >= 0);
  const lead = points.filter((p) => p[1] < 0);
  const datasets: any[] = [
    { label: 'Lagging intervals', data: toXY(lag), backgroundColor: 'rgba(107,63,160,0.35)', pointRadius: 1.6, pointStyle: 'circle', order: 2 },
    { label: 'Leading intervals', data: toXY(lead), backgroundColor: 'rgba(194,138,18,0.6)', pointRadius: 2, pointStyle: 'triangle', order: 2 },
    ...RAYS.map((pf) => ray(pf, `PF ${pf.toFixed(2)}`, { color: '#9aa0aa' })),
    ray(thresholdPf, `Tariff threshold ${thresholdPf.toFixed(2)}`, { color: '#1d2430', dash: [6, 4], width: 1.8 }),
  ];
  if (after) datasets.push({ label: 'After the proposed bank', data: toXY(after), backgroundColor: 'rgba(79,122,40,0.45)', pointRadius: 1.6, pointStyle: 'rect', order: 1 });
  // Labels each PF ray at its far end, so the rays are read by text, not by shade.
  const rayLabels = {
    id: 'rayLabels',
    afterDatasetsDraw(chart: any) {
      const { ctx } = chart;
      ctx.save();
      ctx.font = '11px "IBM Plex Sans", sans-serif';
      chart.data.datasets.forEach((d: any, i: number) => {
        if (d.type !== 'line' || !chart.isDatasetVisible(i)) return;
        const meta = chart.getDatasetMeta(i);
        const end = meta.data[1];
        if (!end) return;
        ctx.fillStyle = d.borderColor;
        ctx.textAlign = 'right';
        ctx.fillText(d.label.replace('Tariff threshold', 'threshold'), Math.min(end.x, chart.chartArea.right) - 2, Math.max(end.y, chart.chartArea.top + 10) - 4);
      });
      ctx.restore();
    },
  };
  return (
    <div style={{ height }}>
      <Scatter
        plugins={[rayLabels]}
        data={{ datasets }}
        options={{
          maintainAspectRatio: false,
          parsing: false,
          plugins: { legend: { position: 'bottom', labels: { boxWidth: 10, usePointStyle: true } }, tooltip: { callbacks: { label: (c) => `${(c.raw as { x: number }).x.toFixed(0)} kW, ${(c.raw as { y: number }).y.toFixed(0)} kvar` } } },
          scales: { x: { min: Math.min(0, ...all.map((p) => p[0])), title: { display: true, text: 'Active power (kW)' } }, y: { title: { display: true, text: 'Reactive power (kvar): lagging + / leading −' } } },
        }}
        aria-label="Quadrant cloud of every interval: kW against kvar with rays of constant power factor"
        role="img"
      />
    </div>
  );
}
