import { describe, expect, it } from 'vitest';
import type { Role } from '../../shared/schemas/auth';
import { allRows, appWithEveryRole, refuseAuditAction } from './test-app';

/**
 * Every write keeps its audit line in the same transaction: after success both are there; when
 * the audit insert fails, the write is gone too. The failure is forced by an SQLite trigger that
 * aborts the audit insert for one action (SQLite documentation, "CREATE TRIGGER" and "The RAISE()
 * function": RAISE(ABORT) undoes the statement and the error reaches the caller, whose
 * transaction then rolls back).
 */
const ctx = appWithEveryRole();
const as = (r: Role) => ctx.agents.get(r)!;

interface Case {
  action: string;
  tables: string[];
  /** Work that must not be audited (reading, preparing a draft), run once before both calls. */
  prepare?: () => Promise<unknown>;
  call: (prepared: unknown) => Promise<{ status: number }>;
}

const rail = { kind: 'center-rail', name: 'Rail', unit: 'in', dowels: [{ x: 0, y: 0 }, { x: 8, y: 0 }], stops: [], jawFaces: [] };
const newDraft = async () => (await as('programmer').post('/api/templates/1/versions', { from: 1 }).expect(201)).body;

const job = {
  name: 'Audit run', partNumber: 'AU-1', partRevision: 'A', templateId: 1, version: 1,
  stock: { width: 1, thickness: 0.5, length: 2.75, material: '6061-T6' },
  carrier: 0.25, clearance: 0.03, minBite: 0.06, cycleMinutes: 13, loadMinutes: 10,
};
const newJob = async () => (await as('programmer').post('/api/jobs', job).expect(201)).body.id as number;

/** Invites someone and answers the token from the mailed link (the outbox keeps the mail). */
async function invitedToken(email: string): Promise<string> {
  await as('admin').post('/api/users/invite', { email, name: 'Audit Three', role: 'operator' }).expect(201);
  const mail = (await as('admin').get(`/api/outbox?q=${encodeURIComponent(email)}`).expect(200)).body.items.find((m: { to: string }) => m.to === email);
  return /\/set-password\?token=([A-Za-z0-9_-]+)/.exec(mail.text)![1]!;
}

const plate = (code: string) => ({ code, name: 'Audit plate', unit: 'in', pitch: 2, columns: 6, rows: 4, holeDiameter: 0.5, thread: '1/2-13', notes: '' });
const newPlate = async (code: string) => (await as('programmer').post('/api/plates', plate(code)).expect(201)).body.id as number;

const CASES: Case[] = [
  { action: 'plate.create', tables: ['plates'], call: () => as('programmer').post('/api/plates', plate('AUDIT-PLATE')) },
  { action: 'plate.update', tables: ['plates'], prepare: () => newPlate('AUDIT-PLATE-2'), call: (id) => as('programmer').put(`/api/plates/${id}`, { ...plate('AUDIT-PLATE-2'), notes: 'Re-measured.' }) },
  { action: 'plate.delete', tables: ['plates'], prepare: () => newPlate('AUDIT-PLATE-3'), call: (id) => as('lead').delete(`/api/plates/${id}`) },
  { action: 'component.create', tables: ['components'], call: () => as('lead').post('/api/components', { ...rail, code: 'CR-9', layer: 'FX-CR-9' }) },
  {
    action: 'naming.save', tables: ['naming_conventions'],
    prepare: async () => { const { version: _v, ...rules } = (await as('lead').get('/api/naming/convention').expect(200)).body; return rules; },
    call: (rules) => as('lead').put('/api/naming/convention', rules as object),
  },
  { action: 'settings.save', tables: ['settings'], prepare: async () => { const now = (await as('lead').get('/api/settings').expect(200)).body; return { ...now, shopName: `${now.shopName} (audited)` }; }, call: (s) => as('lead').put('/api/settings', s as object) },
  { action: 'user.create', tables: ['users'], call: () => as('admin').post('/api/users', { email: 'audit.one@gridset.test', name: 'Audit One', role: 'operator', password: 'a long enough password' }) },
  {
    action: 'user.update', tables: ['users'],
    prepare: async () => (await as('admin').get('/api/users').expect(200)).body.items.find((u: { role: string }) => u.role === 'reviewer').id,
    call: (id) => as('admin').patch(`/api/users/${id}`, { name: 'Renamed Reviewer' }),
  },
  { action: 'user.invite', tables: ['users', 'user_tokens'], call: () => as('admin').post('/api/users/invite', { email: 'audit.two@gridset.test', name: 'Audit Two', role: 'programmer' }) },
  { action: 'version.save', tables: ['template_versions', 'template_version_components'], prepare: newDraft, call: (v) => as('programmer').put(`/api/templates/1/versions/${(v as { version: number }).version}`, v as object) },
  { action: 'version.submit', tables: ['template_versions', 'version_reviews'], prepare: newDraft, call: (v) => as('programmer').post(`/api/templates/1/versions/${(v as { version: number }).version}/submit`) },
  {
    action: 'user.invite-accepted', tables: ['users', 'user_tokens'], prepare: () => invitedToken('audit.three@gridset.test'),
    call: (token) => as('admin').http.post('/api/auth/set-password').set('X-CSRF-Token', as('admin').token).send({ token, password: 'a long enough password' }),
  },
  { action: 'job.create', tables: ['jobs'], call: () => as('programmer').post('/api/jobs', job) },
  { action: 'job.update', tables: ['jobs'], prepare: newJob, call: (id) => as('lead').put(`/api/jobs/${id}`, { ...job, name: 'Audit run, renamed' }) },
  {
    action: 'job.stock-check', tables: ['job_stock_checks'], prepare: newJob,
    call: (id) => as('operator').post(`/api/jobs/${id}/stock-check`, { jawPlacement: 'A-JR', bars: [{ id: 'B1', width: 1, thickness: 0.5, cornerRadius: 0.02 }] }),
  },
  {
    action: 'job.bars-draft', tables: ['job_bar_drafts'], prepare: newJob,
    call: (id) => as('operator').put(`/api/jobs/${id}/bars-draft`, { revision: 0, rows: [{ id: 'B1', width: '1.002', thickness: '0.5', cornerRadius: '0.02' }] }),
  },
];

const snapshot = async (tables: string[]) => JSON.stringify(await Promise.all(tables.map((name) => allRows(ctx.t.db, name))));
const auditCount = async (action: string) => Number(((await ctx.t.db('audit').where({ action }).count({ n: '*' })) as [{ n: number }])[0].n);

describe('every write and its audit line share one transaction', () => {
  it.each(CASES)('$action', async (c) => {
    const prepared = await c.prepare?.();
    const before = await snapshot(c.tables);
    const audits = await auditCount(c.action);

    const allow = await refuseAuditAction(ctx.t.db, c.action);
    try {
      const failed = await c.call(prepared);
      expect(failed.status).toBeGreaterThanOrEqual(400);
    } finally {
      await allow();
    }
    expect(await snapshot(c.tables), 'the write is undone with its audit line').toBe(before);
    expect(await auditCount(c.action)).toBe(audits);

    const ok = await c.call(prepared);
    expect(ok.status, JSON.stringify(ok)).toBeLessThan(300);
    expect(await snapshot(c.tables)).not.toBe(before);
    expect(await auditCount(c.action)).toBe(audits + 1);
  });
});
