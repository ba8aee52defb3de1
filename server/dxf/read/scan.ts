import { DxfError } from '../dxf-error';
import { type ContainerScan, type DxfScan, newContainer } from './containers';
import { EntityScan } from './scan-entity';
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
  const entity = new EntityScan(maxEntities);

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
      entity.finish(container);
      if (entity.isPart(value, valueLine, container)) continue;

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
        entity.start(container!, value, valueLine, codeStart);
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
          entity.start(container!, value, valueLine, codeStart);
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
    if (entity.type !== null) entity.group(container!, container === entitiesScan, tok);
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
