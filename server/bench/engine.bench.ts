// `npm run bench:engine`: full two-year camber curves (with band and tolerance) per second on one core,
// for a realistic bridge girder (harped, debonded and straight groups; dunnage; deck load).
// Target: ≥ 2,000 curves/s, so a nightly recompute of 50,000 pieces needs < 30 s of engine time.
import { readFileSync } from 'node:fs';
import { predictParsed } from '#shared/camber/predict';
import { predictInputSchema } from '#shared/camber/schema';

const base = JSON.parse(readFileSync('shared/camber/examples/bridge-girder-si.json', 'utf8'));
// Daily for the first month, weekly to two years: 31 + 100 = 131 ages.
const ages = [...Array.from({ length: 31 }, (_, i) => i + 1), ...Array.from({ length: 100 }, (_, i) => 35 + 7 * i)];
const methods = ['aashto', 'aci209', 'mc2010', 'multipliers'] as const;

function round(n: number): number {
  const t0 = process.hrtime.bigint();
  for (let i = 0; i < n; i++) {
    const input = predictInputSchema.parse({ ...base, method: methods[i % methods.length], agesDays: ages });
    predictParsed(input);
  }
  return Number(process.hrtime.bigint() - t0) / 1e9;
}

round(200); // warm-up (JIT)
const n = 2000;
const rates: number[] = [];
for (let k = 0; k < 5; k++) rates.push(n / round(n));
rates.sort((a, b) => a - b);
const median = rates[2]!;
console.log(`engine: ${ages.length}-age curves with band, 4 methods rotating, input validation included`);
console.log(`runs (curves/s): ${rates.map((r) => r.toFixed(0)).join(', ')}`);
console.log(`median: ${median.toFixed(0)} curves/s; spread ${(((rates[4]! - rates[0]!) / median) * 100).toFixed(1)} %`);
console.log(`50,000 pieces would take ${(50000 / median).toFixed(1)} s of engine time (target < 30 s; ≥ 2,000 curves/s)`);
