/**
 * History, fitted values and the forecast with its 80% and 95% bands, with the reorder point and
 * order-up-to level drawn across. Every number comes from the service; this only draws.
 */
import type { ChartData, ChartOptions } from 'chart.js';
import { Line } from 'react-chartjs-2';
import type { ForecastPoint } from '../../../app/api/contract';
import { chartColours } from './setup';

export interface ForecastChartProps {
  weeks: string[];
  history: (number | null)[];
  fitted: (number | null)[];
  forecast: ForecastPoint[];
  reorderPoint: number | null;
  orderUpTo: number | null;
}

export function ForecastChart(p: ForecastChartProps) {
  const c = chartColours();
  const labels = [...p.weeks, ...p.forecast.map((f) => f.week)];
  const pad = (n: number) => new Array<number | null>(n).fill(null);
  const h = p.weeks.length;
  const fc = (pick: (f: ForecastPoint) => number) => [...pad(h), ...p.forecast.map(pick)];
  const level = (v: number | null) => (v === null ? [] : labels.map(() => v));
  const data: ChartData<'line', (number | null)[], string> = {
    labels,
    datasets: [
      {
        label: '95% band',
        data: fc((f) => f.upper95),
        borderWidth: 0,
        pointRadius: 0,
        fill: '+1',
        backgroundColor: c.band95,
      },
      { label: 'lower 95%', data: fc((f) => f.lower95), borderWidth: 0, pointRadius: 0, fill: false },
      {
        label: '80% band',
        data: fc((f) => f.upper80),
        borderWidth: 0,
        pointRadius: 0,
        fill: '+1',
        backgroundColor: c.band80,
      },
      { label: 'lower 80%', data: fc((f) => f.lower80), borderWidth: 0, pointRadius: 0, fill: false },
      {
        label: 'Sales',
        data: [...p.history, ...pad(p.forecast.length)],
        borderColor: c.history,
        borderWidth: 1.2,
        pointRadius: 0,
        spanGaps: false,
      },
      {
        label: 'Fitted',
        data: [...p.fitted, ...pad(p.forecast.length)],
        borderColor: c.fitted,
        borderWidth: 1,
        pointRadius: 0,
        borderDash: [3, 2],
      },
      {
        label: 'Forecast',
        data: fc((f) => f.mean),
        borderColor: c.forecast,
        borderWidth: 1.8,
        pointRadius: 0,
      },
      {
        label: 'Reorder point',
        data: level(p.reorderPoint),
        borderColor: c.reorder,
        borderWidth: 1,
        pointRadius: 0,
        borderDash: [6, 3],
      },
      {
        label: 'Order-up-to level',
        data: level(p.orderUpTo),
        borderColor: c.upto,
        borderWidth: 1,
        pointRadius: 0,
        borderDash: [2, 3],
      },
    ],
  };
  const options: ChartOptions<'line'> = {
    responsive: true,
    maintainAspectRatio: false,
    interaction: { mode: 'index', intersect: false },
    plugins: {
      legend: {
        labels: { color: c.ink, boxWidth: 12, filter: (item) => !item.text.startsWith('lower') },
      },
    },
    scales: {
      x: { ticks: { color: c.muted, maxTicksLimit: 12 }, grid: { color: c.grid } },
      y: {
        ticks: { color: c.muted },
        grid: { color: c.grid },
        title: { display: true, text: 'units per week', color: c.muted },
      },
    },
  };
  return (
    <div className="chart chart-tall">
      <Line
        data={data}
        options={options}
        role="img"
        aria-label={`Weekly sales, fitted values and a ${p.forecast.length}-week forecast with 80% and 95% bands`}
      />
    </div>
  );
}
