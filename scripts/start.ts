// `npm start`: builds the client when dist/ is missing or older than its sources, then serves everything.
import { spawnSync } from 'node:child_process';
import { existsSync, readdirSync, statSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

function newestMtime(p: string): number {
  const st = statSync(p);
  if (!st.isDirectory()) return st.mtimeMs;
  return readdirSync(p).reduce((m, name) => Math.max(m, newestMtime(path.join(p, name))), st.mtimeMs);
}

const built = path.join(root, 'dist', 'index.html');
const sources = ['app', 'shared', 'index.html', 'vite.config.ts', 'tailwind.config.ts'].map((p) => path.join(root, p)).filter(existsSync);
const stale = !existsSync(built) || sources.some((s) => newestMtime(s) > statSync(built).mtimeMs);
if (stale) {
  console.log('Building the client (vite build)…');
  const r = spawnSync(path.join(root, 'node_modules', '.bin', 'vite'), ['build', '--logLevel', 'warn'], { cwd: root, stdio: 'inherit' });
  if (r.status !== 0) process.exit(r.status ?? 1);
}
await import('../server/index');
