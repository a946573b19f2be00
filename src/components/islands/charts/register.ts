/** Registers only the Chart.js parts our charts use (keeps each island's bundle small). */
import { BarController, BarElement, CategoryScale, Filler, Legend, LinearScale, LineController, LineElement, PointElement, ScatterController, Tooltip, Chart } from 'chart.js';

let done = false;
export function registerCharts() {
  if (done) return;
  Chart.register(BarController, BarElement, LineController, LineElement, PointElement, ScatterController, CategoryScale, LinearScale, Tooltip, Legend, Filler);
  Chart.defaults.font.family = '"IBM Plex Sans", system-ui, sans-serif';
  Chart.defaults.color = '#1d2430';
  Chart.defaults.borderColor = '#d9d4c7';
  Chart.defaults.animation = false;
  done = true;
}

/** Colours for stacked rules: ours, distinguishable, with patterns by index for print. */
export const RULE_COLOURS = ['#b23a2a', '#6b3fa0', '#c28a12', '#0f6e6e', '#4f7a28', '#5b6270'];
