import { spawn } from 'node:child_process';

/**
 * The exit code and error output of the real server (server/index.ts under tsx) started with `env` and
 * the data folder `dataDir`; it must stop before it serves. The caller's DATABASE_URL, SESSION_SECRET
 * and S3_URL are not passed on.
 */
export async function startFails(env: Record<string, string>, dataDir: string): Promise<{ code: number | null; stderr: string }> {
  const clean = Object.fromEntries(Object.entries(process.env).filter(([k]) => !['DATABASE_URL', 'SESSION_SECRET', 'S3_URL'].includes(k)));
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], { env: { ...clean, PORT: '0', GRIDSET_DATA_DIR: dataDir, ...env }, stdio: ['ignore', 'pipe', 'pipe'] });
  let stderr = '';
  child.stderr.on('data', (d: Buffer) => { stderr += d.toString(); });
  const timer = setTimeout(() => child.kill(), 45_000);
  const code = await new Promise<number | null>((resolve) => child.on('exit', resolve));
  clearTimeout(timer);
  return { code, stderr };
}
