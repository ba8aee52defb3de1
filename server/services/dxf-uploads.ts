import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { readFile } from 'node:fs/promises';
import type { Unit } from '../../shared/schemas/common';
import { OutlineSchema, type Outline } from '../../shared/schemas/geometry';
import { LIMITS } from '../../shared/schemas/limits';
import { convert } from '../../shared/units/units';
import type { NamingRule } from '../../shared/schemas/naming';
import { checkName } from '../../shared/naming/check-name';
import { proposeName } from '../../shared/naming/propose-name';
import { z } from 'zod';
import { DxfError, inspectDxf, type DxfInspection } from '../dxf/read-dxf';
import { HttpError, badRequest, validationError } from '../middleware/errors';
import { originalDxfKey, type FileStore } from '../storage/file-store';

/** Reads an uploaded DXF; a file Gridset cannot read is a 400 that names the problem (and line or block). */
export function inspectUploadedDxf(filePath: string): { text: string; inspection: DxfInspection; sha256: string } {
  const buf = readFileSync(filePath);
  // The type is judged by content, not by the file name: binary DXF and other files are named as such.
  const text = buf.toString('utf8');
  try {
    return { text, inspection: inspectDxf(text), sha256: createHash('sha256').update(buf).digest('hex') };
  } catch (err) {
    if (err instanceof DxfError) throw new HttpError(400, `dxf-${err.code}`, err.message, { line: err.line ?? null, block: err.block ?? null });
    throw err;
  }
}

/**
 * Keeps the original file in the file store, named by its content hash, once what it holds was
 * accepted; the key, `uploads/<sha256>.dxf`. The same content is kept once: a file already there is
 * not sent again. The file (within the upload limit) is sent as one buffer, which the S3 client can
 * retry after a dropped connection; a stream body cannot be sent twice.
 */
export async function keepOriginal(files: FileStore, tmpPath: string, sha256: string): Promise<string> {
  const key = originalDxfKey(sha256);
  if (!(await files.has(key))) await files.put(key, await readFile(tmpPath), { contentType: 'application/dxf' });
  return key;
}

/**
 * The outline in the owner's unit with its origin moved to `datum` (a point in the drawing's
 * own coordinates and unit): the primary dowel for a component, the datum corner for a part.
 */
export function normalizeOutline(inspection: DxfInspection, fileUnit: Unit | null, targetUnit: Unit, datum: { x: number; y: number }): { outline: Outline; unit: Unit } {
  const unit = inspection.unit ?? fileUnit;
  if (!unit) throw badRequest('The file does not say its unit ($INSUNITS is 0 or missing): send unit=in or unit=mm with the upload.', null, 'dxf-unit-unknown');
  const f = (v: number) => convert(v, unit, targetUnit);
  const outline: Outline = {
    paths: inspection.outline.paths.map((p) => ({ ...p, points: p.points.map((v) => ({ ...v, x: f(v.x - datum.x), y: f(v.y - datum.y) })) })),
    circles: inspection.outline.circles.map((c) => ({ ...c, x: f(c.x - datum.x), y: f(c.y - datum.y), r: f(c.r) })),
  };
  if (outline.paths.length === 0 && outline.circles.length === 0) throw badRequest('The file holds no lines, arcs, polylines or circles to use as an outline.', null, 'dxf-no-outline');
  // The same bounds as an outline typed in (coordinates, radii, vertex counts, layer names).
  const checked = OutlineSchema.safeParse(outline);
  if (!checked.success) throw validationError(checked.error, 'outline read from the file');
  return { outline, unit };
}

/**
 * The inspection as JSON text, refused when it would be larger than LIMITS.answerMultiple times
 * the file (or LIMITS.answerFloorBytes for a small file): a short file of curves must not answer
 * with megabytes.
 */
export function boundedJson(answer: unknown, fileBytes: number): string {
  const cap = Math.max(LIMITS.answerFloorBytes, LIMITS.answerMultiple * fileBytes);
  const text = JSON.stringify(answer);
  if (text.length > cap) {
    throw badRequest(`The drawing's curves flatten to an answer of ${(text.length / 1024 / 1024).toFixed(1)} MB, more than ${LIMITS.answerMultiple} times the file (at least ${LIMITS.answerFloorBytes / 1024 / 1024} MB are allowed); simplify the curves or send only the outline.`, null, 'dxf-too-large');
  }
  return text;
}

/** Each layer of the file against the convention's layer rule, with a proposed conforming name where one is simple to find. */
export function layerReport(rule: NamingRule, layers: { name: string; entities: number }[]) {
  return layers.map((l) => {
    const check = checkName(rule, l.name, 'layer');
    return { ...l, ok: check.ok, problems: check.problems, proposed: check.ok ? l.name : proposeName(rule, l.name, 'layer') };
  });
}

/**
 * Applies the user's layer mapping (`layerMap`: JSON text, file layer → new name); every layer that
 * ends up on the outline must pass the convention's layer rule.
 */
export function mapLayers(rule: NamingRule, outline: Outline, layerMap: string | undefined): Outline {
  let map: Record<string, string> = {};
  if (layerMap) {
    try {
      map = z.record(z.string(), z.string().min(1)).parse(JSON.parse(layerMap));
    } catch {
      throw new HttpError(400, 'invalid-input', 'layerMap must be a JSON object from each file layer to its new name, e.g. {"0":"FX-CR-8"}.');
    }
  }
  const rename = (l?: string) => (l !== undefined && Object.hasOwn(map, l) ? map[l] : l);
  const mapped: Outline = { paths: outline.paths.map((p) => ({ ...p, layer: rename(p.layer) })), circles: outline.circles.map((c) => ({ ...c, layer: rename(c.layer) })) };
  const used = new Set([...mapped.paths.map((p) => p.layer), ...mapped.circles.map((c) => c.layer)].filter((l): l is string => !!l));
  const bad = [...used].map((l) => ({ layer: l, check: checkName(rule, l, 'layer') })).filter((x) => !x.check.ok);
  if (bad.length) {
    throw new HttpError(400, 'naming', `Layer ${bad[0]!.layer} breaks the naming convention: ${bad[0]!.check.problems[0]!.message} Map it to a conforming name with layerMap.`, {
      layers: bad.map((b) => ({ layer: b.layer, problems: b.check.problems, proposed: proposeName(rule, b.layer, 'layer') })),
    });
  }
  return mapped;
}
