// The project-local PostgreSQL: Debian's server binaries, a cluster under .data/pg (git-ignored),
// listening on 127.0.0.1 only, on a port of our own. initdb refuses to run as root, so when we are
// root the cluster belongs to the unprivileged "postgres" user that Debian's package creates.
import { chownSync, mkdirSync, readdirSync, readFileSync } from 'node:fs';
import { totalmem } from 'node:os';
import { resolve } from 'node:path';
import pg from 'pg';
import { DATA_DIR } from '../config';
import { aptInstall, exists, isRoot, run } from './system';

const CLUSTER_DIR = resolve(DATA_DIR, 'pg');

export function postgresBinDir(): string | null {
  const base = '/usr/lib/postgresql';
  if (!exists(base)) return null;
  const versions = readdirSync(base).filter((v) => exists(resolve(base, v, 'bin', 'initdb'))).sort((a, b) => Number(b) - Number(a));
  return versions[0] ? resolve(base, versions[0], 'bin') : null;
}

function ensureBinaries(): string {
  let bin = postgresBinDir();
  if (!bin) {
    aptInstall(['postgresql'], 'PostgreSQL server binaries were not found');
    bin = postgresBinDir();
  }
  if (!bin) throw new Error('PostgreSQL was installed but initdb was not found under /usr/lib/postgresql');
  return bin;
}

/** Runs a PostgreSQL binary as the cluster owner. */
function asOwner(bin: string, args: string[]): void {
  if (isRoot()) run('runuser', ['-u', 'postgres', '--', bin, ...args], { cwd: '/' });
  else run(bin, args);
}

async function isUp(port: number): Promise<boolean> {
  const client = new pg.Client({ host: '127.0.0.1', port, user: 'crownwatch', database: 'postgres', connectionTimeoutMillis: 1500 });
  try {
    await client.connect();
    await client.end();
    return true;
  } catch {
    return false;
  }
}

/**
 * Shared buffers of the local cluster in MB: a quarter of the machine's memory, the starting value the
 * PostgreSQL manual gives for a dedicated server with 1 GB or more (§20.4.1, shared_buffers), at most
 * 1 GB since this machine runs the app and its tools too, and never below the default 128 MB. The
 * default holds too little of a plant's readings: a piece page opened for the first time then reads its
 * readings' pages through the operating system (pgbench, 50,000 pieces at random: 0.31 ms a page with
 * 128 MB, 0.26 ms with 1 GB; README, Performance).
 */
function sharedBuffersMb(totalBytes = totalmem()): number {
  return Math.max(128, Math.min(1024, Math.floor(totalBytes / 4 / 2 ** 20)));
}

/** Makes sure the local cluster exists and runs on `port`; true when this call started it. */
export async function ensureLocalPostgres(port: number): Promise<boolean> {
  if (await isUp(port)) return false;
  const bin = ensureBinaries();
  mkdirSync(CLUSTER_DIR, { recursive: true, mode: 0o700 });
  if (isRoot()) chownByName(CLUSTER_DIR, 'postgres');
  if (!exists(resolve(CLUSTER_DIR, 'PG_VERSION'))) {
    console.log(`Creating the local PostgreSQL cluster in ${CLUSTER_DIR}…`);
    // trust on loopback only: a development cluster reachable from this machine alone.
    asOwner(resolve(bin, 'initdb'), ['-D', CLUSTER_DIR, '-U', 'crownwatch', '--auth=trust', '-E', 'UTF8', '--locale=C.UTF-8']);
  }
  console.log(`Starting PostgreSQL on 127.0.0.1:${port}…`);
  asOwner(resolve(bin, 'pg_ctl'), [
    '-D', CLUSTER_DIR, '-l', resolve(CLUSTER_DIR, 'server.log'), '-w', '-t', '60',
    '-o', `-p ${port} -c listen_addresses=127.0.0.1 -c unix_socket_directories=${CLUSTER_DIR} -c shared_buffers=${sharedBuffersMb()}MB`, 'start',
  ]);
  if (!(await isUp(port))) throw new Error(`PostgreSQL did not answer on 127.0.0.1:${port}; see ${CLUSTER_DIR}/server.log`);
  return true;
}

export function stopLocalPostgres(): void {
  const bin = postgresBinDir();
  if (!bin || !exists(resolve(CLUSTER_DIR, 'postmaster.pid'))) {
    console.log('The local PostgreSQL is not running.');
    return;
  }
  asOwner(resolve(bin, 'pg_ctl'), ['-D', CLUSTER_DIR, '-m', 'fast', 'stop']);
}

/** Creates the database when it does not exist (connects to the server's maintenance database). */
export async function ensureDatabase(databaseUrl: string): Promise<void> {
  const url = new URL(databaseUrl);
  const name = decodeURIComponent(url.pathname.slice(1));
  url.pathname = '/postgres';
  const client = new pg.Client({ connectionString: url.toString() });
  await client.connect();
  try {
    const found = await client.query('SELECT 1 FROM pg_database WHERE datname = $1', [name]);
    if (found.rowCount === 0) await client.query(`CREATE DATABASE "${name.replace(/"/g, '""')}"`);
  } finally {
    await client.end();
  }
}

function chownByName(path: string, user: string): void {
  for (const line of readFileSync('/etc/passwd', 'utf8').split('\n')) {
    const [name, , uid, gid] = line.split(':');
    if (name === user) return chownSync(path, Number(uid), Number(gid));
  }
  throw new Error(`user ${user} not found; it comes with Debian's postgresql package`);
}
