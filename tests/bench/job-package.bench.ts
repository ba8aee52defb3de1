// The job package of a 200-station job (CSV, XLSX, DXF, SVG, G52 file, setup sheet, manifest with
// hashes), against a bare zip of the same station CSV as baseline.
import JSZip from 'jszip';
import { railBands } from '../shared/station-fixtures';
import { catalogRepo } from '../../server/db/catalog-repo';
import { templatesRepo } from '../../server/db/templates-repo';
import { usersRepo } from '../../server/db/users-repo';
import { auditRepo } from '../../server/db/audit-repo';
import { namingRepo } from '../../server/db/naming-repo';
import { jobsRepo } from '../../server/db/jobs-repo';
import { templatesService } from '../../server/services/templates';
import { namingService } from '../../server/services/naming';
import { jobsService } from '../../server/services/jobs';
import { jobPackage } from '../../server/services/job-package';
import { stationsCsv } from '../../server/services/station-files';
import { realServer, timeMedian } from './lib';

export async function run() {
  const { db, server } = await realServer();
  const audit = auditRepo(db);
  const templates = templatesService({ db, templates: templatesRepo(db), catalog: catalogRepo(db), naming: namingService(namingRepo(db), audit), audit });
  const lead = (await usersRepo(db).findWithHashByEmail('lead@gridset.test'))!;
  const c = railBands(2);
  // 20 center rails × 10 stops in use = 200 stations.
  c.placements = c.placements.map((p) => (p.stopsInUse?.length ? { ...p, stopsInUse: Array.from({ length: 10 }, (_, k) => k) } : p));
  const { id } = await templates.importFile(lead, { ...c, name: 'Bench 200' });
  await templates.release(lead, id, 1, 'Benchmark layout: names are generated, not the shop convention.');
  const jobs = jobsService({ db, jobs: jobsRepo(db), templates, audit });
  const job = await jobs.create(lead, { name: 'Bench job', partNumber: 'P-200', partRevision: '', templateId: id, version: 1, stock: { width: 1.25, thickness: 0.5, length: 0.9, material: '' }, carrier: 0.25, clearance: 0.03, minBite: 0.06, cycleMinutes: 10, loadMinutes: 5, notes: '', partRotation: 0 });
  const outline = { paths: [{ closed: true, points: [{ x: 0, y: 0 }, { x: 0.8, y: 0 }, { x: 0.8, y: 1.25 }, { x: 0, y: 1.25 }] }], circles: [] };
  await jobs.setPartOutline(lead, job.id, outline, { name: 'p.dxf', size: 0, sha256: 'bench', unit: 'in', datum: { x: 0, y: 0 } });
  const detail = await jobs.detail(job.id);
  const version = await jobs.version(job.id);
  let bytes = 0;
  const pkg = await timeMedian(5, async () => { bytes = (await jobPackage(detail, version)).length; });
  const bare = await timeMedian(5, async () => { const z = new JSZip(); z.file('stations.csv', stationsCsv(version, version.stations)); await z.generateAsync({ type: 'nodebuffer', compression: 'DEFLATE' }); });
  console.log(`job package of a ${version.stations.length}-station job: median ${pkg.toFixed(0)} ms (target < 2000 ms), ${(bytes / 1024).toFixed(0)} KB; bare zip of the station CSV ${bare.toFixed(1)} ms`);
  server.close();
  await db.destroy();
}
