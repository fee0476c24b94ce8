import { spawnSync, type SpawnSyncOptions } from 'node:child_process';
import { existsSync } from 'node:fs';

/** Runs a command, inheriting output; throws with the command line when it fails. */
export function run(cmd: string, args: string[], opts: SpawnSyncOptions = {}): void {
  const r = spawnSync(cmd, args, { stdio: 'inherit', ...opts });
  if (r.status !== 0) throw new Error(`${cmd} ${args.join(' ')} failed (exit ${r.status ?? r.signal})`);
}

/** Runs a command and returns its exit status (output inherited), for gates that must all run. */
export function gate(cmd: string, args: string[], opts: SpawnSyncOptions = {}): number {
  const r = spawnSync(cmd, args, { stdio: 'inherit', ...opts });
  return r.status ?? 1;
}

export const isRoot = (): boolean => typeof process.getuid === 'function' && process.getuid() === 0;

/** Installs Debian packages when running as root; otherwise says what to run. */
export function aptInstall(packages: string[], why: string): void {
  if (!isRoot()) {
    throw new Error(`${why}. Install it with: sudo apt-get install -y ${packages.join(' ')}`);
  }
  console.log(`${why}: installing ${packages.join(' ')} from Debian's packages…`);
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  run('apt-get', ['update', '-qq'], { env });
  run('apt-get', ['install', '-y', '-qq', ...packages], { env });
}

export const exists = (p: string): boolean => existsSync(p);
