// The server as a real child process for the fault suite: started, polled until it answers, and never
// left behind when a test ends.
import { spawn, type ChildProcess } from 'node:child_process';

const spawned: ChildProcess[] = [];

/** Kills (SIGKILL) every server a test file started that is still running. */
export function killLeftovers(): void {
  for (const c of spawned) if (c.exitCode === null && c.signalCode === null) c.kill('SIGKILL');
}

export async function startServerProcess(port: number, databaseUrl: string, env: Record<string, string> = {}): Promise<ChildProcess> {
  const taken = await fetch(`http://127.0.0.1:${port}/api/health`).then(() => true, () => false);
  if (taken) throw new Error(`port ${port} is already in use; stop what runs there first`);
  // node with the tsx loader, not the tsx wrapper, so the signals reach our process itself.
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/ops/serve-api.ts'], {
    // A clean environment: the test runner's own variables (its loaders and workers) stay out.
    env: { PATH: process.env.PATH ?? '', HOME: process.env.HOME ?? '/root', NODE_ENV: 'test', PORT: String(port), DATABASE_URL: databaseUrl, LOG_LEVEL: 'silent', JOBS: 'off', SMTP_PORT: '1999', ...env },
    stdio: 'ignore',
  });
  spawned.push(child);
  return new Promise<ChildProcess>((resolve, reject) => {
    child.once('exit', (code) => reject(new Error(`the server exited with ${code} before it answered`)));
    const until = Date.now() + 30_000;
    const poll = async (): Promise<void> => {
      try {
        if ((await fetch(`http://127.0.0.1:${port}/api/health`)).ok) return resolve(child);
      } catch {
        // not up yet
      }
      if (Date.now() > until) return reject(new Error('the server did not start'));
      setTimeout(() => void poll(), 250);
    };
    void poll();
  });
}

export const exited = (child: ChildProcess): Promise<number | null> => new Promise((r) => child.once('exit', (code) => r(code)));
