// `npm test`: the same set-up as `npm start` for separate test databases, then every gate in turn:
// typecheck, lint, unit and integration tests (vitest on real PostgreSQL), client build, and the
// Playwright end-to-end tests against the built app. Every gate runs; the exit code says if any failed.
import pg from 'pg';
import { loadConfig } from '../config';
import { seedDemo } from '#seed/demo';
import { createLogger } from '../logger';
import { createMailer } from '../mail/mailer';
import { recomputeAll } from '../projections/projection.service';
import { migrate, prepareDatabase, withDataSource } from './database';
import { stopLocalPostgres } from './postgres';
import { aptInstall, exists, gate } from './system';

const withDb = (url: string, name: string): string => {
  const u = new URL(url);
  u.pathname = `/${name}`;
  return u.toString();
};

/** A fresh end-to-end database: dropped and made again, migrated, with the demo scenario. */
async function freshE2eDatabase(url: string): Promise<void> {
  const name = new URL(url).pathname.slice(1);
  const admin = new pg.Client({ connectionString: withDb(url, 'postgres') });
  await admin.connect();
  await admin.query(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
  await admin.query(`CREATE DATABASE "${name}"`);
  await admin.end();
  await migrate(url);
  await withDataSource(url, async (ds) => {
    await seedDemo(ds, { bcryptCost: 10 });
    const cfg = loadConfig({ ...process.env, DATABASE_URL: url });
    await recomputeAll({ ds, cfg, mailer: createMailer(cfg), log: createLogger('warn') }, { quiet: true });
  });
}

async function main(): Promise<number> {
  process.env.NODE_ENV = 'test';
  const cfg = loadConfig({ ...process.env, PG_DATABASE: 'crownwatch_test' });
  const startedHere = await prepareDatabase(cfg);
  const unitUrl = cfg.databaseUrl;
  const e2eUrl = withDb(cfg.databaseUrl, `${new URL(cfg.databaseUrl).pathname.slice(1)}_e2e`);
  if (!exists('/usr/bin/chromium')) aptInstall(['chromium'], "Debian's chromium is needed for the end-to-end tests");
  if (!exists('/usr/bin/pdftotext')) aptInstall(['poppler-utils'], 'poppler-utils (pdftotext, pdftoppm) is needed to check the PDF reports');

  const env = { ...process.env, NODE_ENV: 'test', DATABASE_URL: unitUrl };
  const bin = (name: string): string => `node_modules/.bin/${name}`;
  const results: Array<[string, number]> = [];
  const step = (name: string, code: () => number | Promise<number>) => async () => {
    console.log(`\n━━ ${name} ━━`);
    results.push([name, await code()]);
  };
  await step('typecheck', () => gate(bin('tsc'), ['--noEmit', '-p', 'tsconfig.json']))();
  await step('lint', () => gate('npm', ['run', '--silent', 'lint']))();
  await step('unit and integration tests', () => gate(bin('vitest'), ['run'], { env }))();
  await step('fault suite', () => gate(bin('vitest'), ['run', '--config', 'tests/faults/vitest.config.ts'], { env }))();
  await step('client build', () => gate(bin('vite'), ['build', '--logLevel', 'warn']))();
  await step('end-to-end tests', async () => {
    await freshE2eDatabase(e2eUrl);
    return gate(bin('playwright'), ['test', '-c', 'e2e/playwright.config.ts'], { env: { ...env, E2E_DATABASE_URL: e2eUrl } });
  })();

  console.log('\n━━ summary ━━');
  for (const [name, code] of results) console.log(`${code === 0 ? 'ok  ' : 'FAIL'}  ${name}`);
  const failed = results.filter(([, c]) => c !== 0).length;
  console.log(`gates: ${results.length - failed} passed, ${failed} failed`);
  // A test run leaves the machine as it found it: the cluster it started, it stops.
  if (startedHere) stopLocalPostgres();
  return failed === 0 ? 0 : 1;
}

main().then(
  (code) => process.exit(code),
  (e: unknown) => {
    console.error(`The test set-up failed: ${e instanceof Error ? e.message : String(e)}`);
    process.exit(1);
  },
);
