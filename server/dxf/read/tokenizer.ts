import { DxfError } from '../dxf-error';

/**
 * Gridset's one reader of ASCII DXF group code / value pairs (DXF Reference, "DXF Files" and
 * "Group Codes"): a group is a code line holding an integer (blanks around it allowed) and a
 * value line. Lines end in \n, \r\n or \r, as dxf-parser splits them, so line numbers agree with
 * it. The structure scan and every re-read of an entity go through this class; dxf-parser keeps
 * its own reading of entities. It walks the text with indexOf and slices only the values asked
 * for, so it makes no copy of the text.
 */
export class GroupTokenizer {
  /** Offset of the next unread line. */
  pos: number;
  /** Number of the last line read (1-based, counted from where reading began). */
  line = 0;
  /** The current group's code. */
  code = 0;
  /** Offset where the current group's code line starts: an entity's start, to re-read it. */
  codeStart = 0;
  /** Line of the current group's code. */
  codeLine = 0;
  /** The current group's value line, as offsets into the text. */
  valueStart = 0;
  valueEnd = 0;
  /** Whether a group other than a 999 comment has been read. */
  started = false;
  private nextCR: number;
  private readonly len: number;

  /**
   * `hasCR` says whether the text holds any carriage return; without one, looking for one on
   * every line would run to the end of the text each time.
   */
  constructor(
    readonly text: string,
    start = 0,
    readonly hasCR = text.indexOf('\r') !== -1,
  ) {
    this.pos = start;
    this.len = text.length;
    this.nextCR = hasCR ? text.indexOf('\r', start) : -1;
  }

  /** End of the line starting at this.pos; moves pos past its line break. */
  private lineEnd(): number {
    const { text, pos } = this;
    let end = text.indexOf('\n', pos);
    if (end === -1) end = this.len;
    if (this.hasCR) {
      if (this.nextCR !== -1 && this.nextCR < pos) this.nextCR = text.indexOf('\r', pos);
      if (this.nextCR !== -1 && this.nextCR < end) end = this.nextCR;
    }
    this.pos = text.charCodeAt(end) === 13 && text.charCodeAt(end + 1) === 10 ? end + 2 : end + 1;
    this.line++;
    return end;
  }

  /**
   * Reads the next group, skipping 999 comments. Returns false at the end of the text (a blank
   * last line included). Throws DxfError for a code line that is not a whole number and for a
   * code without its value line.
   */
  next(): boolean {
    const { text, len } = this;
    for (;;) {
      if (this.pos >= len) return false;
      const codeStart = this.pos;
      const codeEnd = this.lineEnd();
      const codeLine = this.line;
      // Group code: an integer, optionally padded with blanks (DXF Reference, "Group Codes").
      let i = codeStart;
      let c = text.charCodeAt(i);
      while (i < codeEnd && (c === 32 || c === 9)) c = text.charCodeAt(++i);
      let negative = false;
      if (c === 45) {
        negative = true;
        c = text.charCodeAt(++i);
      }
      let code = 0;
      let digits = 0;
      while (i < codeEnd && c >= 48 && c <= 57) {
        code = code * 10 + (c - 48);
        digits++;
        c = text.charCodeAt(++i);
      }
      while (i < codeEnd && (c === 32 || c === 9)) c = text.charCodeAt(++i);
      if (digits === 0 || i !== codeEnd) {
        if (codeStart === codeEnd && this.pos >= len) return false; // blank last line
        this.badCode(codeStart, codeEnd, codeLine);
      }
      if (this.pos >= len) {
        throw new DxfError(
          'truncated',
          `The file ends after the group code on line ${codeLine}, without its value: it looks cut off.`,
          { line: codeLine },
        );
      }
      const valueStart = this.pos;
      const valueEnd = this.lineEnd();
      if (code === 999) continue; // comment
      this.code = negative ? -code : code;
      this.codeStart = codeStart;
      this.codeLine = codeLine;
      this.valueStart = valueStart;
      this.valueEnd = valueEnd;
      this.started = true;
      return true;
    }
  }

  private badCode(codeStart: number, codeEnd: number, codeLine: number): never {
    const shown = quote(this.text.slice(codeStart, Math.min(codeEnd, codeStart + 60)));
    if (!this.started) {
      throw new DxfError(
        'not-dxf',
        `This file is not an ASCII DXF drawing: it should begin with the group code 0 and the value SECTION, but line ${codeLine} holds ${shown}.`,
        { line: codeLine },
      );
    }
    throw new DxfError(
      'malformed',
      `Line ${codeLine} should hold a group code (a whole number) but holds ${shown}; the file is damaged or its lines are out of step.`,
      { line: codeLine },
    );
  }

  /** The current value, blanks around it removed. */
  value(): string {
    return this.text.slice(this.valueStart, this.valueEnd).trim();
  }

  /** The current value as a number (NaN when it is not one). */
  number(): number {
    return Number(this.text.slice(this.valueStart, this.valueEnd));
  }
}

/** A value for a message: quoted, cut at 40 characters. */
export function quote(s: string): string {
  const shown = s.length > 40 ? `${s.slice(0, 40)}…` : s;
  return JSON.stringify(shown);
}

/** A group code and its value, blanks removed, for re-reading one entity. */
export interface RawGroup {
  code: number;
  value: string;
}

/**
 * The groups of the entity that starts at `offset` (its "0" group included), up to the next
 * "0" group. Used for the few entities dxf-parser reads incompletely, on text the structure
 * scan has already checked.
 */
export function readEntityGroups(text: string, offset: number, hasCR: boolean): RawGroup[] {
  const groups: RawGroup[] = [];
  const t = new GroupTokenizer(text, offset, hasCR);
  while (t.next()) {
    if (t.code === 0 && groups.length > 0) break;
    groups.push({ code: t.code, value: t.value() });
  }
  return groups;
}
