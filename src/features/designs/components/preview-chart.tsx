import { CategoryScale, Chart as ChartJS, Filler, Legend, LinearScale, LineElement, PointElement, Tooltip } from 'chart.js';
import { Line } from 'react-chartjs-2';
import type { PredictResult } from '#shared/camber/schema';

ChartJS.register(LinearScale, CategoryScale, PointElement, LineElement, Filler, Tooltip, Legend);

/** The predicted curve of a design being edited, with its expected band and tolerance limits. */
export default function PreviewChart({ result }: { result: PredictResult }) {
  const pts = (f: (p: PredictResult['points'][number]) => number) => result.points.map((p) => ({ x: p.ageDays, y: f(p) }));
  return (
    <div className="h-64">
      <Line
        role="img"
        aria-label={`Predicted camber in ${result.unitOfCamber} from release to ${result.points.at(-1)?.ageDays} days`}
        data={{
          datasets: [
            { label: 'Expected band', data: pts((p) => p.high), borderColor: 'rgba(107,105,98,0.4)', backgroundColor: 'rgba(180,177,169,0.35)', fill: '+1', pointRadius: 0 },
            { label: 'Expected band (low)', data: pts((p) => p.low), borderColor: 'rgba(107,105,98,0.4)', pointRadius: 0 },
            { label: 'Predicted', data: pts((p) => p.camber), borderColor: '#3f3e3a', pointRadius: 2 },
            { label: 'Tolerance limits', data: pts((p) => p.toleranceHigh), borderColor: '#a3171b', borderDash: [2, 2], pointRadius: 0 },
            { label: 'Tolerance limit (low)', data: pts((p) => p.toleranceLow), borderColor: '#a3171b', borderDash: [2, 2], pointRadius: 0 },
          ],
        }}
        options={{ animation: false, maintainAspectRatio: false, parsing: false, scales: { x: { type: 'linear', title: { display: true, text: 'Age (days)' } }, y: { title: { display: true, text: `Camber (${result.unitOfCamber})` } } }, plugins: { legend: { position: 'bottom', labels: { filter: (i) => !/\(low\)$/.test(i.text) } } } }}
      />
    </div>
  );
}
