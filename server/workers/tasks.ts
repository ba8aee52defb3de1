/**
 * The work done in a pool process (loaded by worker-entry.mjs): each task reads an uploaded file by
 * its path and hands back only what the answer needs. A refusal is returned as plain data, never
 * thrown, so its status, code and details reach the main thread unchanged (TaskFailure).
 */
import { readFileSync } from 'node:fs';
import { ZodError } from 'zod';
import { HttpError, validationError } from '../middleware/errors';
import { boundedJson, inspectUploadedDxf, layerReport, normalizeOutline } from '../services/dxf-uploads';
import { barsFileText } from '../services/bars-file';
import { readManifestUpload } from '../manifest/read-upload';
import { readPartProgramFile } from '../services/part-program-file';
import type { TaskFailure, TaskInput, TaskIo, TaskMessage, TaskName, TaskOutput, TaskReply } from './task-types';

type Handlers = { [K in TaskName]: (input: TaskInput<K>) => TaskOutput<K> | Promise<TaskOutput<K>> };

const HANDLERS: Handlers = {
  'dxf-inspect': ({ path, size, layerRule }) => {
    const { inspection, sha256 } = inspectUploadedDxf(path);
    const { unit, layers, entities, entityTypes, bbox, circles, unsupported, outline, notes, points, approximations, warnings, version, insunits } = inspection;
    const answer = { sha256, unit, insunits, version, layers: layerReport(layerRule, layers), entities, entityTypes, bbox, circles, unsupported, outline, notes, points, approximations, warnings };
    // UTF-8 bytes in a buffer of their own, moved to the main thread rather than copied.
    return { json: new TextEncoder().encode(boundedJson(answer, size)), sha256 };
  },
  'dxf-outline': ({ path, fileUnit, targetUnit, datum: given, datumDefault }) => {
    const { inspection, sha256 } = inspectUploadedDxf(path);
    const corner = datumDefault === 'extents' ? { x: inspection.bbox?.minX ?? 0, y: inspection.bbox?.minY ?? 0 } : { x: 0, y: 0 };
    const datum = { x: given.x ?? corner.x, y: given.y ?? corner.y };
    const { outline, unit } = normalizeOutline(inspection, fileUnit, targetUnit, datum);
    return { outline, unit, sha256, datum };
  },
  'manifest-read': ({ path, convention }) => readManifestUpload(readFileSync(path), convention),
  'bars-file': ({ path }) => barsFileText(readFileSync(path)),
  'part-program': ({ path, unit }) => readPartProgramFile(path, unit),
};

export function failureOf(err: unknown): TaskFailure {
  const e = err instanceof ZodError ? validationError(err) : err;
  if (e instanceof HttpError) return { kind: 'http', status: e.status, code: e.code, message: e.message, details: plain(e.details) };
  const x = e as { name?: unknown; message?: unknown; stack?: unknown; code?: unknown };
  return {
    kind: 'unexpected',
    name: typeof x?.name === 'string' ? x.name : 'Error',
    message: typeof x?.message === 'string' ? x.message : String(e),
    stack: typeof x?.stack === 'string' ? x.stack : undefined,
    code: typeof x?.code === 'string' ? x.code : undefined,
  };
}

/** Details as JSON would send them anyway (the answer is JSON), so nothing uncloneable crosses the thread. */
const plain = (v: unknown): unknown => (v === undefined ? null : JSON.parse(JSON.stringify(v)));

/** Runs one task wherever it is called: tells `started` as it begins, then answers the reply as plain data. */
export async function performTask<K extends TaskName>(message: TaskMessage<K>, started: () => void = () => {}): Promise<TaskReply<K>> {
  const { name, input } = message;
  started();
  try {
    const handler = HANDLERS[name] as (input: TaskIo[K]['input']) => TaskOutput<K> | Promise<TaskOutput<K>>;
    if (!handler) throw new Error(`No worker task named ${String(name)}.`);
    return { ok: true, value: await handler(input) };
  } catch (err) {
    return { ok: false, failure: failureOf(err) };
  }
}
