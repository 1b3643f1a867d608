/**
 * The AR and MA roots in the complex plane against the unit circle. The service reports roots of
 * φ(z) and θ(z); stationarity and invertibility need them outside the circle (Box & Jenkins 1970).
 */
import type { ChartData, ChartOptions } from 'chart.js';
import { Scatter } from 'react-chartjs-2';
import type { Complex } from '../../../app/api/contract';
import { chartColours } from './setup';

const CIRCLE = Array.from({ length: 97 }, (_, i) => {
  const a = (i / 96) * 2 * Math.PI;
  return { x: Math.cos(a), y: Math.sin(a) };
});

export function RootsChart({ ar, ma }: { ar: Complex[]; ma: Complex[] }) {
  const c = chartColours();
  const all = [...ar, ...ma];
  const reach = Math.max(1.5, ...all.map((z) => Math.max(Math.abs(z.re), Math.abs(z.im)) * 1.15));
  const lim = Math.min(reach, 10);
  const data: ChartData<'scatter', { x: number; y: number }[]> = {
    datasets: [
      {
        label: 'Unit circle',
        data: CIRCLE,
        showLine: true,
        pointRadius: 0,
        borderColor: c.muted,
        borderWidth: 1,
      },
      {
        label: 'AR roots',
        data: ar.map((z) => ({ x: z.re, y: z.im })),
        pointRadius: 5,
        backgroundColor: c.forecast,
        pointStyle: 'circle',
      },
      {
        label: 'MA roots',
        data: ma.map((z) => ({ x: z.re, y: z.im })),
        pointRadius: 6,
        borderColor: c.fitted,
        backgroundColor: 'transparent',
        borderWidth: 2,
        pointStyle: 'triangle',
      },
    ],
  };
  const options: ChartOptions<'scatter'> = {
    responsive: true,
    maintainAspectRatio: true,
    aspectRatio: 1,
    plugins: { legend: { labels: { color: c.ink, boxWidth: 10 } } },
    scales: {
      x: {
        min: -lim,
        max: lim,
        ticks: { color: c.muted },
        grid: { color: c.grid },
        title: { display: true, text: 'real', color: c.muted },
      },
      y: {
        min: -lim,
        max: lim,
        ticks: { color: c.muted },
        grid: { color: c.grid },
        title: { display: true, text: 'imaginary', color: c.muted },
      },
    },
  };
  return (
    <div className="chart chart-square">
      <Scatter
        data={data}
        options={options}
        role="img"
        aria-label={`${ar.length} AR roots and ${ma.length} MA roots against the unit circle`}
      />
    </div>
  );
}
