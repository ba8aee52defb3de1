import ExcelJS from 'exceljs';
import type { Unit } from '../../shared/schemas/common';
import type { Station } from '../../shared/schemas/template';
import type { TemplateVersion } from '../../shared/schemas/template-api';
import { DISPLAY_DECIMALS, formatNumber } from '../../shared/units/units';
import { writeOffsetFile } from '../../shared/gcode/offsets';
import { draftMark, type MarkedVersion } from '../../shared/interchange/draft-mark';
import type { OffsetsQuery } from '../../shared/schemas/template-api';
import { HttpError, badRequest } from '../middleware/errors';

/** The station table columns, in order; CSV headers are the keys, XLSX headers the labels with the unit. */
const COLUMNS = [
  { key: 'station', label: 'Station' },
  { key: 'x', label: 'X', length: true },
  { key: 'y', label: 'Y', length: true },
  { key: 'z', label: 'Z', length: true },
  { key: 'c', label: 'C (deg)' },
  { key: 'nominal_width', label: 'Nominal width', length: true },
  { key: 'placement', label: 'Placement' },
  { key: 'stop', label: 'Stop' },
  { key: 'station_id', label: 'Station id' },
] as const;

const csvCell = (v: string) => (/[",\n\r]/.test(v) ? `"${v.replace(/"/g, '""')}"` : v);

/**
 * RFC 4180 CSV; lengths at display precision, with the unit in its own column. A version that is
 * not released gets its draft mark as the first row, padded to the header's width so a reader that
 * holds every record to one field count still reads the file; the header follows.
 */
export function stationsCsv(v: MarkedVersion & { unit: Unit }, stations: readonly Station[]): string {
  const { unit } = v;
  const keys = [...COLUMNS.map((c) => c.key), 'unit'];
  const mark = draftMark(v);
  const top = mark ? [[csvCell(mark), ...keys.slice(1).map(() => '')].join(',')] : [];
  const rows = stations.map((s) =>
    [
      String(s.number), formatNumber(s.x, unit), formatNumber(s.y, unit), formatNumber(s.z, unit), formatNumber(s.c, 'mm'),
      s.nominalWidth === null ? '' : formatNumber(s.nominalWidth, unit), s.placement, String(s.stop + 1), s.id, unit,
    ].map(csvCell).join(','),
  );
  return `${[...top, keys.join(','), ...rows].join('\r\n')}\r\n`;
}

/**
 * XLSX with numbers stored as numbers, a number format per unit, the unit in each length header, and
 * a frozen header row. A version that is not released gets its draft mark as a banner row above the
 * header (frozen with it) and as the first row of the About sheet.
 */
export async function stationsXlsx(v: Pick<TemplateVersion, 'name' | 'version' | 'state' | 'contentHash' | 'unit' | 'stations'>): Promise<Buffer> {
  const mark = draftMark(v);
  const wb = new ExcelJS.Workbook();
  wb.creator = 'Gridset';
  const ws = wb.addWorksheet('Stations', { views: [{ state: 'frozen', ySplit: mark ? 2 : 1 }] });
  const lengthFormat = v.unit === 'in' ? '0.0000' : '0.000';
  ws.columns = COLUMNS.map((c) => ({
    header: 'length' in c && c.length ? `${c.label} (${v.unit})` : c.label,
    key: c.key,
    width: c.key === 'station_id' || c.key === 'placement' ? 16 : 14,
    style: 'length' in c && c.length ? { numFmt: lengthFormat } : c.key === 'c' ? { numFmt: '0.000' } : {},
  }));
  ws.getRow(1).font = { bold: true };
  const round = (x: number) => Number(x.toFixed(DISPLAY_DECIMALS[v.unit] + 2));
  for (const s of v.stations) {
    ws.addRow({ station: s.number, x: round(s.x), y: round(s.y), z: round(s.z), c: Number(s.c.toFixed(6)), nominal_width: s.nominalWidth === null ? null : round(s.nominalWidth), placement: s.placement, stop: s.stop + 1, station_id: s.id });
  }
  if (mark) {
    ws.insertRow(1, [mark]);
    ws.mergeCells(1, 1, 1, COLUMNS.length);
    ws.getRow(1).font = { bold: true };
  }
  const info = wb.addWorksheet('About');
  info.addRows([
    ...(mark ? [['Not released', mark]] : []),
    ['Template', v.name], ['Version', v.version], ['State', v.state], ['Content hash (SHA-256)', v.contentHash], ['Unit', v.unit],
    ['Translations are relative to the shared work offset; Z0 is its Z0 and Z is each station\'s part seat above it.'],
  ]);
  info.getColumn(1).width = 26;
  info.getColumn(2).width = 70;
  return Buffer.from(await wb.xlsx.writeBuffer());
}

/** A machine position beyond this is a typing slip, not a machine (larger than any machining center's travel). */
const BASE_LIMIT = { in: 100, mm: 2540 } as const;

/**
 * The offsets file of a version (or of the stations a job uses) for the control family the user
 * named. A family that cannot write these stations answers 422 with the reason; nothing is written.
 */
export function offsetsNc(
  v: Pick<TemplateVersion, 'name' | 'version' | 'state' | 'contentHash' | 'unit' | 'stations' | 'sharedOffset'>,
  q: OffsetsQuery,
  options: { extendedRegisters: number; stations?: readonly Station[] },
): string {
  if (q.base) {
    const limit = BASE_LIMIT[v.unit];
    const far = (['x', 'y', 'z'] as const).find((k) => Math.abs(q.base![k]) > limit);
    if (far) throw badRequest(`base ${far} is ${q.base[far]} ${v.unit}, beyond ±${limit} ${v.unit}: give the machine position of the shared offset in ${v.unit}.`, null, 'bad-base');
  }
  const r = writeOffsetFile({
    family: q.family,
    source: { templateName: v.name, version: v.version, state: v.state, contentHash: v.contentHash },
    unit: v.unit,
    stations: options.stations ?? v.stations,
    sharedOffsetName: v.sharedOffset.name,
    base: q.base,
    first: q.first,
    extendedRegisters: options.extendedRegisters,
  });
  if (!r.ok) {
    if (r.error.code === 'missing-base' || r.error.code === 'bad-first-register') throw badRequest(r.error.message, null, r.error.code);
    throw new HttpError(422, r.error.code, r.error.message);
  }
  return r.text;
}
