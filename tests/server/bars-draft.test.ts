import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { allRows, makeTestApp, refuseAuditAction, tableCounts, type Agent, type TestApp } from './test-app';

/**
 * The bars typed for a job, kept on the server until a stock check uses them. Saves are
 * conditional on the revision the screen last read, so a second screen's save is answered 409
 * Conflict (RFC 9110 §15.5.10: "the request could not be completed due to a conflict with the
 * current state of the target resource") instead of silently overwriting (the lost-update problem
 * RFC 9110 §13.1.1 describes for conditional requests). Every refused request writes nothing.
 */
let t: TestApp;
let operator: Agent;
let lead: Agent;
let programmer: Agent;
let reviewer: Agent;
beforeAll(async () => {
  t = await makeTestApp();
  [operator, lead, programmer, reviewer] = await Promise.all([t.agent('operator'), t.agent('lead'), t.agent('programmer'), t.agent('reviewer')]);
});
afterAll(async () => { await t.close(); });

const job = {
  name: 'Draft run', partNumber: 'DR-1', partRevision: 'A', templateId: 1, version: 1,
  stock: { width: 1, thickness: 0.5, length: 2.75, material: '6061-T6' },
  carrier: 0.25, clearance: 0.03, minBite: 0.06, cycleMinutes: 13, loadMinutes: 10,
};
const newJob = async () => (await programmer.post('/api/jobs', job).expect(201)).body.id as number;

/** Cells as the bar table holds them, text as typed (a trailing zero and a half-typed "1." kept). */
const rows = [
  { id: 'B1', width: '1.0000', thickness: '0.502', cornerRadius: '0.02', autoId: true },
  { id: 'B2', width: '1.', thickness: '', cornerRadius: '', autoId: true },
  { id: 'lot 7 / bar 3', width: '0.998 in', thickness: '0.5', cornerRadius: '0', autoId: false },
];
const draftUrl = (id: number) => `/api/jobs/${id}/bars-draft`;
const draftOf = async (id: number) => (await operator.get(`/api/jobs/${id}`).expect(200)).body.barsDraft;
const counts = () => tableCounts(t.db, ['job_bar_drafts', 'audit']);

describe('the bars draft of a job', () => {
  it('is null until saved, then comes back in GET /api/jobs/:id exactly as typed, with the other fields kept', async () => {
    const id = await newJob();
    const before = (await operator.get(`/api/jobs/${id}`).expect(200)).body;
    expect(before.barsDraft).toBeNull();
    const saved = await operator.put(draftUrl(id), { rows, revision: 0 }).expect(200);
    const me = (await operator.get('/api/auth/me').expect(200)).body;
    expect(saved.body).toMatchObject({ rows, revision: 1, by: me.name ?? me.user.name });
    expect(Date.parse(saved.body.updatedAt)).not.toBeNaN();
    const after = (await operator.get(`/api/jobs/${id}`).expect(200)).body;
    expect(after.barsDraft).toEqual(saved.body);
    // Every field the job answered before is still there, with the same value.
    const { barsDraft: _a, ...rest } = after;
    const { barsDraft: _b, ...restBefore } = before;
    expect(rest).toEqual(restBefore);
    // One audit line per save, in its transaction.
    const audit = await t.db('audit').where({ action: 'job.bars-draft', object_id: String(id) });
    expect(audit).toHaveLength(1);
  });

  it('answers 409 to a save from a screen holding an older revision, and writes nothing', async () => {
    const id = await newJob();
    const first = (await operator.put(draftUrl(id), { rows, revision: 0 }).expect(200)).body;
    // Two screens (a phone and the desk) both loaded revision 1.
    const phone = await lead.put(draftUrl(id), { rows: rows.slice(0, 1), revision: first.revision }).expect(200);
    expect(phone.body.revision).toBe(first.revision + 1);
    const snapshot = JSON.stringify(await allRows(t.db, 'job_bar_drafts'));
    const n = await counts();
    const desk = await operator.put(draftUrl(id), { rows, revision: first.revision });
    expect(desk.status).toBe(409);
    expect(desk.body.error.code).toBe('conflict');
    expect(desk.body.error.message).toMatch(/reload the page/);
    expect(desk.body.error.details).toMatchObject({ revision: phone.body.revision, checked: false });
    // A screen that believes there is no draft yet is stale too.
    expect((await operator.put(draftUrl(id), { rows, revision: 0 })).status).toBe(409);
    expect(JSON.stringify(await allRows(t.db, 'job_bar_drafts'))).toBe(snapshot);
    expect(await counts()).toEqual(n);
    expect((await draftOf(id)).rows).toEqual(rows.slice(0, 1).map((r) => ({ ...r })));
  });

  it('is cleared by the stock check that stores the bars, in the same transaction', async () => {
    const id = await newJob();
    const saved = (await operator.put(draftUrl(id), { rows, revision: 0 }).expect(200)).body;
    const bars = [{ id: 'B1', width: 1, thickness: 0.502, cornerRadius: 0.02 }];

    // The check's audit line refused: the check and the clearing roll back together.
    const allow = await refuseAuditAction(t.db, 'job.stock-check');
    try {
      expect((await operator.post(`/api/jobs/${id}/stock-check`, { bars })).status).toBeGreaterThanOrEqual(500);
    } finally {
      await allow();
    }
    expect(await draftOf(id)).toEqual(saved);
    expect((await operator.get(`/api/jobs/${id}`)).body.stockChecks).toHaveLength(0);

    await operator.post(`/api/jobs/${id}/stock-check`, { bars }).expect(200);
    const job2 = (await operator.get(`/api/jobs/${id}`).expect(200)).body;
    expect(job2.barsDraft).toBeNull();
    expect(job2.stockChecks).toHaveLength(1);

    // A screen still holding the draft it loaded before the check is told the bars were checked.
    const late = await operator.put(draftUrl(id), { rows, revision: saved.revision });
    expect(late.status).toBe(409);
    expect(late.body.error.details.checked).toBe(true);
    expect(late.body.error.message).toMatch(/checked/);
    // A fresh screen (no draft seen) starts the next draft; its revision keeps counting up.
    const next = await operator.put(draftUrl(id), { rows: rows.slice(1), revision: 0 }).expect(200);
    expect(next.body.revision).toBeGreaterThan(saved.revision);
    // The old revision number cannot overwrite the new draft either.
    expect((await operator.put(draftUrl(id), { rows, revision: saved.revision })).status).toBe(409);
  });

  it('refuses bad bodies with one sentence and writes nothing', async () => {
    const id = await newJob();
    const row = rows[0]!;
    const n = await counts();
    const cases: [string, unknown, RegExp][] = [
      ['not an object', [rows], /must be an object with rows and revision/],
      ['no revision', { rows }, /revision must be a whole number/],
      ['a negative revision', { rows, revision: -1 }, /revision must be zero or more/],
      ['a fractional revision', { rows, revision: 1.5 }, /revision must be a whole number/],
      ['a revision too large for an integer column', { rows, revision: 2 ** 31 }, /at most 2147483647/],
      ['rows not a list', { rows: 'B1\t1\t0.5\t0', revision: 0 }, /rows must be a list/],
      ['a row that is not an object', { rows: ['B1'], revision: 0 }, /Each draft row must be an object/],
      ['a number in a size cell', { rows: [{ ...row, width: 1 }], revision: 0 }, /A width cell must be text/],
      ['an id of 65 characters', { rows: [{ ...row, id: 'x'.repeat(65) }], revision: 0 }, /A bar id must be 64 characters or fewer/],
      ['a size cell of 33 characters', { rows: [{ ...row, thickness: '1'.repeat(33) }], revision: 0 }, /A thickness cell must be 32 characters or fewer/],
      ['a tab inside a cell', { rows: [{ ...row, cornerRadius: '0.02\t0.03' }], revision: 0 }, /must not hold control characters/],
      ['10,001 rows', { rows: Array.from({ length: 10_001 }, (_, i) => ({ id: `B${i + 1}`, width: '1', thickness: '0.5', cornerRadius: '0' })), revision: 0 }, /at most 10,000 bars/],
    ];
    for (const [what, body, message] of cases) {
      const res = await operator.put(draftUrl(id), body as object);
      expect(res.status, what).toBe(400);
      expect(res.body.error.message, what).toMatch(message);
      // One sentence: ends at the first full stop (the validation prefix adds none of its own).
      expect(res.body.error.message.trim(), what).toMatch(/[.]$/);
    }
    expect(await counts()).toEqual(n);
    expect(await draftOf(id)).toBeNull();
  });

  it('takes the full 10,000 rows at the longest cells, and 404s a job that does not exist', async () => {
    const id = await newJob();
    const big = Array.from({ length: 10_000 }, (_, i) => ({ id: `B${i + 1}`.padEnd(64, 'x'), width: '1'.repeat(32), thickness: '0.5', cornerRadius: '0', autoId: false }));
    const saved = await operator.put(draftUrl(id), { rows: big, revision: 0 }).expect(200);
    expect(saved.body.rows).toHaveLength(10_000);
    expect((await operator.put(draftUrl(2_000_000), { rows, revision: 0 })).status).toBe(404);
  });

  it('belongs to the roles that record bars: a reviewer is refused', async () => {
    const id = await newJob();
    const n = await counts();
    expect((await reviewer.put(draftUrl(id), { rows, revision: 0 })).status).toBe(403);
    expect(await counts()).toEqual(n);
  });
});
