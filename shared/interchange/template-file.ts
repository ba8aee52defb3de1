import type { Station, TemplateContent } from '../schemas/template';

/** The interchange file of one template version (schemas/template-version.schema.json). */
export const TEMPLATE_FORMAT = 'gridset-template';
export const TEMPLATE_FORMAT_VERSION = 1;

export interface TemplateFile extends TemplateContent {
  format: typeof TEMPLATE_FORMAT;
  formatVersion: typeof TEMPLATE_FORMAT_VERSION;
  /** SHA-256 of the canonical JSON of the layout (see layoutForHash); informative on import. */
  contentHash?: string;
  version?: number;
  state?: string;
  /** Derived from the layout; recomputed on import. */
  stations: Station[];
}

/**
 * What the content hash covers: the layout — plate, components, placements, shared offset,
 * numbering and unit — not the template's name, so a version keeps its hash when it is
 * exported and imported under another name.
 */
export function layoutForHash(content: TemplateContent) {
  const { name: _name, ...layout } = content;
  return layout;
}

export function toTemplateFile(content: TemplateContent, stations: Station[], meta: { contentHash: string; version: number; state: string }): TemplateFile {
  return {
    format: TEMPLATE_FORMAT,
    formatVersion: TEMPLATE_FORMAT_VERSION,
    ...content,
    ...meta,
    stations,
  };
}
