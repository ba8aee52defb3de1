import type { User } from '../../shared/schemas/auth';
import type { TableProgramQuery } from '../../shared/schemas/part-program';
import { MAX_PROGRAM_BYTES, readPartProgram, type PartProgram } from '../../shared/gcode/read-part-program';
import { expandedFrame } from '../../shared/gcode/expand-program';
import { offsetFrame } from '../../shared/gcode/offset-frames';
import { refuseTableRequest, tableProgramChunks, type StationFrame, type TableProgramRequest } from '../../shared/gcode/table-program';
import { formatLength } from '../../shared/units/units';
import type { Db } from '../db/knex';
import type { AuditRepo } from '../db/audit-repo';
import { partProgramsRepo } from '../db/part-programs-repo';
import { badRequest, HttpError } from '../middleware/errors';
import type { WorkerPool } from '../workers/pool';
import type { JobsService } from './jobs';
import { refused } from './part-program-file';

/** A job's single-part program: stored as sent after the subset check, written out for every station on request. */
export function partProgramsService(deps: { db: Db; jobs: JobsService; audit: AuditRepo; workers: WorkerPool }) {
  const { db, jobs, audit, workers } = deps;
  const repo = partProgramsRepo(db);

  /** The stored program read again (it was checked when stored); null when there is none. */
  async function program(jobId: number, unit: 'in' | 'mm'): Promise<{ program: PartProgram; sha256: string } | null> {
    const row = await repo.get(jobId);
    if (!row) return null;
    const read = readPartProgram(row.text, unit);
    if (!read.ok) throw refused({ line: read.error.line, message: `The stored part program no longer fits this job: ${read.error.message} Upload it again.` });
    return { program: read.program, sha256: row.sha256 };
  }

  /** Everything checked before a byte is written: the program, the skipped stations, safe Z, the size. */
  async function prepareTable(jobId: number, q: TableProgramQuery): Promise<{ request: TableProgramRequest; frame: StationFrame; fileName: string }> {
    const job = await jobs.detail(jobId);
    const stored = await program(jobId, job.unit);
    if (!stored || !job.partProgram) throw new HttpError(404, 'no-part-program', `Job ${jobId} has no part program yet; upload the program for one part first.`);
    // Only the stations the job uses (the ones whose width held accepts the stock), less the ones asked to be skipped.
    const used = new Set(job.stationsUsed);
    if (!used.size) throw badRequest(`No station of this job holds the stock width, so there is nothing to machine; check the job's problems first.`, null, 'no-stations');
    const unknown = q.skip.find((n) => !used.has(n));
    if (unknown !== undefined) throw badRequest(`skip: station ${unknown} is not a station this job uses; skip only stations ${[...used].sort((a, b) => a - b).join(', ')}.`, null, 'skip');
    const skipped = [...new Set(q.skip)].sort((a, b) => a - b);
    const stations = job.stationList.filter((s) => used.has(s.number) && !skipped.includes(s.number)).sort((a, b) => a.number - b.number);
    const floor = job.partProgram.minimumSafeZ;
    const safeZ = q.safeZ ?? floor;
    if (safeZ < floor - 1e-9) {
      throw badRequest(`safeZ ${formatLength(safeZ, job.unit)} is below this job's lowest safe height of ${formatLength(floor, job.unit)} (the stock top or tallest clamp plus a clearance); raise it.`, { minimumSafeZ: floor }, 'safe-z');
    }
    let frame: StationFrame = expandedFrame(job.unit);
    let familyText = 'EXPANDED - EVERY COORDINATE REWRITTEN, ONLY THE SHARED WORK OFFSET ACTIVE';
    if (q.family !== 'expanded') {
      const made = offsetFrame({
        family: q.family, unit: job.unit, stations,
        sharedOffsetName: stored.program.summary.workOffset ?? 'G54',
        base: q.base ? { x: q.base[0]!, y: q.base[1]!, z: q.base[2]! } : undefined,
      });
      if (!made.ok) throw new HttpError(made.error.status, made.error.code, made.error.message);
      frame = made.frame;
      familyText = made.family;
    }
    const request: TableProgramRequest = {
      program: stored.program, unit: job.unit, stations, order: q.order, safeZ,
      header: {
        templateName: job.templateName, version: job.version, state: job.versionState, contentHash: job.contentHash, jobId: job.id, jobName: job.name,
        partNumber: job.partNumber, programSha256: stored.sha256, family: familyText, skipped,
      },
    };
    const refusal = refuseTableRequest(request);
    if (refusal) throw badRequest(refusal, null, 'table-program');
    return { request, frame, fileName: `${q.family}-${q.order}` };
  }

  /** The whole-table program in pieces, checked before the first piece. */
  async function tableProgram(jobId: number, q: TableProgramQuery): Promise<{ chunks: Iterable<string>; fileName: string }> {
    const { request, frame, fileName } = await prepareTable(jobId, q);
    return { chunks: tableProgramChunks(request, frame), fileName };
  }

  return {
    async upload(user: User, jobId: number, file: { name: string; size: number; path: string }) {
      const job = await jobs.detail(jobId);
      if (file.size > MAX_PROGRAM_BYTES) throw badRequest(`The part program is ${(file.size / 1048576).toFixed(1)} MB; one part's program may be at most ${MAX_PROGRAM_BYTES / 1048576} MB.`, null, 'part-program');
      // Read and checked in a worker process (part-program-file.ts): up to 8 MB of G-code is seconds of work.
      const read = await workers.run('part-program', { path: file.path, unit: job.unit });
      const { text, sha256 } = read;
      const summary = { name: file.name.slice(0, 200), size: file.size, ...read.summary };
      await db.transaction(async (trx) => {
        const replaced = await repo.put(trx, jobId, { text, sha256, summary });
        await audit.record({
          userId: user.id, action: 'job.part-program', objectType: 'job', objectId: jobId,
          summary: `${replaced ? 'Replaced' : 'Set'} the part program from ${summary.name} (${summary.lines} lines, tools ${summary.toolChanges.map((t) => `T${t.tool}`).join(' ') || 'none'})`,
          after: { name: summary.name, sha256, lines: summary.lines },
        }, trx);
      });
      return jobs.detail(jobId);
    },

    /** For the job package: the part program as stored and the whole-table program with the defaults (expanded, station order, every station). */
    async packageFiles(jobId: number): Promise<[string, string][]> {
      const row = await repo.get(jobId);
      if (!row) return [];
      const files: [string, string][] = [['part-program.nc', row.text]];
      try {
        const table = await tableProgram(jobId, { family: 'expanded', order: 'station', skip: [] });
        files.push(['whole-table-program.nc', [...table.chunks].join('')]);
      } catch (e) {
        if (!(e instanceof HttpError)) throw e;
      }
      return files;
    },

    tableProgram,
    /** The program as it was sent. */
    async partText(jobId: number): Promise<string> {
      await jobs.requireJob(jobId);
      const row = await repo.get(jobId);
      if (!row) throw new HttpError(404, 'no-part-program', `Job ${jobId} has no part program yet; upload the program for one part first.`);
      return row.text;
    },
  };
}
export type PartProgramsService = ReturnType<typeof partProgramsService>;
