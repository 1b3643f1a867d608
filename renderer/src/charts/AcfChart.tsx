/**
 * Bars of the residual autocorrelations by lag with the ±1.96/√n band, the usual approximate 95%
 * limits for white noise (Box & Jenkins, Time Series Analysis, 1970). Values and band from the service.
 */
import type { ChartData, ChartOptions } from 'chart.js';
import { Bar } from 'react-chartjs-2';
import { chartColours } from './setup';

export function AcfChart({ acf, band }: { acf: number[]; band: number }) {
  const c = chartColours();
  const labels = acf.map((_, i) => String(i + 1));
  const data: ChartData<'bar' | 'line', number[], string> = {
    labels,
    datasets: [
      {
        type: 'bar',
        label: 'Residual ACF',
        data: acf,
        backgroundColor: acf.map((r) => (Math.abs(r) > band ? c.reorder : c.forecast)),
      },
      {
        type: 'line',
        label: '+1.96/√n',
        data: labels.map(() => band),
        borderColor: c.muted,
        borderDash: [4, 3],
        pointRadius: 0,
        borderWidth: 1,
      },
      {
        type: 'line',
        label: '−1.96/√n',
        data: labels.map(() => -band),
        borderColor: c.muted,
        borderDash: [4, 3],
        pointRadius: 0,
        borderWidth: 1,
      },
    ],
  };
  const options: ChartOptions<'bar'> = {
    responsive: true,
    maintainAspectRatio: false,
    plugins: { legend: { display: false } },
    scales: {
      x: {
        title: { display: true, text: 'lag (weeks)', color: c.muted },
        ticks: { color: c.muted },
        grid: { display: false },
      },
      y: { min: -1, max: 1, ticks: { color: c.muted }, grid: { color: c.grid } },
    },
  };
  return (
    <div className="chart">
      <Bar
        data={data as ChartData<'bar', number[], string>}
        options={options}
        role="img"
        aria-label={`Residual autocorrelations for ${acf.length} lags with a band of ±${band.toFixed(3)}`}
      />
    </div>
  );
}
