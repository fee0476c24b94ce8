// `npm run bench:bays`: time to propose a 40-position bay from a 200-piece pool (target: under 1 s).
import { proposeBay, type BayCandidate } from '#shared/bays/match';

// A deterministic pool: cambers spread over 40 mm with uncertainty, ages 5–95 days, two committed pieces.
const pool: BayCandidate[] = Array.from({ length: 200 }, (_, i) => ({
  id: `p${String(i).padStart(3, '0')}`,
  mark: `DT-${100 + i}`,
  camberMm: 40 + ((i * 7919) % 400) / 10,
  sigmaMm: 1.5 + ((i * 31) % 20) / 10,
  ageDays: 5 + (i % 91),
  committed: i === 17 || i === 123,
}));
proposeBay(pool, { positions: 40, toleranceMm: 19.05 }); // warm-up
const times: number[] = [];
let last = proposeBay(pool, { positions: 40, toleranceMm: 19.05 });
for (let k = 0; k < 7; k++) {
  const t0 = process.hrtime.bigint();
  last = proposeBay(pool, { positions: 40, toleranceMm: 19.05 });
  times.push(Number(process.hrtime.bigint() - t0) / 1e6);
}
times.sort((a, b) => a - b);
console.log('bays: 40 positions from a 200-piece pool, exact (two dynamic-programming passes)');
console.log(`runs (ms): ${times.map((t) => t.toFixed(1)).join(', ')}`);
console.log(`median: ${times[3]!.toFixed(1)} ms (target < 1000 ms); worst neighbour difference ${last.worstMm.toFixed(2)} mm, feasible: ${last.feasible}`);
