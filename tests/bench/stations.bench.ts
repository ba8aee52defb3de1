// Station engine speed: the pure evaluation of 2,000 placements (16,000 stations), and the
// …/stations route of a 500-station template under autocannon beside a bare in-memory route.
import express from 'express';
import { evaluateTemplate } from '../../shared/stations/evaluate-template';
import { applyTransform, placementTransform } from '../../shared/geometry/transform';
import { railBands, railBandsWithStations } from '../shared/station-fixtures';
import { catalogRepo } from '../../server/db/catalog-repo';
import { templatesRepo } from '../../server/db/templates-repo';
import { templatesService } from '../../server/services/templates';
import { usersRepo } from '../../server/db/users-repo';
import { auditRepo } from '../../server/db/audit-repo';
import { namingRepo } from '../../server/db/naming-repo';
import { namingService } from '../../server/services/naming';
import { listen, load, printLoad, realServer, timeMedian } from './lib';

export async function run() {
  const big = railBands(100);
  let stations = 0;
  const engine = await timeMedian(15, () => { stations = evaluateTemplate(big).stations.length; });
  // Bare baseline: only the placement transforms of the same 16,000 stop points, no checks.
  const stops = big.components[0]!.stops;
  const bare = await timeMedian(15, () => {
    let sum = 0;
    for (const p of big.placements) {
      if (!p.stopsInUse?.length) continue;
      const t = placementTransform(p.hole, p.rotation, big.plate.pitch);
      for (const i of p.stopsInUse) sum += applyTransform(t, stops[i]!).x;
    }
    return sum;
  });
  console.log(`evaluateTemplate: ${big.placements.length} placements, ${stations} stations: median ${engine.toFixed(1)} ms (target < 50 ms); bare transforms ${bare.toFixed(2)} ms; ratio ${(engine / bare).toFixed(1)}×`);

  const { db, base, server, headers } = await realServer();
  // Imported components meet the shop's naming convention (demo: JR-{width} with 3 decimals).
  const raw = railBandsWithStations(4, 500);
  const rename = (code: string) => (code === 'JR-16' ? 'JR-1.250' : code);
  const content = { ...raw, components: raw.components.map((c) => ({ ...c, code: rename(c.code) })), placements: raw.placements.map((p) => ({ ...p, component: rename(p.component) })) };
  const service = templatesService({ db, templates: templatesRepo(db), catalog: catalogRepo(db), naming: namingService(namingRepo(db), auditRepo(db)), audit: auditRepo(db) });
  const lead = (await usersRepo(db).findWithHashByEmail('lead@gridset.test'))!;
  const { id } = await service.importFile(lead, { ...content, name: 'Bench 500' });
  const answer = await (await fetch(`${base}/api/templates/${id}/versions/1/stations`, { headers })).json();
  if (answer.stations.length !== 500) throw new Error(`expected 500 stations, got ${answer.stations.length}`);
  const bareApp = express();
  bareApp.get('/stations', (_req, res) => { res.json(answer); });
  const bareServer = await listen(bareApp);
  const rows = [
    await load('bare stations (500)', `${bareServer.base}/stations`),
    await load('GET …/versions/1/stations (500)', `${base}/api/templates/${id}/versions/1/stations`, headers),
  ];
  printLoad(rows);
  console.log(`stations route ratio ${(rows[1]!.rps / rows[0]!.rps).toFixed(2)} (target >= 0.5)`);
  server.close();
  bareServer.server.close();
  await db.destroy();
}
