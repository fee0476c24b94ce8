// `npm run bench`: every benchmark in turn; each prints its own figures.
import { spawnSync } from 'node:child_process';

const benches = ['server/bench/engine.bench.ts', 'server/bench/bays.bench.ts', 'server/bench/import.bench.ts', 'server/bench/api.bench.ts', 'server/bench/client.bench.ts', 'server/bench/nightly.bench.ts'];
let failed = 0;
for (const b of benches) {
  console.log(`\n━━ ${b} ━━`);
  // As `npm run bench:<name>` runs each (the nightly one collects garbage between its parts).
  const r = spawnSync(process.execPath, ['--expose-gc', '--import', 'tsx', b], { stdio: 'inherit' });
  if (r.status !== 0) failed++;
}
process.exit(failed ? 1 : 0);
