import { BarElement, CategoryScale, Chart as ChartJS, LinearScale, Tooltip } from 'chart.js';
import { Bar } from 'react-chartjs-2';

ChartJS.register(BarElement, CategoryScale, LinearScale, Tooltip);

/** Measured ÷ predicted camber across the yard, in bins of 0.1. */
export default function RatioHistogram({ ratios }: { ratios: number[] }) {
  const edges = Array.from({ length: 16 }, (_, i) => 0.3 + i * 0.1);
  const counts = edges.map((lo) => ratios.filter((r) => r >= lo && r < lo + 0.1).length);
  const labels = edges.map((lo) => `${lo.toFixed(1)}–${(lo + 0.1).toFixed(1)}`);
  const outside = ratios.length - counts.reduce((a, b) => a + b, 0);
  return (
    <figure>
      <div className="h-56">
        <Bar
          role="img"
          aria-label={`Histogram of measured over predicted camber for ${ratios.length} pieces`}
          data={{ labels, datasets: [{ label: 'Pieces', data: counts, backgroundColor: labels.map((_, i) => (edges[i]! >= 0.9 && edges[i]! < 1.1 ? '#3f3e3a' : '#8d8a82')) }] }}
          options={{ responsive: true, maintainAspectRatio: false, animation: false, plugins: { legend: { display: false } }, scales: { x: { title: { display: true, text: 'Measured ÷ predicted' } }, y: { title: { display: true, text: 'Pieces' }, ticks: { precision: 0 } } } }}
        />
      </div>
      <figcaption className="text-sm text-concrete-700">
        {ratios.length} pieces with a trustworthy reading{outside ? `; ${outside} fall outside 0.3–1.9` : ''}. A well-calibrated plant centres on 1.0.
      </figcaption>
    </figure>
  );
}
