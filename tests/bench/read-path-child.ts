// A server for the read-path benchmark, in its own process so the load generator does not share its
// event loop: `app <sqlite|postgres://admin-url>` serves Gridset on a fresh database with the demo
// shop and 1,000 components; `bare <file.json>…` serves each file's bytes as they are.
import express from 'express';
import { mkdtempSync, readFileSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { randomBytes } from 'node:crypto';
import { createApp } from '../../server/app';
import { catalogRepo } from '../../server/db/catalog-repo';
import { migrate, openDb } from '../../server/db/knex';
import { DEMO_COMPONENTS, seedDemoDataIfEmpty } from '../../server/db/seed-demo';
import { ComponentInputSchema } from '../../shared/schemas/catalog';

const [mode, ...args] = process.argv.slice(2);
const ready = (server: import('node:http').Server, extra: object = {}) =>
  console.log(JSON.stringify({ base: `http://127.0.0.1:${(server.address() as AddressInfo).port}`, ...extra }));

if (mode === 'bare') {
  const bodies = args.map((f) => readFileSync(f));
  const bare = express();
  bodies.forEach((b, i) => bare.get(`/${i}`, (_req, res) => { res.type('application/json').send(b); }));
  const server = bare.listen(0, '127.0.0.1', () => ready(server));
} else {
  const target = args[0]!;
  const dataDir = mkdtempSync(path.join(os.tmpdir(), 'gridset-bench-'));
  let url = path.join(dataDir, 'bench.sqlite');
  let drop = async () => {};
  if (target.startsWith('postgres')) {
    const name = `gridset_bench_${randomBytes(4).toString('hex')}`;
    const admin = openDb(target);
    await admin.raw(`create database ${name}`);
    const u = new URL(target);
    u.pathname = `/${name}`;
    url = u.toString();
    drop = async () => {
      await admin.raw('select pg_terminate_backend(pid) from pg_stat_activity where datname = ? and pid <> pg_backend_pid()', [name]);
      await admin.raw(`drop database if exists ${name}`);
      await admin.destroy();
    };
  }
  const db = openDb(url);
  await migrate(db);
  await seedDemoDataIfEmpty(db);
  const template = ComponentInputSchema.parse(DEMO_COMPONENTS[0]);
  await db.transaction(async (trx) => {
    for (let i = 0; i < 1000 - DEMO_COMPONENTS.length; i++) await catalogRepo(trx).insertComponent({ ...template, code: `BENCH-${String(i).padStart(4, '0')}`, name: `Bench rail ${i}` });
  });
  const app = createApp({ db, sessionSecret: 'bench', dataDir, log: () => {} });
  const server = app.listen(0, '127.0.0.1', () => ready(server));
  process.on('SIGTERM', () => server.close(() => app.locals.whenIdle().then(() => db.destroy()).then(drop).then(() => process.exit(0))));
}
