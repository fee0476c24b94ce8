// `npm run bench:client`: gzipped JavaScript the yard screen loads, and the whole app, beside a minimal
// React + Vite page built in the same run (target: yard screen ≤ 200 KB gzipped).
import { mkdirSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { gzipSync } from 'node:zlib';
import react from '@vitejs/plugin-react';
import { build } from 'vite';

type Manifest = Record<string, { file: string; isEntry?: boolean; imports?: string[] }>;

const root = resolve(import.meta.dirname, '../..');
const outApp = join(root, '.build/bench-client/app');
const anchorRoot = join(root, '.build/bench-client/anchor-src');
const outAnchor = join(root, '.build/bench-client/anchor');

const gz = (file: string): number => gzipSync(readFileSync(file), { level: 9 }).length;
const kb = (bytes: number): string => `${(bytes / 1024).toFixed(1)} KB`;

/** Files the browser loads before the first paint of the entry: the entry chunk and its static imports. */
function entryFiles(manifest: Manifest): string[] {
  const seen = new Set<string>();
  const walk = (key: string): void => {
    const chunk = manifest[key];
    if (!chunk || seen.has(chunk.file)) return;
    seen.add(chunk.file);
    for (const dep of chunk.imports ?? []) walk(dep);
  };
  for (const [key, chunk] of Object.entries(manifest)) if (chunk.isEntry) walk(key);
  return [...seen].filter((f) => f.endsWith('.js'));
}

function allJs(dir: string): string[] {
  return readdirSync(dir, { recursive: true, encoding: 'utf8' }).filter((f) => f.endsWith('.js') && !f.endsWith('.map'));
}

async function main(): Promise<void> {
  rmSync(join(root, '.build/bench-client'), { recursive: true, force: true });

  // The product: the yard screen is the start URL and is part of the entry (office pages are lazy routes).
  await build({ root, logLevel: 'warn', build: { outDir: outApp, emptyOutDir: true, manifest: true, sourcemap: false } });
  const manifest = JSON.parse(readFileSync(join(outApp, '.vite/manifest.json'), 'utf8')) as Manifest;
  const yard = entryFiles(manifest).reduce((sum, f) => sum + gz(join(outApp, f)), 0);
  const whole = allJs(join(outApp, 'assets')).reduce((sum, f) => sum + gz(join(outApp, 'assets', f)), 0);

  // The anchor: React 19 rendering one heading, same Vite and plugin, nothing else.
  mkdirSync(anchorRoot, { recursive: true });
  writeFileSync(join(anchorRoot, 'index.html'), '<!doctype html><html><body><div id="root"></div><script type="module" src="/main.tsx"></script></body></html>');
  writeFileSync(
    join(anchorRoot, 'main.tsx'),
    "import { createRoot } from 'react-dom/client';\ncreateRoot(document.getElementById('root')!).render(<h1>Hello</h1>);\n",
  );
  await build({ root: anchorRoot, configFile: false, logLevel: 'warn', plugins: [react()], build: { outDir: outAnchor, emptyOutDir: true, manifest: true } });
  const anchorManifest = JSON.parse(readFileSync(join(outAnchor, '.vite/manifest.json'), 'utf8')) as Manifest;
  const anchor = entryFiles(anchorManifest).reduce((sum, f) => sum + gz(join(outAnchor, f)), 0);

  console.log('client: gzipped JavaScript (gzip level 9)');
  console.log(`anchor: minimal React + Vite page          ${kb(anchor)}`);
  console.log(`yard screen (entry + static imports)      ${kb(yard)}   ${(yard / anchor).toFixed(1)}× the anchor   target ≤ 200 KB: ${yard <= 200 * 1024 ? 'met' : 'NOT met'}`);
  console.log(`whole app (every chunk, lazy ones too)    ${kb(whole)}   ${(whole / anchor).toFixed(1)}× the anchor`);
}

main().catch((e: unknown) => {
  console.error(e);
  process.exit(1);
});
