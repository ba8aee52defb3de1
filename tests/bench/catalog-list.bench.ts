// Catalog list throughput: the real route (session, SQLite, JSON columns) against a bare Express
// route serving the same JSON from memory in the same process, both under autocannon.
import express from 'express';
import { ComponentInputSchema } from '../../shared/schemas/catalog';
import { catalogRepo } from '../../server/db/catalog-repo';
import { DEMO_COMPONENTS } from '../../server/db/seed-demo';
import { listen, load, printLoad, realServer } from './lib';

export async function run() {
  const { db, base, server, headers } = await realServer();
  const repo = catalogRepo(db);
  const template = ComponentInputSchema.parse(DEMO_COMPONENTS[0]);
  await db.transaction(async (trx) => {
    const rows = Array.from({ length: 1000 - DEMO_COMPONENTS.length }, (_, i) => ({ ...template, code: `BENCH-${String(i).padStart(4, '0')}`, name: `Bench rail ${i}` }));
    for (const c of rows) await catalogRepo(trx).insertComponent(c);
  });
  // The bare routes serve the same answers as parsed objects kept in memory.
  const page = await repo.listComponents({ limit: 50, offset: 0 });
  const full = await repo.listComponents({ offset: 0 });
  const bare = express();
  bare.get('/page', (_req, res) => { res.json(page); });
  bare.get('/full', (_req, res) => { res.json(full); });
  const bareServer = await listen(bare);

  const rows = [
    await load('bare page (50)', `${bareServer.base}/page`),
    await load('GET /api/components?limit=50', `${base}/api/components?limit=50`, headers),
    await load('bare full list (1000)', `${bareServer.base}/full`),
    await load('GET /api/components', `${base}/api/components`, headers),
  ];
  printLoad(rows);
  const [bp, rp, bf, rf] = rows as [typeof rows[0], typeof rows[0], typeof rows[0], typeof rows[0]];
  console.log(`page ratio ${(rp.rps / bp.rps).toFixed(2)} (target >= 0.5), page p99 ${rp.p99} ms (target < 20 ms)`);
  console.log(`full-list ratio ${(rf.rps / bf.rps).toFixed(2)} (target >= 0.5), full list ${(rf.bytesPerReq / 1024).toFixed(0)} KB`);
  server.close();
  bareServer.server.close();
  await db.destroy();
}
