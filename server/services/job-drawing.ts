/**
 * The job's plate drawing: the pinned template at the stations the job uses, with the part drawn
 * at each. The job package writes it as DXF and SVG, the setup sheet and the job page show it.
 */
import type { JobDetail } from '../../shared/schemas/job';
import type { TemplateVersion } from '../../shared/schemas/template-api';
import { evaluateTemplate } from '../../shared/stations/evaluate-template';
import { DRAWING_LAYERS } from '../../shared/interchange/drawing-layers';
import { turnOutline } from '../../shared/jobs/job-problems';
import { drawingToSvg } from '../dxf/drawing-svg';
import { templateDrawing } from './template-drawing';

/** The pinned version with only the stations the job uses (detail.stationsUsed): every file of the job is written from it. */
export function usedVersion(job: Pick<JobDetail, 'stationsUsed'>, v: TemplateVersion): TemplateVersion {
  const used = new Set(job.stationsUsed);
  return { ...v, stations: v.stations.filter((s) => used.has(s.number)) };
}

/** Stations of the pinned version the job does not use (their width held does not accept the stock). */
export const unusedStations = (job: Pick<JobDetail, 'stationsUsed'>, v: TemplateVersion) => {
  const used = new Set(job.stationsUsed);
  return v.stations.filter((s) => !used.has(s.number));
};

/** The part layer is named after the part number, upper-cased to the DXF name set. */
const partLayer = (job: JobDetail) => `PART-${job.partNumber.toUpperCase().replace(/[^A-Z0-9_-]+/g, '-')}`.slice(0, 31);

/** The template drawn with the part (turned by partRotation about its datum) at the used stations only. */
export function jobDrawing(job: JobDetail, v: TemplateVersion) {
  const evaluation = evaluateTemplate(v);
  const stations = usedVersion(job, v).stations;
  return templateDrawing(v, { origin: evaluation.origin, stations }, job.partOutline ? { outline: turnOutline(job.partOutline, job.partRotation), layer: partLayer(job) } : undefined, v);
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
  [DRAWING_LAYERS.plate]: 8, [DRAWING_LAYERS.holes]: 9, [DRAWING_LAYERS.origin]: 7, [DRAWING_LAYERS.stations]: 250, [DRAWING_LAYERS.numbers]: 7, [DRAWING_LAYERS.draft]: 7,
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
