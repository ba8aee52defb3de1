import { LIMITS } from '../../../shared/schemas/limits';
import { DxfError } from '../dxf-error';
import { bump, type ContainerScan, type DxfScan, newContainer, PARSER_ENTITY_TYPES, READ_ENTITY_TYPES, where } from './containers';
import { GroupTokenizer, quote } from './tokenizer';

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

/** Group codes dxf-parser 1.1.2 reads inside an LWPOLYLINE vertex (x, y, z, widths, bulge). */
const LW_VERTEX_CODES: ReadonlySet<number> = new Set([10, 20, 30, 40, 41, 42]);

/**
 * Check the structure of `text` and collect what the reader needs besides dxf-parser's output.
 * Throws DxfError for a file that is not an ASCII DXF, is cut off, or is built wrong.
 */
export function scanDxf(text: string, maxEntities: number): DxfScan {
  const tok = new GroupTokenizer(text);

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

  while (tok.next()) {
    const code = tok.code;
    const codeLine = tok.codeLine;
    const codeStart = tok.codeStart;

    if (first) {
      first = false;
      if (code !== 0 || tok.value() !== 'SECTION') {
        throw new DxfError(
          'not-dxf',
          `This file is not an ASCII DXF drawing: its first group should be 0 / SECTION, but line ${codeLine} starts with ${quote(`${code} / ${tok.value()}`)}.`,
          { line: codeLine },
        );
      }
    }

    if (code === 0) {
      const value = tok.value();
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
      section = tok.value();
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
      table = tok.value();
      awaitTableName = false;
      continue;
    }
    if (inBlockHeader) {
      if (code === 2) block!.block = tok.value();
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
      if (container === entitiesScan) curPaper = tok.value() === '1';
    } else if (code === 210 || code === 220 || code === 230) {
      // Extrusion direction (DXF Reference, "Object Coordinate Systems"); default (0, 0, 1).
      if (curType === 'CIRCLE' || curType === 'ELLIPSE' || curType === 'TEXT') {
        const v = tok.number();
        if (code === 230 ? v !== 1 : v !== 0) curReread = true;
      }
    } else if (curType === 'SPLINE') {
      if (code === 41) curReread = true; // weights of a rational spline
    } else if (curType === 'LWPOLYLINE') {
      if (code === 90) {
        lwCount = tok.number();
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
        `The file ends inside the ${section || 'unnamed'} section that starts at line ${sectionLine}, without ENDSEC and EOF: it looks cut off after line ${tok.line}.`,
        { line: sectionLine },
      );
    }
    throw new DxfError(
      'truncated',
      `The file ends without the EOF marker (group 0 / EOF): it looks cut off after line ${tok.line}.`,
      { line: tok.line },
    );
  }

  return { entities: entitiesScan, blocks, sections, lines: tok.line, hasCR: tok.hasCR };
}
