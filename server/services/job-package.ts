import { createHash } from 'node:crypto';
import JSZip from 'jszip';
import type { JobDetail } from '../../shared/schemas/job';
import type { TemplateVersion } from '../../shared/schemas/template-api';
import { isTurned } from '../../shared/gcode/offsets';
import { writeDrawingDxf } from '../dxf/write-dxf';
import { drawingToSvg } from '../dxf/drawing-svg';
import { jobDrawing, usedVersion } from './job-drawing';
import { setupSheetHtml } from './setup-sheet';
import { offsetsNc, stationsCsv, stationsXlsx } from './station-files';

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
    ['stations.csv', stationsCsv(v, used.stations)],
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
