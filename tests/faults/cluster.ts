// A throwaway PostgreSQL cluster for the fault suite, so stopping the database never touches the one
// the other tests use.
import { spawnSync } from 'node:child_process';
import { chownSync, mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import pg from 'pg';
import type { DataSource } from 'typeorm';
import type { Role } from '#shared/api/roles';
import { createDataSource } from '#server/db/data-source';
import { migrate } from '#server/ops/database';
import { postgresBinDir } from '#server/ops/postgres';

const root = typeof process.getuid === 'function' && process.getuid() === 0;

function asOwner(bin: string, args: string[]): void {
  const cmd = root ? 'runuser' : bin;
  const full = root ? ['-u', 'postgres', '--', bin, ...args] : args;
  const r = spawnSync(cmd, full, { stdio: 'pipe', encoding: 'utf8', cwd: '/' });
  if (r.status !== 0) throw new Error(`${bin} ${args.join(' ')}: ${r.stderr}`);
}

export interface Cluster { url: string; stopImmediate(): void; start(): void; destroy(): void }

export async function throwawayCluster(port: number): Promise<Cluster> {
  const bin = postgresBinDir();
  if (!bin) throw new Error('PostgreSQL binaries not found');
  const dir = mkdtempSync(join(tmpdir(), 'cw-fault-pg-'));
  if (root) {
    const line = readFileSync('/etc/passwd', 'utf8').split('\n').find((l) => l.startsWith('postgres:'))!.split(':');
    chownSync(dir, Number(line[2]), Number(line[3]));
  }
  asOwner(join(bin, 'initdb'), ['-D', dir, '-U', 'crownwatch', '--auth=trust', '-E', 'UTF8', '--locale=C.UTF-8']);
  const start = (): void => asOwner(join(bin, 'pg_ctl'), ['-D', dir, '-l', join(dir, 'log'), '-w', '-o', `-p ${port} -c listen_addresses=127.0.0.1 -c unix_socket_directories=${dir}`, 'start']);
  start();
  const admin = new pg.Client({ host: '127.0.0.1', port, user: 'crownwatch', database: 'postgres' });
  await admin.connect();
  await admin.query('CREATE DATABASE fault');
  await admin.end();
  return {
    url: `postgres://crownwatch@127.0.0.1:${port}/fault`,
    stopImmediate: () => asOwner(join(bin, 'pg_ctl'), ['-D', dir, '-m', 'immediate', 'stop']),
    start,
    destroy: () => {
      try {
        asOwner(join(bin, 'pg_ctl'), ['-D', dir, '-m', 'immediate', 'stop']);
      } catch {
        // already stopped
      }
    },
  };
}

/** A throwaway cluster with the schema migrated, and a connection to it. */
export async function migratedCluster(port: number, poolSize: number): Promise<{ cluster: Cluster; ds: DataSource }> {
  const cluster = await throwawayCluster(port);
  await migrate(cluster.url);
  const ds = createDataSource(cluster.url, poolSize);
  await ds.initialize();
  return { cluster, ds };
}

/** The smallest plant a fault test needs: one user, one job, one design (an empty spec unless given). */
export async function faultPlant(
  ds: DataSource,
  o: { tag: string; email: string; role: Role; passwordHash: string; design?: { code: string; name: string; productType: string; spec: unknown } },
): Promise<{ plantId: string; userId: string; jobId: string; designId: string }> {
  const d = o.design ?? { code: 'D', name: 'D', productType: 'beam', spec: {} };
  const [plant] = await ds.query(`INSERT INTO plant (name, code, time_zone, unit_system) VALUES ($1, $1, 'UTC', 'us') RETURNING id`, [o.tag]);
  const [user] = await ds.query(`INSERT INTO app_user (plant_id, email, name, role, password_hash) VALUES ($1, $2, $3, $4, $5) RETURNING id`, [plant.id, o.email, o.tag, o.role, o.passwordHash]);
  const [job] = await ds.query(`INSERT INTO job (plant_id, number, name) VALUES ($1, 'J', 'J') RETURNING id`, [plant.id]);
  const [design] = await ds.query(`INSERT INTO member_design (plant_id, code, name, product_type, spec) VALUES ($1, $2, $3, $4, $5) RETURNING id`, [plant.id, d.code, d.name, d.productType, JSON.stringify(d.spec)]);
  return { plantId: plant.id, userId: user.id, jobId: job.id, designId: design.id };
}
