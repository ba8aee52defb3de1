/**
 * The mark that every file written from a template version that is not released carries at its
 * top (G-code's first comment, the spreadsheet's first row, a text on the drawing's own layer), so
 * a draft, a version in review or a retired one is never mistaken for the released layout. One
 * text for every file, naming the state and the content hash so the file can be traced to its version.
 */
export interface MarkedVersion {
  state: string;
  version: number | string;
  contentHash: string;
}

/** Only a released version's files go unmarked. */
export const isReleased = (v: Pick<MarkedVersion, 'state'>) => v.state === 'released';

/** The one-line mark, or null for a released version. Plain ASCII, no parentheses (a G-code comment holds it as is). */
export function draftMark(v: MarkedVersion): string | null {
  if (isReleased(v)) return null;
  return `NOT RELEASED - ${v.state.toUpperCase()} - VERSION ${v.version} - CONTENT HASH ${v.contentHash} - NOT FOR PRODUCTION`;
}
