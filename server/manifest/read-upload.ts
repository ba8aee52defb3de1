import type { NamingConvention } from '../../shared/schemas/naming';
import { HttpError } from '../middleware/errors';
import type { ManifestRead } from './manifest-types';
import { readManifest, readManifestCsv } from './read-manifest';

const ZIP_SIGNATURE = Buffer.from([0x50, 0x4b, 0x03, 0x04]);

/**
 * An uploaded manifest read against the convention: a workbook when it is a zip (Office Open XML,
 * ECMA-376 Part 2), else CSV text; judged by content, not name. Runs in a pool process.
 */
export async function readManifestUpload(buf: Buffer, convention: NamingConvention): Promise<ManifestRead> {
  if (buf.subarray(0, 4).equals(ZIP_SIGNATURE)) return readManifest(buf, { convention });
  if (buf.includes(0)) throw new HttpError(400, 'manifest-not-xlsx', 'The file is neither an XLSX workbook nor CSV text; save it from your spreadsheet as .xlsx or .csv.');
  return readManifestCsv(buf.toString('utf8'), { convention });
}
