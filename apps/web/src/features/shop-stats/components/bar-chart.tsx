import { BarController, BarElement, CategoryScale, Chart, Legend, LinearScale, Tooltip } from 'chart.js';
import { useEffect, useRef } from 'react';

// Only the pieces the bar charts use: chart.js is loaded with this page alone (a lazy route), not the first load.
Chart.register(BarController, BarElement, CategoryScale, LinearScale, Legend, Tooltip);

const COLOURS = ['#1f5f4a', '#b8732e', '#4a5f8f'];

/** A bar chart of the numbers in the table under it; the chart is a picture (aria-hidden), the table is the record. */
export function BarChart({ labels, series, horizontal = false }: { labels: string[]; series: { label: string; data: number[] }[]; horizontal?: boolean }) {
  const canvas = useRef<HTMLCanvasElement>(null);
  useEffect(() => {
    if (!canvas.current) return;
    const chart = new Chart(canvas.current, {
      type: 'bar',
      data: { labels, datasets: series.map((s, i) => ({ ...s, backgroundColor: COLOURS[i % COLOURS.length] })) },
      options: {
        indexAxis: horizontal ? 'y' : 'x',
        responsive: true,
        maintainAspectRatio: false,
        animation: false,
        plugins: { legend: { display: series.length > 1 } },
      },
    });
    return () => chart.destroy();
  }, [labels, series, horizontal]);
  return (
    <div className="relative h-64 w-full min-w-0" aria-hidden>
      <canvas ref={canvas} />
    </div>
  );
}
