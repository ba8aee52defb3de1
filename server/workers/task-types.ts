/**
 * The tasks the worker pool runs, as plain data both sides agree on: what goes in (a path to the
 * uploaded file, never its bytes, and the few settings the reading needs) and what comes back
 * (only what the answer needs, never a parse tree). Types only: no code runs from this file.
 */
import type { Unit } from '../../shared/schemas/common';
import type { Outline } from '../../shared/schemas/geometry';
import type { NamingConvention, NamingRule } from '../../shared/schemas/naming';
import type { PartProgramSummary } from '../../shared/gcode/read-part-program';
import type { ManifestRead } from '../manifest/manifest-types';

export interface TaskIo {
  /** POST /api/dxf/inspect: the whole answer as bounded JSON (UTF-8 bytes), layers checked against the rule. */
  'dxf-inspect': { input: { path: string; size: number; layerRule: NamingRule }; output: { json: Uint8Array; sha256: string } };
  /**
   * An outline upload: the drawing's outline in the owner's unit with its origin at the datum.
   * A datum coordinate left out is 0 (`origin`) or the lower-left corner of the extents (`extents`).
   */
  'dxf-outline': {
    input: { path: string; fileUnit: Unit | null; targetUnit: Unit; datum: { x?: number; y?: number }; datumDefault: 'origin' | 'extents' };
    output: { outline: Outline; unit: Unit; sha256: string; datum: { x: number; y: number } };
  };
  /** A manifest (XLSX or CSV) read into rows and cell-addressed errors; planning against the catalog stays on the main thread. */
  'manifest-read': { input: { path: string; convention: NamingConvention }; output: ManifestRead };
  /** A measured-bars file as tab-separated text. */
  'bars-file': { input: { path: string }; output: { text: string; sheet: string | null } };
  /** A job's part program read and checked in the job's unit: the text to store, its SHA-256 and the summary. */
  'part-program': { input: { path: string; unit: Unit }; output: { text: string; sha256: string; summary: PartProgramSummary } };
}

export type TaskName = keyof TaskIo;
export type TaskInput<K extends TaskName> = TaskIo[K]['input'];
export type TaskOutput<K extends TaskName> = TaskIo[K]['output'];

/**
 * A failure inside the worker, as plain data (an Error's class does not survive the thread
 * boundary): `http` is a refusal the user can act on (an HttpError, rebuilt as one on the main
 * thread); `unexpected` is a bug or a fault of the machine, logged there as before.
 */
export type TaskFailure =
  | { kind: 'http'; status: number; code: string; message: string; details: unknown }
  | { kind: 'unexpected'; name: string; message: string; stack: string | undefined; code: string | undefined };

export type TaskReply<K extends TaskName> = { ok: true; value: TaskOutput<K> } | { ok: false; failure: TaskFailure };

/** What the pool sends to a worker process. */
export interface TaskMessage<K extends TaskName = TaskName> {
  name: K;
  input: TaskInput<K>;
}
