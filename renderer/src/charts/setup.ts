/** Registers the chart.js pieces our charts use (tree-shaken build), once. */
import {
  BarElement,
  CategoryScale,
  Chart,
  Filler,
  Legend,
  LinearScale,
  LineElement,
  PointElement,
  ScatterController,
  Tooltip,
} from 'chart.js';

Chart.register(
  CategoryScale,
  LinearScale,
  PointElement,
  LineElement,
  BarElement,
  Filler,
  Legend,
  Tooltip,
  ScatterController,
);
Chart.defaults.animation = false;
Chart.defaults.font.size = 11;

/** Colours read from the page's CSS variables, so charts follow light and dark. */
export function chartColours(): Record<string, string> {
  const css = getComputedStyle(document.documentElement);
  const v = (name: string, fallback: string) => css.getPropertyValue(name).trim() || fallback;
  return {
    ink: v('--ink', '#1d232b'),
    muted: v('--muted', '#6b7480'),
    grid: v('--rule', '#d9dee4'),
    history: v('--c-history', '#33414f'),
    fitted: v('--c-fitted', '#c0731b'),
    forecast: v('--c-forecast', '#1f6fb2'),
    band80: v('--c-band80', 'rgba(31,111,178,0.28)'),
    band95: v('--c-band95', 'rgba(31,111,178,0.13)'),
    reorder: v('--c-reorder', '#b3261e'),
    upto: v('--c-upto', '#2e7d4f'),
  };
}
