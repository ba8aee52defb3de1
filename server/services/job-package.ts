import { createHash } from 'node:crypto';
import JSZip from 'jszip';
import type { JobDetail } from '../../shared/schemas/job';
import type { TemplateVersion } from '../../shared/schemas/template-api';
import { evaluateTemplate } from '../../shared/stations/evaluate-template';
import { DRAWING_LAYERS, componentLayer } from '../../shared/interchange/drawing-layers';
import { formatLength, formatNumber } from '../../shared/units/units';
import { reasonText, STOCK_CHECK_ADVICE } from '../../shared/clamps/reason-text';
import { writeDrawingDxf } from '../dxf/write-dxf';
import { drawingToSvg } from '../dxf/drawing-svg';
import { templateDrawing } from './template-drawing';
import { offsetsNc, stationsCsv, stationsXlsx } from './station-files';
import { isTurned } from '../../shared/gcode/offsets';
import { turnOutline } from '../../shared/jobs/job-problems';

/** The pinned version with only the stations the job uses (detail.stationsUsed): every file of the job is written from it. */
export function usedVersion(job: Pick<JobDetail, 'stationsUsed'>, v: TemplateVersion): TemplateVersion {
  const used = new Set(job.stationsUsed);
  return { ...v, stations: v.stations.filter((s) => used.has(s.number)) };
}

/** Stations of the pinned version the job does not use (their width held does not accept the stock). */
const unusedStations = (job: Pick<JobDetail, 'stationsUsed'>, v: TemplateVersion) => {
  const used = new Set(job.stationsUsed);
  return v.stations.filter((s) => !used.has(s.number));
};

const esc = (s: unknown) => String(s).replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

/** The part layer is named after the part number, upper-cased to the DXF name set. */
const partLayer = (job: JobDetail) => `PART-${job.partNumber.toUpperCase().replace(/[^A-Z0-9_-]+/g, '-')}`.slice(0, 31);

/** The template drawn with the part (turned by partRotation about its datum) at the used stations only. */
function jobDrawing(job: JobDetail, v: TemplateVersion) {
  const evaluation = evaluateTemplate(v);
  const stations = usedVersion(job, v).stations;
  return templateDrawing(v, { origin: evaluation.origin, stations }, job.partOutline ? { outline: turnOutline(job.partOutline, job.partRotation), layer: partLayer(job) } : undefined);
}

/** Layer of the screen picture's unused-station marks, drawn light grey. */
const UNUSED_LAYER = 'STATIONS-UNUSED';

/**
 * Layer colours (ACI) for the job drawing shown on screen: red and green are kept for safety
 * meanings in the app (ANSI Z535.1 / ISO 3864 hues), so the origin and stations are drawn in black and dark grey,
 * components in dark grey and the part in blue, the one hue that stands out. The package's
 * files keep templateDrawing's CAM colours.
 */
const SCREEN_ACI: Readonly<Record<string, number>> = {
  [DRAWING_LAYERS.plate]: 8, [DRAWING_LAYERS.holes]: 9, [DRAWING_LAYERS.origin]: 7, [DRAWING_LAYERS.stations]: 250, [DRAWING_LAYERS.numbers]: 7,
};

/** The job's plate drawing as an SVG picture for the job page: the template with the part at every station. */
export function jobDrawingSvg(job: JobDetail, v: TemplateVersion): string {
  const drawing = jobDrawing(job, v);
  const part = job.partOutline ? partLayer(job) : null;
  drawing.layers = drawing.layers.map((l) => ({ ...l, color: l.name === part ? 5 : SCREEN_ACI[l.name] ?? 251 }));
  // On a screen the plate is seen whole, so the station numbers (an eighth of the pitch, sized for print) are set larger.
  drawing.texts = drawing.texts.map((t) => (t.layer === DRAWING_LAYERS.numbers ? { ...t, height: t.height * 1.6 } : t));
  // Stations the job does not use: a light grey ring and number, no part, so the picture shows them greyed out.
  const unused = unusedStations(job, v);
  if (unused.length) {
    const size = v.plate.pitch / 8;
    drawing.layers.push({ name: UNUSED_LAYER, color: 9 });
    for (const s of unused) {
      drawing.circles.push({ layer: UNUSED_LAYER, center: { x: s.x, y: s.y }, radius: size });
      drawing.texts.push({ layer: UNUSED_LAYER, x: s.x + size * 0.6, y: s.y + size * 0.6, height: size * 1.4 * 1.6, text: `${s.number} unused` });
    }
  }
  const title = `${job.name}: ${job.partOutline ? 'the part at' : 'the template with'} every station on ${v.plate.code}, origin at the shared offset`;
  return drawingToSvg(drawing, { widthPx: 1200, background: '#ffffff', title });
}

export const CAUTIONS = [
  'This sheet is advice computed from the entered template, clamp models and measurements; it is not a guarantee that the setup holds.',
  'Check every clamp and its torque before cycle start, and prove the first cycle at reduced rapid and feed.',
  'Check the offset file against your control’s programming manual before running it.',
  'Follow the machine builder’s instructions, your shop’s procedures, local codes and licensed practice.',
];

/** The latest stock check on the sheet: which rails were checked (each against its own clamp) and which were not. */
function stockCheckHtml(job: JobDetail, latest: JobDetail['stockChecks'][number]): string {
  const rails = latest.rails.length ? latest.rails : [{ jawPlacement: latest.jawPlacement, jawComponent: '', nominalOpening: latest.nominalOpening, appliesTo: latest.appliesTo, result: latest.result }];
  const checked = new Set(rails.map((r) => r.jawPlacement));
  const notChecked = job.railsUsed.filter((r) => !checked.has(r));
  return `<p>Latest check (${esc(latest.at)}${latest.by ? `, ${esc(latest.by)}` : ''}): ${latest.bars.length} bars. Rails checked: ${rails.map((r) => esc(r.jawPlacement)).join(', ')}. ${notChecked.length ? `<b>Rails not checked: ${notChecked.map(esc).join(', ')}</b>; check the bars against them before loading.` : 'Every rail the job uses was checked.'}</p>
${rails.map((r) => `<h3>${esc(r.jawPlacement)}${r.jawComponent ? ` (${esc(r.jawComponent)})` : ''}, nominal opening ${formatLength(r.nominalOpening, latest.unit)}</h3>
<table><thead><tr><th>Rail setting</th><th>Shift</th><th>Bars</th></tr></thead><tbody>
${r.result.settings.map((s, i) => `<tr><td>Setting ${i + 1}</td><td class="n">${s.shift >= 0 ? '+' : ''}${formatLength(s.shift, latest.unit)}</td><td>${s.bars.map(esc).join(', ')}</td></tr>`).join('\n')}
</tbody></table>
${r.result.unplaceable.length ? `<p><b>Cannot be used on this rail:</b> ${r.result.unplaceable.map((id) => {
    const b = r.result.bars.find((x) => x.id === id);
    return `${esc(id)} (${(b?.reasons ?? []).map((x) => esc(reasonText(x))).join('; ')})`;
  }).join(', ')}</p>` : ''}`).join('\n')}`;
}

/** A print-ready page (Letter and A4): no navigation, black on white, sections on their own pages. */
export function setupSheetHtml(job: JobDetail, v: TemplateVersion): string {
  const u = v.unit;
  const used = usedVersion(job, v);
  const unused = unusedStations(job, v);
  const svg = drawingToSvg(jobDrawing(job, v), { widthPx: 900, background: '#ffffff', title: `${job.name}: stations on ${v.plate.code}` });
  const byCode = new Map(v.components.map((c) => [c.code, c]));
  const latest = job.stockChecks[0];
  const clamps = v.placements.filter((p) => byCode.get(p.component)?.clamp);
  const printed = new Date().toISOString().slice(0, 10);
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><title>Setup sheet — ${esc(job.name)}</title>
<style>
  @page { margin: 12mm; }
  body { font: 11pt/1.4 system-ui, sans-serif; color: #000; background: #fff; margin: 0; }
  h1 { font-size: 18pt; margin: 0 0 4pt; } h2 { font-size: 13pt; margin: 14pt 0 6pt; border-bottom: 1px solid #000; }
  table { border-collapse: collapse; width: 100%; font-size: 10pt; } th, td { border: 1px solid #555; padding: 2pt 4pt; text-align: left; }
  td.n { text-align: right; font-family: ui-monospace, monospace; font-variant-numeric: tabular-nums; white-space: nowrap; }
  .page { break-before: page; } svg { width: 100%; height: auto; max-height: 160mm; }
  .caution { border: 2px solid #000; padding: 6pt; margin-top: 10pt; } .box { display: inline-block; width: 10pt; height: 10pt; border: 1px solid #000; margin-right: 6pt; }
  footer { position: fixed; bottom: 0; left: 0; right: 0; font-size: 8pt; border-top: 1px solid #000; padding-top: 2pt; }
</style></head><body>
<h1>Setup sheet — ${esc(job.name)}</h1>
<p>Part <b>${esc(job.partNumber)}</b>${job.partRevision ? ` rev ${esc(job.partRevision)}` : ''} · template <b>${esc(v.name)}</b> version ${v.version} (${esc(v.state)}) on plate <b>${esc(v.plate.code)}</b>, pitch ${formatLength(v.plate.pitch, v.plate.unit)}, ${v.plate.columns} × ${v.plate.rows} holes.</p>
<p>Shared work offset <b>${esc(v.sharedOffset.name ?? 'shared offset')}</b> at ${v.sharedOffset.kind === 'hole' ? `grid hole (${v.sharedOffset.hole.col}, ${v.sharedOffset.hole.row})` : v.sharedOffset.kind === 'center' ? 'the center of the hole grid' : `the point (${formatLength(v.sharedOffset.x, u)}, ${formatLength(v.sharedOffset.y, u)})`}.
 Stock ${formatLength(job.stock.width, u)} × ${formatLength(job.stock.thickness, u)} × ${formatLength(job.stock.length, u)} ${esc(job.stock.material)}; carrier ${formatLength(job.carrier, u)}, tool clearance ${formatLength(job.clearance, u)}, minimum bite ${formatLength(job.minBite, u)}.</p>
<p>Stations used: ${used.stations.length} of ${v.stations.length} (the stations whose width held accepts the stock width)${unused.length ? `; not used by this job: ${unused.map((s) => s.number).join(', ')}` : ''}.</p>
<p>Runtime: ${used.stations.length} stations × ${job.cycleMinutes} min + ${job.loadMinutes} min load = <b>${formatNumber(job.runtimeMinutes, 'mm')} min</b> unattended.</p>
${job.problems.length ? `<div class="caution"><b>Job problems.</b><ul>${job.problems.map((p) => `<li>${esc(p.message)}</li>`).join('')}</ul></div>` : ''}
<h2>Station map</h2>
${svg}
<h2 class="page">Placements</h2>
<table><thead><tr><th>Placement</th><th>Component</th><th>Grid hole</th><th>Rotation</th><th>Layer</th><th>Stops in use</th></tr></thead><tbody>
${v.placements.map((p) => `<tr><td>${esc(p.id)}</td><td>${esc(p.component)}</td><td class="n">(${p.hole.col}, ${p.hole.row})</td><td class="n">${p.rotation}°</td><td>${esc(byCode.get(p.component) ? componentLayer(byCode.get(p.component)!) : '')}</td><td>${(p.stopsInUse ?? []).map((s) => s + 1).join(', ') || '—'}</td></tr>`).join('\n')}
</tbody></table>
<h2>Stations (translation from the shared offset, ${u})</h2>
<p>Z0 is the shared offset's Z0 (the plate deck under a grid-hole or center offset); each station's Z is its part seat above it.</p>
<table><thead><tr><th>Station</th><th>X</th><th>Y</th><th>Z</th><th>C</th><th>Width held</th><th>Placement</th></tr></thead><tbody>
${used.stations.map((s) => `<tr><td class="n">${s.number}</td><td class="n">${formatNumber(s.x, u)}</td><td class="n">${formatNumber(s.y, u)}</td><td class="n">${formatNumber(s.z, u)}</td><td class="n">${formatNumber(s.c, 'mm')}°</td><td class="n">${s.nominalWidth === null ? '—' : formatNumber(s.nominalWidth, u)}</td><td>${esc(s.placement)}</td></tr>`).join('\n')}
</tbody></table>
<h2 class="page">Stock check</h2>
${latest ? stockCheckHtml(job, latest) : `<p>No bars have been checked for this job yet. Rails to check: ${job.railsUsed.map(esc).join(', ') || 'none'}.</p>`}
<h2>Clamp check list</h2>
${clamps.length ? clamps.map((p) => `<p><span class="box"></span>${esc(p.id)} (${esc(p.component)}): every clamp seated on the stock and torqued to the clamp maker's value; rail bolts tight.</p>`).join('\n') : '<p>No clamping components.</p>'}
<p><span class="box"></span>A few stations probed against the table; all within the probe-check tolerance.</p>
<div class="caution"><b>Cautions.</b><ul>${[...CAUTIONS, STOCK_CHECK_ADVICE].map((c) => `<li>${esc(c)}</li>`).join('')}</ul></div>
<footer>${esc(v.name)} v${v.version} · content hash ${esc(v.contentHash)} · printed ${printed} · Gridset</footer>
</body></html>`;
}

/**
 * The job package: everything the programmer and the operator need in one download, with a
 * manifest holding the pinned version's content hash and the SHA-256 of every file.
 */
export async function jobPackage(job: JobDetail, v: TemplateVersion, programFiles: [string, string][] = []): Promise<Buffer> {
  const drawing = jobDrawing(job, v);
  const used = usedVersion(job, v);
  // A shift family needs no machine position; one that turns when any station the job uses is turned.
  const shiftFamily = used.stations.some(isTurned) ? 'shift-rotate' : 'ngc-g52';
  const files: [string, string | Buffer][] = [
    ['stations.csv', stationsCsv(v.unit, used.stations)],
    ['stations.xlsx', await stationsXlsx(used)],
    ['job-drawing.dxf', writeDrawingDxf(drawing)],
    ['job-drawing.svg', drawingToSvg(drawing, { background: '#ffffff', title: job.name })],
    [`offsets-${shiftFamily}.nc`, offsetsNc(used, { family: shiftFamily, base: undefined, first: undefined }, { extendedRegisters: 0 })],
    ['setup-sheet.html', setupSheetHtml(job, v)],
  ];
  if (job.stockChecks.length) files.push(['stock-check.json', JSON.stringify(job.stockChecks[0], null, 2)]);
  files.push(...programFiles);
  const zip = new JSZip();
  const listed = files.map(([name, body]) => {
    zip.file(name, body);
    const bytes = typeof body === 'string' ? Buffer.from(body, 'utf8') : body;
    return { name, bytes: bytes.length, sha256: createHash('sha256').update(bytes).digest('hex') };
  });
  const manifest = {
    format: 'gridset-job-package', formatVersion: 1,
    job: { id: job.id, name: job.name, partNumber: job.partNumber, partRevision: job.partRevision },
    template: { id: v.templateId, name: v.name, version: v.version, state: v.state, contentHash: v.contentHash },
    unit: v.unit, stations: used.stations.length, stationsUsed: job.stationsUsed, files: listed,
    offsetsFamily: shiftFamily,
    note: `offsets-${shiftFamily}.nc shifts from the shared work offset (${shiftFamily === 'shift-rotate' ? 'G52 with G68 rotation, for controls that rotate coordinates' : 'G52, as LinuxCNC'}), for the stations the job uses. Work-offset families (ngc-g10, ext-l20) need the machine position of the shared offset; download them from the template version with family=…&base=x,y,z.`,
  };
  zip.file('manifest.json', JSON.stringify(manifest, null, 2));
  return zip.generateAsync({ type: 'nodebuffer', compression: 'DEFLATE' });
}
