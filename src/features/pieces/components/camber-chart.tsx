import { CategoryScale, Chart as ChartJS, Filler, Legend, LinearScale, LineElement, PointElement, Tooltip, type ChartDataset } from 'chart.js';
import { Line } from 'react-chartjs-2';
import type { PieceProjection } from '#shared/api/review';
import type { ReadingDto } from '#shared/api/readings';

ChartJS.register(LinearScale, CategoryScale, PointElement, LineElement, Filler, Tooltip, Legend);

type Curve = NonNullable<PieceProjection['projection']>['curve'];

interface Props {
  curve: Curve;
  readings: ReadingDto[];
  castDate: string;
  shipDate: string | null;
  erectionDate: string | null;
  unit: 'us' | 'si';
}

const DAY = 86_400_000;
const ageOf = (castDate: string, iso: string): number => (Date.parse(iso) - Date.parse(`${castDate}T00:00:00Z`)) / DAY;

/** Camber against age: the readings, the predicted curve with its band, the tolerance limits, the calibrated projection and the ship and erection dates. */
export default function CamberChart({ curve, readings, castDate, shipDate, erectionDate, unit }: Props) {
  const k = unit === 'us' ? 1 / 25.4 : 1;
  const u = unit === 'us' ? 'in' : 'mm';
  const pts = (f: (p: Curve[number]) => number) => curve.map((p) => ({ x: p.ageDays, y: f(p) * k }));
  const live = readings.filter((r) => !r.supersededBy);
  const all = curve.flatMap((p) => [p.toleranceLowMm, p.toleranceHighMm]).concat(live.map((r) => r.valueMm));
  const yMin = Math.min(...all) * k;
  const yMax = Math.max(...all) * k;
  const marker = (label: string, date: string | null, color: string): ChartDataset<'line', Array<{ x: number; y: number }>> | null =>
    date ? { label, data: [{ x: ageOf(castDate, `${date}T12:00:00Z`), y: yMin }, { x: ageOf(castDate, `${date}T12:00:00Z`), y: yMax }], borderColor: color, borderWidth: 2, borderDash: [2, 3], pointRadius: 0 } : null;
  const datasets = [
    { label: 'Expected band', data: pts((p) => p.highMm), borderColor: 'rgba(107,105,98,0.4)', backgroundColor: 'rgba(180,177,169,0.35)', pointRadius: 0, fill: '+1', borderWidth: 1 },
    { label: 'Expected band (low)', data: pts((p) => p.lowMm), borderColor: 'rgba(107,105,98,0.4)', pointRadius: 0, fill: false, borderWidth: 1 },
    { label: 'Predicted', data: pts((p) => p.camberMm), borderColor: '#3f3e3a', pointRadius: 0, borderWidth: 2 },
    { label: 'Projected from its readings', data: pts((p) => p.calibratedMm), borderColor: '#8a2e08', borderDash: [8, 4], pointRadius: 0, borderWidth: 2 },
    { label: 'Tolerance limits', data: pts((p) => p.toleranceHighMm), borderColor: '#a3171b', borderDash: [2, 2], pointRadius: 0, borderWidth: 1.5 },
    { label: 'Tolerance limit (low)', data: pts((p) => p.toleranceLowMm), borderColor: '#a3171b', borderDash: [2, 2], pointRadius: 0, borderWidth: 1.5 },
    {
      label: 'Readings (▲ taken in sun)',
      data: live.map((r) => ({ x: ageOf(castDate, r.takenAt), y: r.valueMm * k })),
      showLine: false,
      borderColor: '#15191d',
      backgroundColor: live.map((r) => (r.likelyDistorted ? '#ffffff' : '#15191d')),
      pointStyle: live.map((r) => (r.likelyDistorted ? 'triangle' : 'circle')),
      pointRadius: 6,
    },
    marker('Ship date', shipDate, '#1d6b3a'),
    marker('Erection date', erectionDate, '#54534d'),
  ].filter(Boolean) as Array<ChartDataset<'line', Array<{ x: number; y: number }>>>;
  return (
    <figure>
      <div className="h-80 w-full">
        <Line
          data={{ datasets }}
          aria-label={`Camber against age in ${u}: ${live.length} readings, the predicted curve with its expected band, the tolerance limits and the projection`}
          role="img"
          options={{
            responsive: true,
            maintainAspectRatio: false,
            animation: false,
            parsing: false,
            scales: { x: { type: 'linear', title: { display: true, text: 'Age since casting (days)' } }, y: { title: { display: true, text: `Camber (${u})` } } },
            plugins: { legend: { position: 'bottom', labels: { filter: (i) => !/\(low\)$/.test(i.text) } } },
          }}
        />
      </div>
      <figcaption className="mt-1 text-sm text-concrete-700">Filled circles are readings; white triangles were taken in afternoon sun and are left out of the projection. The readings table below lists every value.</figcaption>
    </figure>
  );
}
