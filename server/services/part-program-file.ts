import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import type { Unit } from '../../shared/schemas/common';
import { readPartProgram, type PartProgramSummary } from '../../shared/gcode/read-part-program';
import { badRequest } from '../middleware/errors';

/** A part program refused: the reader's sentence, with the line it names. */
export const refused = (e: { line: number | null; message: string }) => badRequest(e.message, { line: e.line }, 'part-program');

/**
 * An uploaded part program read and checked (runs in a worker process): the text as stored, its
 * SHA-256 and the reader's summary. Read byte for byte; a UTF-8 byte-order mark some editors write
 * is dropped, anything else not ASCII is refused by line.
 */
export function readPartProgramFile(filePath: string, unit: Unit): { text: string; sha256: string; summary: PartProgramSummary } {
  const text = readFileSync(filePath, 'latin1').replace(/^\xEF\xBB\xBF/, '');
  const read = readPartProgram(text, unit);
  if (!read.ok) throw refused(read.error);
  return { text, sha256: createHash('sha256').update(text, 'latin1').digest('hex'), summary: read.program.summary };
}
