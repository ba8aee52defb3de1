import type { Db } from './knex';
import { ComponentInputSchema, PlateInputSchema, type ComponentInput, type PlateInput } from '../../shared/schemas/catalog';
import type { Role } from '../../shared/schemas/auth';
import type { Outline } from '../../shared/schemas/geometry';
import { hashPassword } from '../services/passwords';
import { catalogRepo } from './catalog-repo';
import { settingsRepo, DEFAULT_SETTINGS } from './settings-repo';
import { templatesRepo } from './templates-repo';
import { auditRepo } from './audit-repo';
import { namingRepo } from './naming-repo';
import { DEMO_CONVENTION } from '../../shared/naming/conventions';
import { usersRepo } from './users-repo';
import { templatesService } from '../services/templates';
import { namingService } from '../services/naming';
import { jobsService } from '../services/jobs';
import { jobsRepo } from './jobs-repo';
import type { Placement, SharedOffset } from '../../shared/schemas/template';

/** Demo only: an invented shop; every account shares this password, so never keep them on a real server. */
export const DEMO_PASSWORD = 'gridset-demo';

export const DEMO_USERS: { email: string; name: string; role: Role }[] = [
  { email: 'admin@gridset.test', name: 'Avery Admin', role: 'admin' },
  { email: 'lead@gridset.test', name: 'Lane Lead', role: 'lead' },
  { email: 'programmer@gridset.test', name: 'Parker Programmer', role: 'programmer' },
  { email: 'reviewer@gridset.test', name: 'Rowan Reviewer', role: 'reviewer' },
  { email: 'operator@gridset.test', name: 'Oakley Operator', role: 'operator' },
];

const rect = (x0: number, y0: number, x1: number, y1: number, layer?: string): Outline['paths'][number] => ({
  layer,
  closed: true,
  points: [{ x: x0, y: y0 }, { x: x1, y: y0 }, { x: x1, y: y1 }, { x: x0, y: y1 }],
});

export const DEMO_PLATES: PlateInput[] = [
  { code: 'GP-IN-12x8', name: 'Grid plate 24 × 16 in, 2 in pitch', unit: 'in', pitch: 2, columns: 12, rows: 8, holeDiameter: 0.5, thread: '1/2-13', edgeMargin: 1, notes: 'Bushed dowel holes on a 2.000 in grid; datum hole at the front-left corner.' },
  { code: 'GP-MM-10x7', name: 'Grid plate 500 × 350 mm, 50 mm pitch', unit: 'mm', pitch: 50, columns: 10, rows: 7, holeDiameter: 12, thread: 'M12', edgeMargin: 25, notes: 'Metric plate for the horizontal cell.' },
];

// Inch edge-clamp model used by the demo jaw rails (invented figures of a plausible low-profile clamp).
const demoClamp = { acceptBelow: 0.03, acceptAbove: 0.03, topHeight: 0.16, topSlope: 0.5, gripLow: 0.04, gripHigh: 0.16, gripSlope: 0.5, slotSlop: 0.015 };

export const DEMO_COMPONENTS: ComponentInput[] = [
  {
    code: 'CR-8', kind: 'center-rail', name: 'Center rail, 8 stops at 1.000 in', unit: 'in', layer: 'FX-CR-8', seatHeight: 0.5, jawTop: 0.19,
    dowels: [{ x: 0, y: 0 }, { x: 8, y: 0 }],
    stops: Array.from({ length: 8 }, (_, k) => ({ x: 0.5 + k, y: 0.375, angle: 0, face: 0 })),
    jawFaces: [{ x: 0, y: 0.375, normal: 90 }],
    outline: { paths: [rect(-0.5, -0.375, 8.5, 0.375)], circles: [{ x: 0, y: 0, r: 0.25 }, { x: 8, y: 0, r: 0.25 }] },
    notes: 'Fixed jaw face 0.375 in in front of the dowel line.',
  },
  {
    code: 'JR-1.000', kind: 'jaw-rail', name: 'Jaw rail, holds 1.000 in one row out', unit: 'in', layer: 'FX-JR-1000',
    dowels: [{ x: 0, y: 0 }, { x: 8, y: 0 }],
    jawFaces: [{ x: 0, y: -0.625, normal: 270 }],
    clamp: demoClamp,
    outline: { paths: [rect(-0.5, -0.625, 8.5, 0.375)], circles: [{ x: 0, y: 0, r: 0.25 }, { x: 8, y: 0, r: 0.25 }] },
    notes: 'Clamp faces 0.625 in behind the dowel line; one grid row from CR-8 it holds 1.000 in.',
  },
  {
    code: 'JR-1.500', kind: 'jaw-rail', name: 'Jaw rail, holds 1.500 in one row out', unit: 'in', layer: 'FX-JR-1500',
    dowels: [{ x: 0, y: 0 }, { x: 8, y: 0 }],
    jawFaces: [{ x: 0, y: -0.125, normal: 270 }],
    clamp: { ...demoClamp, acceptBelow: 0.035, acceptAbove: 0.035 },
    outline: { paths: [rect(-0.5, -0.125, 8.5, 0.5)], circles: [{ x: 0, y: 0, r: 0.25 }, { x: 8, y: 0, r: 0.25 }] },
    notes: 'Clamp faces 0.125 in behind the dowel line; one grid row from CR-8 it holds 1.500 in.',
  },
  {
    code: 'SR-4', kind: 'short-rail', name: 'Short rail, 4 stops at 1.000 in', unit: 'in', layer: 'FX-SR-4', seatHeight: 0.5, jawTop: 0.19,
    dowels: [{ x: 0, y: 0 }, { x: 4, y: 0 }],
    stops: Array.from({ length: 4 }, (_, k) => ({ x: 0.5 + k, y: 0.375, angle: 0, face: 0 })),
    jawFaces: [{ x: 0, y: 0.375, normal: 90 }],
    outline: { paths: [rect(-0.5, -0.375, 4.5, 0.375)], circles: [{ x: 0, y: 0, r: 0.25 }, { x: 4, y: 0, r: 0.25 }] },
    notes: 'Sits across the long rails to use the plate ends.',
  },
  {
    code: 'JR-S4-1.000', kind: 'jaw-rail', name: 'Short jaw rail, holds 1.000 in one row out', unit: 'in', layer: 'FX-JR-S4',
    dowels: [{ x: 0, y: 0 }, { x: 4, y: 0 }],
    jawFaces: [{ x: 0, y: -0.625, normal: 270 }],
    clamp: demoClamp,
    outline: { paths: [rect(-0.5, -0.625, 4.5, 0.375)], circles: [{ x: 0, y: 0, r: 0.25 }, { x: 4, y: 0, r: 0.25 }] },
  },
  {
    code: 'VS-6', kind: 'vise', name: 'Self-centering vise, 6 in jaws', unit: 'in', layer: 'FX-VS-6', seatHeight: 1.25, jawTop: 0.375,
    dowels: [{ x: 0, y: 0 }, { x: 4, y: 0 }],
    stops: [{ x: -1, y: 1.25, angle: 0, face: 0 }],
    jawFaces: [{ x: -1, y: 1.25, normal: 90 }],
    outline: { paths: [rect(-1, -0.75, 5, 2.75)], circles: [] },
  },
  {
    code: 'ST-0.5', kind: 'stop', name: 'Dowel stop, 0.500 in', unit: 'in', layer: 'FX-ST',
    dowels: [{ x: 0, y: 0 }],
    stops: [{ x: 0.25, y: 0, angle: 0 }],
    outline: { paths: [], circles: [{ x: 0, y: 0, r: 0.25 }] },
  },
  {
    code: 'CR-M-200', kind: 'center-rail', name: 'Metric center rail, 4 stops at 50 mm', unit: 'mm', layer: 'FX-CRM-200', seatHeight: 12, jawTop: 6,
    dowels: [{ x: 0, y: 0 }, { x: 200, y: 0 }],
    stops: Array.from({ length: 4 }, (_, k) => ({ x: 25 + 50 * k, y: 10, angle: 0, face: 0 })),
    jawFaces: [{ x: 0, y: 10, normal: 90 }],
    outline: { paths: [rect(-12, -10, 212, 10)], circles: [{ x: 0, y: 0, r: 6 }, { x: 200, y: 0, r: 6 }] },
  },
  {
    code: 'JR-M-30', kind: 'jaw-rail', name: 'Metric jaw rail, holds 30 mm one row out', unit: 'mm', layer: 'FX-JRM-30',
    dowels: [{ x: 0, y: 0 }, { x: 200, y: 0 }],
    jawFaces: [{ x: 0, y: -10, normal: 270 }],
    clamp: { acceptBelow: 0.8, acceptAbove: 0.8, topHeight: 4, topSlope: 0.5, gripLow: 1, gripHigh: 4, gripSlope: 0.5, slotSlop: 0.4 },
    outline: { paths: [rect(-12, -10, 212, 12)], circles: [{ x: 0, y: 0, r: 6 }, { x: 200, y: 0, r: 6 }] },
  },
];

/** Loads the invented demo shop into a new, empty database; does nothing when users exist. */
export async function seedDemoDataIfEmpty(db: Db): Promise<boolean> {
  const existing = await db('users').count<{ n: number }[]>({ n: '*' });
  if (Number(existing[0]?.n ?? 0) > 0) return false;
  const hashes = await Promise.all(DEMO_USERS.map(() => hashPassword(DEMO_PASSWORD)));
  await db.transaction(async (trx) => {
    await trx('users').insert(DEMO_USERS.map((u, i) => ({ email: u.email, name: u.name, role: u.role, password_hash: hashes[i] })));
    const trxCatalog = catalogRepo(trx);
    for (const p of DEMO_PLATES) await trxCatalog.insertPlate(PlateInputSchema.parse(p));
    for (const c of DEMO_COMPONENTS) await trxCatalog.insertComponent(ComponentInputSchema.parse(c));
    await settingsRepo(trx).put({ ...DEFAULT_SETTINGS, shopName: 'Brightwater Fixture Works (demo)' });
    const { version: _v, ...rules } = DEMO_CONVENTION;
    await namingRepo(trx).save(rules, null, trx);
  });
  await seedDemoTemplates(db);
  return true;
}

const allStops = (n: number) => Array.from({ length: n }, (_, k) => k);

/**
 * Demo layouts. Inch plate, 20 stations: two long rail sets (CR-8 with a 1.000 in jaw rail one
 * grid row out, CR-8 with a 1.500 in jaw rail) and a short rail turned 90° with its jaw rail, all
 * from one shared offset on hole (1, 1). Metric plate: one rail pair, 4 stations.
 */
export const DEMO_TEMPLATES: { name: string; plate: string; placements: Placement[]; sharedOffset: SharedOffset; release: boolean }[] = [
  {
    name: 'Bracket 1 in bar, 20 up',
    plate: 'GP-IN-12x8',
    sharedOffset: { kind: 'hole', hole: { col: 1, row: 1 }, name: 'G54' },
    release: true,
    placements: [
      { id: 'A-CR', component: 'CR-8', hole: { col: 1, row: 1 }, rotation: 0, stopsInUse: allStops(8) },
      { id: 'A-JR', component: 'JR-1.000', hole: { col: 1, row: 2 }, rotation: 0, stopsInUse: [] },
      { id: 'B-CR', component: 'CR-8', hole: { col: 1, row: 4 }, rotation: 0, stopsInUse: allStops(8) },
      { id: 'B-JR', component: 'JR-1.500', hole: { col: 1, row: 5 }, rotation: 0, stopsInUse: [] },
      { id: 'C-SR', component: 'SR-4', hole: { col: 9, row: 1 }, rotation: 90, stopsInUse: allStops(4) },
      { id: 'C-JR', component: 'JR-S4-1.000', hole: { col: 8, row: 1 }, rotation: 90, stopsInUse: [] },
    ],
  },
  {
    name: 'Metric clip, 4 up',
    plate: 'GP-MM-10x7',
    sharedOffset: { kind: 'hole', hole: { col: 1, row: 1 }, name: 'G54' },
    release: true,
    placements: [
      { id: 'M-CR', component: 'CR-M-200', hole: { col: 1, row: 1 }, rotation: 0, stopsInUse: allStops(4) },
      { id: 'M-JR', component: 'JR-M-30', hole: { col: 1, row: 2 }, rotation: 0, stopsInUse: [] },
    ],
  },
];

async function seedDemoTemplates(db: Db) {
  const users = usersRepo(db);
  const lead = (await users.findWithHashByEmail('lead@gridset.test'))!;
  const catalog = catalogRepo(db);
  const service = templatesService({ db, templates: templatesRepo(db), catalog, naming: namingService(namingRepo(db), auditRepo(db)), audit: auditRepo(db) });
  for (const t of DEMO_TEMPLATES) {
    const plate = (await catalog.plateByCode(t.plate))!;
    const created = await service.create(lead, { name: t.name, plateId: plate.id });
    await service.saveDraft(lead, created.id, 1, { revision: 1, placements: t.placements, sharedOffset: t.sharedOffset, numbering: { order: 'row-by-row' } });
    if (t.release) await service.release(lead, created.id, 1);
  }
  await seedDemoJob(db, service, lead);
}

/** An invented part on the inch layout, with a radiused end, and one lot of measured bars checked. */
async function seedDemoJob(db: Db, templates: ReturnType<typeof templatesService>, lead: Parameters<ReturnType<typeof templatesService>['create']>[0]) {
  const audit = auditRepo(db);
  const jobs = jobsService({ db, jobs: jobsRepo(db), templates, audit });
  const job = await jobs.create(lead, {
    name: 'Bracket BR-1001, night run', partNumber: 'BR-1001', partRevision: 'B', templateId: 1, version: 1,
    stock: { width: 1, thickness: 0.5, length: 0.875, material: '6061-T6 bar' },
    carrier: 0.25, clearance: 0.03, minBite: 0.06, cycleMinutes: 13, loadMinutes: 10, notes: 'Demo job: invented part.', partRotation: 0,
  });
  // 0.850 in along the rail × 1.000 in across the jaws (the width held), with a 0.100 in radius on the
  // far corners (bulge tan(22.5°) = 0.414214 for a quarter arc, DXF Reference group 42) and a 0.257 in
  // bore; datum at the corner that sits against the stop and the fixed jaw.
  const q = 0.414214;
  const outline = {
    paths: [{ closed: true, points: [{ x: 0, y: 0 }, { x: 0.75, y: 0, bulge: q }, { x: 0.85, y: 0.1 }, { x: 0.85, y: 0.9, bulge: q }, { x: 0.75, y: 1 }, { x: 0, y: 1 }] }],
    circles: [{ x: 0.425, y: 0.5, r: 0.1285 }],
  };
  await jobs.setPartOutline(lead, job.id, outline, { name: 'BR-1001-rev-B.dxf', size: 0, sha256: 'demo', unit: 'in', datum: { x: 0, y: 0 } });
  const operator = (await usersRepo(db).findWithHashByEmail('operator@gridset.test'))!;
  const widths = [0.998, 1.004, 1.012, 1.021, 1.036, 0.991, 1.043, 0.962, 1.009, 1.028];
  // No jawPlacement: the bars are checked against every rail the job uses (A-JR and C-JR, both 1.000 in).
  await jobs.stockCheck(operator, job.id, {
    bars: widths.map((w, i) => ({ id: `L7-${String(i + 1).padStart(2, '0')}`, width: w, thickness: 0.5 + ((i % 3) - 1) * 0.004, cornerRadius: i === 7 ? 0.05 : 0.02 })),
  });
}
