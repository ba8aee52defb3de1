import ExcelJS from 'exceljs';
import type { Unit } from '../../shared/schemas/common';
import type { Station } from '../../shared/schemas/template';
import type { TemplateVersion } from '../../shared/schemas/template-api';
import { DISPLAY_DECIMALS, formatNumber } from '../../shared/units/units';
import { G10_FAMILIES, writeOffsetFile } from '../../shared/gcode/offsets';
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

/** RFC 4180 CSV; lengths at display precision, with the unit in its own column. */
export function stationsCsv(unit: Unit, stations: readonly Station[]): string {
  const header = [...COLUMNS.map((c) => c.key), 'unit'].join(',');
  const rows = stations.map((s) =>
    [
      String(s.number), formatNumber(s.x, unit), formatNumber(s.y, unit), formatNumber(s.z, unit), formatNumber(s.c, 'mm'),
      s.nominalWidth === null ? '' : formatNumber(s.nominalWidth, unit), s.placement, String(s.stop + 1), s.id, unit,
    ].map(csvCell).join(','),
  );
  return `${[header, ...rows].join('\r\n')}\r\n`;
}

/** XLSX with numbers stored as numbers, a number format per unit, the unit in each length header, and a frozen header row. */
export async function stationsXlsx(v: Pick<TemplateVersion, 'name' | 'version' | 'contentHash' | 'unit' | 'stations'>): Promise<Buffer> {
  const wb = new ExcelJS.Workbook();
  wb.creator = 'Gridset';
  const ws = wb.addWorksheet('Stations', { views: [{ state: 'frozen', ySplit: 1 }] });
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
  const info = wb.addWorksheet('About');
  info.addRows([['Template', v.name], ['Version', v.version], ['Content hash (SHA-256)', v.contentHash], ['Unit', v.unit], ['Translations are relative to the shared work offset.']]);
  info.getColumn(1).width = 26;
  info.getColumn(2).width = 70;
  return Buffer.from(await wb.xlsx.writeBuffer());
}

/** Machine positions beyond ±100 in / ±2540 mm are no machine's travel (a typing slip). */
const BASE_BOUND = { in: 100, mm: 2540 } as const;

export function parseBase(base: string | undefined, unit: Unit): { x: number; y: number; z: number } | null {
  if (!base) return null;
  const [x, y, z] = base.split(',').map((s) => Number(s.trim()));
  if (![x, y, z].every((v) => Number.isFinite(v) && Math.abs(v!) <= BASE_BOUND[unit])) {
    throw badRequest(`base must be three numbers within ±${BASE_BOUND[unit]} ${unit}: the machine position of the shared offset.`, null, 'bad-base');
  }
  return { x: x!, y: y!, z: z! };
}

export interface OffsetsFileOptions extends OffsetsQuery {
  /** Register count of the ext-l20 family (shop setting). */
  extRegisters?: number;
  /** A subset of the version's stations (a job that uses some); all when absent. */
  stations?: readonly Station[];
}

/** The offset file of a version for one family; a refusal is a 400/422 with one sentence. */
export function offsetsNc(v: TemplateVersion, q: OffsetsFileOptions): string {
  const r = writeOffsetFile({
    family: q.family,
    source: { templateName: v.name, version: v.version, state: v.state, contentHash: v.contentHash },
    unit: v.unit,
    stations: q.stations ?? v.stations,
    sharedOffsetName: v.sharedOffset.name,
    sharedOffsetAt: G10_FAMILIES.includes(q.family) ? parseBase(q.base, v.unit) ?? undefined : undefined,
    first: q.first,
    extRegisters: q.extRegisters,
  });
  if (!r.ok) throw new HttpError(r.error.status, r.error.code, r.error.message, null);
  return r.text;
}
