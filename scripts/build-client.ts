// Builds the client with vite when dist/ is missing or older than its sources; used by `npm start` and the browser tests.
import { spawnSync } from 'node:child_process';
import { existsSync, readdirSync, statSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

export const projectRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
export const clientDir = path.join(projectRoot, 'dist');

function newestMtime(p: string): number {
  const st = statSync(p);
  if (!st.isDirectory()) return st.mtimeMs;
  return readdirSync(p).reduce((m, name) => Math.max(m, newestMtime(path.join(p, name))), st.mtimeMs);
}

export function buildClientIfStale(): void {
  const built = path.join(clientDir, 'index.html');
  const sources = ['app', 'shared', 'public', 'index.html', 'vite.config.ts', 'tailwind.config.ts'].map((p) => path.join(projectRoot, p)).filter(existsSync);
  const stale = !existsSync(built) || sources.some((s) => newestMtime(s) > statSync(built).mtimeMs);
  if (!stale) return;
  console.log('Building the client (vite build)…');
  const r = spawnSync(path.join(projectRoot, 'node_modules', '.bin', 'vite'), ['build', '--logLevel', 'warn'], { cwd: projectRoot, stdio: 'inherit' });
  if (r.status !== 0) throw new Error(`vite build failed with exit code ${r.status}`);
}
