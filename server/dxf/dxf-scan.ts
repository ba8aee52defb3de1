import { DxfError } from './dxf-error';
import { LIMITS } from '../../shared/schemas/limits';

/**
 * One pass over the group code / value pairs of an ASCII DXF file, before dxf-parser sees it.
 *
 * dxf-parser 1.1.2 is lenient in ways that hurt a server: it silently skips entity types it has
 * no handler for, drops some group codes (the extrusion direction of CIRCLE, ELLIPSE and TEXT,
 * the weights of a rational SPLINE), stops reading an LWPOLYLINE at a vertex identifier
 * (group 91), and loops forever on a POLYLINE without SEQEND or a LAYER/VPORT table without
 * ENDTAB. This scan checks the structure (DXF Reference, "DXF Files": sections, tables, blocks,
 * EOF), counts every entity by type, and remembers where the few entities that need a second
 * look start, so the reader can re-read just those. It walks the text with indexOf and slices
 * only the values it needs (entity names, block and section names), so it costs a small
 * fraction of the parse and makes no copy of the text.
 */

/** Entity types dxf-parser 1.1.2 keeps (its registerDefaultEntityHandlers); others it skips. */
export const PARSER_ENTITY_TYPES: ReadonlySet<string> = new Set([
  '3DFACE',
  'ARC',
  'ATTDEF',
  'CIRCLE',
  'DIMENSION',
  'ELLIPSE',
  'INSERT',
  'LINE',
  'LWPOLYLINE',
  'MTEXT',
  'POINT',
  'POLYLINE',
  'SOLID',
  'SPLINE',
  'TEXT',
]);

/** Entity types Gridset turns into geometry, points or notes. */
export const READ_ENTITY_TYPES: ReadonlySet<string> = new Set([
  'LINE',
  'ARC',
  'CIRCLE',
  'LWPOLYLINE',
  'POLYLINE',
  'ELLIPSE',
  'SPLINE',
  'POINT',
  'TEXT',
  'MTEXT',
  'INSERT',
]);

/** The entities of the ENTITIES section or of one block definition. */
export interface ContainerScan {
  /** Block name, or null for the ENTITIES section. */
  block: string | null;
  /** Line of the "0 / BLOCK" or "2 / ENTITIES" pair. */
  line: number;
  /** Entities by type, as written; VERTEX, SEQEND and ATTRIB belong to their owner. */
  types: Map<string, number>;
  /** Entities of types Gridset does not read (ATTRIB included), paper space left out. */
  unsupported: Map<string, number>;
  /** All entities, parts not counted. */
  total: number;
  /** How many of them dxf-parser keeps: the length of its entities array for this container. */
  parsed: number;
  /** Entities in paper space (group 67 = 1). */
  paperSpace: number;
  /** Index in dxf-parser's array → line of the entity's "0" group, for INSERTs and re-reads. */
  lines: Map<number, number>;
  /** Index in dxf-parser's array → offset in the text where the entity starts, to re-read. */
  reread: Map<number, number>;
}

export interface DxfScan {
  /** The ENTITIES section, or null when the file has none. */
  entities: ContainerScan | null;
  blocks: Map<string, ContainerScan>;
  /** Section names in file order. */
  sections: string[];
  /** Lines up to and including the EOF value. */
  lines: number;
  /** Whether the text holds any carriage return (then lines may end in \r\n or \r). */
  hasCR: boolean;
}

const CR = 13;
const LF = 10;

function newContainer(block: string | null, line: number): ContainerScan {
  return {
    block,
    line,
    types: new Map(),
    unsupported: new Map(),
    total: 0,
    parsed: 0,
    paperSpace: 0,
    lines: new Map(),
    reread: new Map(),
  };
}

function bump(map: Map<string, number>, key: string, by = 1): void {
  map.set(key, (map.get(key) ?? 0) + by);
}

function where(c: ContainerScan): string {
  return c.block === null ? 'the ENTITIES section' : `block "${c.block}"`;
}

function quote(s: string): string {
  const shown = s.length > 40 ? `${s.slice(0, 40)}…` : s;
  return JSON.stringify(shown);
}

/**
 * Check the structure of `text` and collect what the reader needs besides dxf-parser's output.
 * Throws DxfError for a file that is not an ASCII DXF, is cut off, or is built wrong.
 */
/** Group codes dxf-parser 1.1.2 reads inside an LWPOLYLINE vertex (x, y, z, widths, bulge). */
const LW_VERTEX_CODES: ReadonlySet<number> = new Set([10, 20, 30, 40, 41, 42]);

export function scanDxf(text: string, maxEntities: number): DxfScan {
  const len = text.length;
  // dxf-parser splits lines on \r\n, \r and \n; follow the same rule so pair counts agree.
  let nextCR = text.indexOf('\r');
  const hasCR = nextCR !== -1;

  // Line bookkeeping stays in plain locals (no closure touches them): this loop visits every line.
  let pos = 0;
  let lineNo = 0;

  const sections: string[] = [];
  const blocks = new Map<string, ContainerScan>();
  let entitiesScan: ContainerScan | null = null;

  let first = true;
  let sawEof = false;
  let section: string | null = null; // name of the open section, '' until its name is read
  let sectionLine = 0;
  let awaitSectionName = false;
  let table: string | null = null; // open table, '' until its name is read
  let tableLine = 0;
  let awaitTableName = false;
  let block: ContainerScan | null = null; // open block definition
  let inBlockHeader = false;
  let container: ContainerScan | null = null; // where entities go now
  let totalEntities = 0;

  // The entity being read.
  let curType: string | null = null;
  let curLine = 0;
  let curOffset = 0;
  let curParsed = -1;
  let curPaper = false;
  let curReread = false;
  let lwCount = 0;
  let lwListed = 0;
  let lwPrev = -1;
  let polylineOpen = 0; // line of a POLYLINE waiting for its SEQEND
  let attribsOpen = false; // an INSERT may be followed by ATTRIBs and a SEQEND
  let attribsPaper = false;

  const finishEntity = (): void => {
    if (curType === null || container === null) return;
    if (curType === 'LWPOLYLINE' && lwCount > lwListed) {
      throw new DxfError(
        'malformed',
        `The LWPOLYLINE at line ${curLine} in ${where(container)} declares ${lwCount.toLocaleString('en-US')} vertices (group 90) but lists ${lwListed}; the file is damaged.`,
        { line: curLine, block: container.block ?? undefined },
      );
    }
    if (curPaper) container.paperSpace++;
    else if (!READ_ENTITY_TYPES.has(curType)) bump(container.unsupported, curType);
    if (curReread && curParsed >= 0) {
      container.reread.set(curParsed, curOffset);
      container.lines.set(curParsed, curLine);
    }
    if (curType === 'POLYLINE') polylineOpen = curLine;
    else if (curType === 'INSERT') {
      attribsOpen = true;
      attribsPaper = curPaper;
    }
    curType = null;
  };

  const startEntity = (type: string, line: number, offset: number): void => {
    const c = container!;
    if (type === 'VERTEX' || type === 'SEQEND') return; // stray parts; dxf-parser skips them too
    if (type === 'ATTRIB') {
      bump(c.unsupported, type);
      return;
    }
    c.total++;
    totalEntities++;
    if (totalEntities > maxEntities) {
      throw new DxfError(
        'too-many-entities',
        `The drawing has more than ${maxEntities.toLocaleString('en-US')} entities (counting block definitions), more than Gridset reads from one file; the limit was passed at line ${line}.`,
        { line },
      );
    }
    bump(c.types, type);
    curType = type;
    curLine = line;
    curOffset = offset;
    curParsed = PARSER_ENTITY_TYPES.has(type) ? c.parsed++ : -1;
    curPaper = false;
    curReread = false;
    lwCount = 0;
    lwListed = 0;
    lwPrev = -1;
    if (type === 'INSERT') c.lines.set(curParsed, line);
  };

  while (pos < len) {
    // The group code line.
    const codeStart = pos;
    let codeEnd = text.indexOf('\n', pos);
    if (codeEnd === -1) codeEnd = len;
    if (hasCR) {
      if (nextCR !== -1 && nextCR < pos) nextCR = text.indexOf('\r', pos);
      if (nextCR !== -1 && nextCR < codeEnd) codeEnd = nextCR;
    }
    pos = text.charCodeAt(codeEnd) === CR && text.charCodeAt(codeEnd + 1) === LF ? codeEnd + 2 : codeEnd + 1;
    const codeLine = ++lineNo;

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
    if (negative) code = -code;
    if (digits === 0 || i !== codeEnd) {
      if (codeStart === codeEnd && pos >= len) break; // blank last line
      const shown = quote(text.slice(codeStart, Math.min(codeEnd, codeStart + 60)));
      if (first) {
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

    // The value line.
    if (pos >= len) {
      throw new DxfError(
        'truncated',
        `The file ends after the group code on line ${codeLine}, without its value: it looks cut off.`,
        { line: codeLine },
      );
    }
    const valueStart = pos;
    let valueEnd = text.indexOf('\n', pos);
    if (valueEnd === -1) valueEnd = len;
    if (hasCR) {
      if (nextCR !== -1 && nextCR < pos) nextCR = text.indexOf('\r', pos);
      if (nextCR !== -1 && nextCR < valueEnd) valueEnd = nextCR;
    }
    pos = text.charCodeAt(valueEnd) === CR && text.charCodeAt(valueEnd + 1) === LF ? valueEnd + 2 : valueEnd + 1;
    lineNo++;

    if (code === 999) continue; // comment

    if (first) {
      first = false;
      if (code !== 0 || text.slice(valueStart, valueEnd).trim() !== 'SECTION') {
        throw new DxfError(
          'not-dxf',
          `This file is not an ASCII DXF drawing: its first group should be 0 / SECTION, but line ${codeLine} starts with ${quote(`${code} / ${text.slice(valueStart, valueEnd).trim()}`)}.`,
          { line: codeLine },
        );
      }
    }

    if (code === 0) {
      const value = text.slice(valueStart, valueEnd).trim();
      // Messages name the line that holds the keyword (SECTION, LINE, …), as an editor shows it.
      const valueLine = codeLine + 1;
      if (awaitSectionName) {
        throw new DxfError('malformed', `The SECTION at line ${sectionLine} has no name (group 2).`, { line: sectionLine });
      }
      if (awaitTableName) {
        throw new DxfError('malformed', `The TABLE at line ${tableLine} has no name (group 2).`, { line: tableLine });
      }
      finishEntity();

      if (polylineOpen !== 0) {
        if (value === 'VERTEX') continue;
        if (value === 'SEQEND') {
          polylineOpen = 0;
          continue;
        }
        throw new DxfError(
          'malformed',
          `The POLYLINE at line ${polylineOpen} is not closed by SEQEND: line ${valueLine} starts ${value || 'an unnamed group'} instead.`,
          { line: polylineOpen },
        );
      }
      if (attribsOpen) {
        if (value === 'ATTRIB') {
          if (!attribsPaper) bump(container!.unsupported, 'ATTRIB');
          continue;
        }
        attribsOpen = false;
        if (value === 'SEQEND') continue;
      }

      if (value === 'SECTION') {
        if (section !== null) {
          throw new DxfError(
            'truncated',
            `The ${section || 'unnamed'} section that starts at line ${sectionLine} is not closed by ENDSEC before the next SECTION at line ${valueLine}.`,
            { line: sectionLine },
          );
        }
        section = '';
        sectionLine = valueLine;
        awaitSectionName = true;
        continue;
      }
      if (value === 'ENDSEC') {
        if (section === null) {
          throw new DxfError('malformed', `Line ${valueLine} closes a section (ENDSEC) that was never opened.`, { line: valueLine });
        }
        if (table !== null) {
          throw new DxfError('truncated', `The ${table} table that starts at line ${tableLine} is not closed by ENDTAB.`, { line: tableLine });
        }
        if (block !== null) {
          throw new DxfError(
            'truncated',
            `Block "${block.block ?? ''}" that starts at line ${block.line} is not closed by ENDBLK before the end of the BLOCKS section.`,
            { line: block.line, block: block.block ?? undefined },
          );
        }
        section = null;
        container = null;
        continue;
      }
      if (value === 'EOF') {
        if (section !== null) {
          throw new DxfError(
            'truncated',
            `The ${section || 'unnamed'} section that starts at line ${sectionLine} is not closed by ENDSEC before EOF.`,
            { line: sectionLine },
          );
        }
        sawEof = true;
        break;
      }

      if (section === 'ENTITIES') {
        startEntity(value, valueLine, codeStart);
      } else if (section === 'BLOCKS') {
        if (value === 'BLOCK') {
          if (block !== null) {
            throw new DxfError(
              'truncated',
              `Block "${block.block ?? ''}" that starts at line ${block.line} is not closed by ENDBLK before the next BLOCK at line ${valueLine}.`,
              { line: block.line, block: block.block ?? undefined },
            );
          }
          block = newContainer('', valueLine);
          container = block;
          inBlockHeader = true;
        } else if (value === 'ENDBLK') {
          if (block === null) {
            throw new DxfError('malformed', `Line ${valueLine} ends a block (ENDBLK) that was never begun.`, { line: valueLine });
          }
          if (block.block) blocks.set(block.block, block); // dxf-parser too keeps the last of a name
          block = null;
          container = null;
          inBlockHeader = false;
        } else if (block !== null) {
          inBlockHeader = false;
          startEntity(value, valueLine, codeStart);
        }
      } else if (section === 'TABLES') {
        if (value === 'TABLE') {
          if (table !== null) {
            throw new DxfError(
              'truncated',
              `The ${table} table that starts at line ${tableLine} is not closed by ENDTAB before the next TABLE at line ${valueLine}.`,
              { line: tableLine },
            );
          }
          table = '';
          tableLine = valueLine;
          awaitTableName = true;
        } else if (value === 'ENDTAB') {
          table = null;
        } else if ((table === 'LAYER' || table === 'VPORT') && value !== table) {
          throw new DxfError(
            'malformed',
            `The ${table} table that starts at line ${tableLine} holds a ${value || 'nameless'} record at line ${valueLine}; it may hold only ${table} records.`,
            { line: valueLine },
          );
        }
      }
      continue;
    }

    if (awaitSectionName) {
      if (code !== 2) {
        throw new DxfError('malformed', `The SECTION at line ${sectionLine} has no name (group 2).`, { line: sectionLine });
      }
      section = text.slice(valueStart, valueEnd).trim();
      sections.push(section);
      awaitSectionName = false;
      if (section === 'ENTITIES') {
        entitiesScan = newContainer(null, codeLine + 1);
        container = entitiesScan;
      }
      continue;
    }
    if (awaitTableName) {
      if (code !== 2) {
        throw new DxfError('malformed', `The TABLE at line ${tableLine} has no name (group 2).`, { line: tableLine });
      }
      table = text.slice(valueStart, valueEnd).trim();
      awaitTableName = false;
      continue;
    }
    if (inBlockHeader) {
      if (code === 2) block!.block = text.slice(valueStart, valueEnd).trim();
      continue;
    }
    if (curType === null) continue;

    // dxf-parser 1.1.2 reads an LWPOLYLINE vertex until a code it does not know, then steps back
    // two groups: right after a group 10 that lands on the 10 again, and it loops for ever.
    if (curType === 'LWPOLYLINE') {
      if (lwPrev === 10 && !LW_VERTEX_CODES.has(code)) {
        throw new DxfError(
          'malformed',
          `The LWPOLYLINE at line ${curLine} in ${where(container!)} has a vertex x (group 10) at line ${codeLine - 2} followed by group ${code} instead of its y (group 20); the file is damaged.`,
          { line: curLine, block: container!.block ?? undefined },
        );
      }
      lwPrev = code;
    }

    // Group codes inside an entity that dxf-parser 1.1.2 does not keep or mishandles.
    if (code === 67) {
      if (container === entitiesScan) curPaper = text.slice(valueStart, valueEnd).trim() === '1';
    } else if (code === 210 || code === 220 || code === 230) {
      // Extrusion direction (DXF Reference, "Object Coordinate Systems"); default (0, 0, 1).
      if (curType === 'CIRCLE' || curType === 'ELLIPSE' || curType === 'TEXT') {
        const v = Number(text.slice(valueStart, valueEnd));
        if (code === 230 ? v !== 1 : v !== 0) curReread = true;
      }
    } else if (curType === 'SPLINE') {
      if (code === 41) curReread = true; // weights of a rational spline
    } else if (curType === 'LWPOLYLINE') {
      if (code === 90) {
        lwCount = Number(text.slice(valueStart, valueEnd));
        // dxf-parser makes as many vertices as group 90 declares, listed or not: bound it first.
        if (lwCount > LIMITS.dxfPolylineVertices) {
          throw new DxfError(
            'too-large',
            `The LWPOLYLINE at line ${curLine} in ${where(container!)} declares ${lwCount.toLocaleString('en-US')} vertices (group 90); Gridset reads polylines of up to ${LIMITS.dxfPolylineVertices.toLocaleString('en-US')}. Simplify it or split it.`,
            { line: curLine, block: container!.block ?? undefined },
          );
        }
      } else if (code === 10) lwListed++;
      else if (code === 91) curReread = true; // vertex identifier, R2010+
      if (code === 10 && !(lwCount > 0)) {
        throw new DxfError(
          'malformed',
          `The LWPOLYLINE at line ${curLine} in ${where(container!)} lists vertices, but its vertex count (group 90) is missing or zero.`,
          { line: curLine, block: container!.block ?? undefined },
        );
      }
    }
  }

  if (!sawEof) {
    if (first) throw new DxfError('empty', 'The file is empty: it holds no DXF data.');
    if (section !== null) {
      throw new DxfError(
        'truncated',
        `The file ends inside the ${section || 'unnamed'} section that starts at line ${sectionLine}, without ENDSEC and EOF: it looks cut off after line ${lineNo}.`,
        { line: sectionLine },
      );
    }
    throw new DxfError(
      'truncated',
      `The file ends without the EOF marker (group 0 / EOF): it looks cut off after line ${lineNo}.`,
      { line: lineNo },
    );
  }

  return { entities: entitiesScan, blocks, sections, lines: lineNo, hasCR };
}

/** A group code and its raw value line, for re-reading one entity. */
export interface RawGroup {
  code: number;
  value: string;
}

/**
 * The groups of the entity that starts at `offset` (its "0" group included), up to the next
 * "0" group. Used for the few entities dxf-parser reads incompletely. `hasCR` (from the scan)
 * says whether to look for carriage returns at all: looking for one in a file without any
 * would run to the end of the text for every line.
 */
export function readEntityGroups(text: string, offset: number, hasCR: boolean): RawGroup[] {
  const groups: RawGroup[] = [];
  let pos = offset;
  const len = text.length;
  const next = (): string | null => {
    if (pos >= len) return null;
    let end = text.indexOf('\n', pos);
    if (end === -1) end = len;
    if (hasCR) {
      const cr = text.indexOf('\r', pos);
      if (cr !== -1 && cr < end) end = cr;
    }
    const line = text.slice(pos, end);
    pos = text.charCodeAt(end) === CR && text.charCodeAt(end + 1) === LF ? end + 2 : end + 1;
    return line;
  };
  for (;;) {
    const codeLine = next();
    const value = next();
    if (codeLine === null || value === null) break;
    const code = Number.parseInt(codeLine, 10);
    if (code === 0 && groups.length > 0) break;
    groups.push({ code, value: value.trim() });
  }
  return groups;
}
