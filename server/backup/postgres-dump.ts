import { spawn } from 'node:child_process';

/**
 * PostgreSQL's own tools make and restore the database part of a backup: pg_dump's custom format
 * is a consistent snapshot taken in one transaction while the servers go on writing (PostgreSQL
 * documentation, "pg_dump"), and pg_restore reads it back. Debian's postgresql-client installs both.
 * The connection goes to them as PG* environment variables, so a password never shows in `ps`.
 */

/** libpq's environment variables for a postgres:// URL (PostgreSQL documentation, "Environment Variables"). */
export function libpqEnv(url: string): NodeJS.ProcessEnv {
  const u = new URL(url);
  if (u.protocol !== 'postgres:' && u.protocol !== 'postgresql:') throw new Error(`Not a PostgreSQL URL: ${u.protocol}`);
  const env: NodeJS.ProcessEnv = {
    PGHOST: decodeURIComponent(u.hostname) || 'localhost',
    PGPORT: u.port || '5432',
    PGDATABASE: decodeURIComponent(u.pathname.replace(/^\//, '')) || 'postgres',
  };
  if (u.username) env.PGUSER = decodeURIComponent(u.username);
  if (u.password) env.PGPASSWORD = decodeURIComponent(u.password);
  const ssl = u.searchParams.get('sslmode');
  if (ssl) env.PGSSLMODE = ssl;
  return env;
}

/** Runs a client tool and collects its output; a failure carries the tool's own last lines. */
function run(tool: string, args: string[], url: string, maxBytes: number): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const child = spawn(tool, args, { env: { ...process.env, ...libpqEnv(url) }, stdio: ['ignore', 'pipe', 'pipe'] });
    const out: Buffer[] = [];
    let size = 0;
    let err = '';
    child.stdout.on('data', (d: Buffer) => {
      size += d.length;
      if (size > maxBytes) { child.kill(); reject(new Error(`${tool} wrote more than ${maxBytes} bytes; back the database up with ${tool} directly.`)); return; }
      out.push(d);
    });
    child.stderr.on('data', (d: Buffer) => { err = (err + d.toString()).slice(-2000); });
    child.on('error', (e: NodeJS.ErrnoException) => reject(new Error(e.code === 'ENOENT'
      ? `${tool} is not installed: install Debian's postgresql-client (apt-get install postgresql-client), the same major version as the server or newer.`
      : `${tool} could not start: ${e.message}`)));
    child.on('close', (code) => (code === 0 ? resolve(Buffer.concat(out)) : reject(new Error(`${tool} failed (exit ${code}): ${err.trim().split('\n').slice(-3).join(' ')}`))));
  });
}

/** The whole database in pg_dump's custom format, without owners or grants (restorable as any user). */
export function dumpPostgres(url: string, maxBytes = 4 * 1024 ** 3): Promise<Buffer> {
  return run('pg_dump', ['--format=custom', '--no-owner', '--no-privileges'], url, maxBytes);
}

/**
 * Restores a custom-format dump into the database at `url` in one transaction: either every table
 * comes back or nothing changes. `clean` drops what the dump holds first (a restore over a database
 * that already has Gridset's tables).
 */
export async function restorePostgres(url: string, dumpFile: string, opts: { clean: boolean }): Promise<void> {
  const args = ['--no-owner', '--no-privileges', '--single-transaction', '--exit-on-error', `--dbname=${libpqEnv(url).PGDATABASE}`];
  if (opts.clean) args.push('--clean', '--if-exists');
  await run('pg_restore', [...args, dumpFile], url, 1024 * 1024);
}
