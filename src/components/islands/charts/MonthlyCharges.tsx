import { Bar } from 'react-chartjs-2';
import { registerCharts, RULE_COLOURS } from './register';

registerCharts();

export type MonthCharges = { label: string; rules: { ruleLabel: string; amount: number }[]; after?: number | null };

/** PF charge per month stacked by rule; with `after`, the corrected plan's charge beside it. */
export function MonthlyCharges({ months, currency, height = 260, afterLabel = 'With the plan' }: { months: MonthCharges[]; currency: string; height?: number; afterLabel?: string }) {
  const ruleLabels = [...new Set(months.flatMap((m) => m.rules.map((r) => r.ruleLabel)))];
  const datasets = ruleLabels.map((label, i) => ({
    label,
    data: months.map((m) => m.rules.filter((r) => r.ruleLabel === label).reduce((s, r) => s + r.amount, 0)),
    backgroundColor: RULE_COLOURS[i % RULE_COLOURS.length],
    stack: 'before',
  }));
  if (months.some((m) => m.after !== undefined && m.after !== null)) datasets.push({ label: afterLabel, data: months.map((m) => m.after ?? 0), backgroundColor: '#4f7a28', stack: 'after' });
  const fmt = (v: number) => v.toLocaleString('en-US', { style: 'currency', currency, maximumFractionDigits: 0 });
  return (
    <div style={{ height }}>
      <Bar
        data={{ labels: months.map((m) => m.label.replace(/^(\w{3})\w*/, '$1')), datasets }}
        options={{
          maintainAspectRatio: false,
          plugins: { legend: { position: 'bottom', labels: { boxWidth: 12 } }, tooltip: { callbacks: { label: (c) => `${c.dataset.label}: ${fmt(Number(c.raw))}` } } },
          scales: { x: { stacked: true, grid: { display: false } }, y: { stacked: true, title: { display: true, text: `PF charge (${currency})` }, ticks: { callback: (v) => fmt(Number(v)) } } },
        }}
        aria-label={`PF charge by month, stacked by rule, in ${currency}`}
        role="img"
      />
    </div>
  );
}
