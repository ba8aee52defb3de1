import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { DxfError, inspectDxf } from '../../server/dxf/read-dxf';
import { circle, dxfDocument, entity, insert, line, pairsText } from './dxf-test-helpers';

const jawRail = readFileSync(join(import.meta.dirname, '../fixtures/dxf/jaw-rail-inch-r2000.dxf'), 'utf8');

/** The DxfError inspectDxf throws for `text`, failing the test if it throws nothing or something else. */
function errorOf(text: string, options?: { maxEntities?: number }): DxfError {
  try {
    inspectDxf(text, options);
  } catch (err) {
    expect(err).toBeInstanceOf(DxfError);
    return err as DxfError;
  }
  throw new Error('inspectDxf did not throw');
}

/** 1-based line number of the first line that equals `value` after `after` lines. */
const lineOf = (text: string, value: string, after = 0) => text.split('\n').findIndex((l, i) => i >= after && l.trim() === value) + 1;

describe('inspectDxf refuses bad input with a DxfError that says what is wrong', () => {
  it('an empty file', () => {
    const e = errorOf('');
    expect(e.code).toBe('empty');
    expect(e.message).toBe('The file is empty: it holds no DXF data.');
  });

  it('a file of blank lines', () => {
    expect(errorOf('  \r\n\n   \n').code).toBe('empty');
  });

  it('a file that is not a DXF at all', () => {
    const e = errorOf('%PDF-1.7\n%âãÏÓ\n1 0 obj\n');
    expect(e.code).toBe('not-dxf');
    expect(e.line).toBe(1);
    expect(e.message).toMatch(/^This file is not an ASCII DXF drawing: it should begin with the group code 0 and the value SECTION, but line 1 holds "%PDF-1.7"\.$/);
  });

  it('a file whose first group is not 0 / SECTION', () => {
    const e = errorOf(pairsText([[0, 'LINE'], [8, 'L'], [0, 'EOF']]));
    expect(e.code).toBe('not-dxf');
    expect(e.message).toMatch(/first group should be 0 \/ SECTION, but line 1 starts with "0 \/ LINE"/);
  });

  it('a binary DXF', () => {
    const e = errorOf('AutoCAD Binary DXF\r\n\u001a\u0000\u0000\u0000SECTION');
    expect(e.code).toBe('binary');
    expect(e.message).toBe('This is a binary DXF file; Gridset reads ASCII DXF only. Save the drawing again as ASCII DXF.');
  });

  it('a DWG file', () => {
    expect(errorOf('AC1032\u0000\u0000\u0000\u0000\u0000\u0006\u0001').code).toBe('not-dxf');
  });

  it('a file cut off in the middle (no EOF, ENTITIES not closed)', () => {
    // Cut after the layer name of the first bolt-hole CIRCLE.
    const at = jawRail.indexOf('RAIL-BOLT', jawRail.indexOf('ENTITIES'));
    const cut = jawRail.slice(0, at + 'RAIL-BOLT\n'.length);
    const e = errorOf(cut);
    expect(e.code).toBe('truncated');
    const sectionLine = lineOf(cut, 'ENTITIES') - 2; // the "SECTION" line before "2 / ENTITIES"
    expect(e.line).toBe(sectionLine);
    expect(e.message).toBe(
      `The file ends inside the ENTITIES section that starts at line ${sectionLine}, without ENDSEC and EOF: it looks cut off after line ${cut.split('\n').length - 1}.`,
    );
  });

  it('a file cut off after a group code, before its value', () => {
    const text = dxfDocument({ entities: [line('L', 0, 0, 1, 1)] });
    const cut = text.slice(0, text.lastIndexOf(' 21\n') + 4);
    expect(errorOf(cut).message).toMatch(/^The file ends after the group code on line \d+, without its value: it looks cut off\.$/);
  });

  it('a file whose sections are closed but which lacks EOF', () => {
    const text = dxfDocument({ entities: [line('L', 0, 0, 1, 1)] }).replace(/ {2}0\nEOF\n$/, '');
    const e = errorOf(text);
    expect(e.code).toBe('truncated');
    expect(e.message).toMatch(/^The file ends without the EOF marker \(group 0 \/ EOF\): it looks cut off after line \d+\.$/);
  });

  it('a section that is not closed before the next one', () => {
    const text = pairsText([[0, 'SECTION'], [2, 'HEADER'], [9, '$INSUNITS'], [70, 1], [0, 'SECTION'], [2, 'ENTITIES'], ...line('L', 0, 0, 1, 1), [0, 'ENDSEC'], [0, 'EOF']]);
    const e = errorOf(text);
    expect(e.code).toBe('truncated');
    expect(e.line).toBe(2);
    expect(e.message).toBe('The HEADER section that starts at line 2 is not closed by ENDSEC before the next SECTION at line 10.');
  });

  it('a block that is not closed by ENDBLK', () => {
    const text = pairsText([
      [0, 'SECTION'], [2, 'BLOCKS'], [0, 'BLOCK'], [2, 'OPEN'], [10, 0], [20, 0], ...circle('0', 0, 0, 1), [0, 'ENDSEC'],
      [0, 'SECTION'], [2, 'ENTITIES'], ...insert('0', 'OPEN', 0, 0), [0, 'ENDSEC'], [0, 'EOF'],
    ]);
    const e = errorOf(text);
    expect(e.code).toBe('truncated');
    expect(e.block).toBe('OPEN');
    expect(e.message).toBe('Block "OPEN" that starts at line 6 is not closed by ENDBLK before the end of the BLOCKS section.');
  });

  it('a drawing with an empty ENTITIES section', () => {
    const e = errorOf(dxfDocument({ insunits: 1, entities: [] }));
    expect(e.code).toBe('no-entities');
    expect(e.message).toMatch(/^The drawing has no entities: its ENTITIES section \(line \d+\) is empty\.$/);
  });

  it('a drawing with no ENTITIES section', () => {
    const e = errorOf(pairsText([[0, 'SECTION'], [2, 'HEADER'], [9, '$INSUNITS'], [70, 4], [0, 'ENDSEC'], [0, 'EOF']]));
    expect(e.code).toBe('no-entities');
    expect(e.message).toBe('The drawing has no entities: the file has no ENTITIES section.');
  });

  it('an INSERT of a block the file does not define, with its line', () => {
    const text = dxfDocument({ entities: [circle('C', 0, 0, 1), insert('FIX', 'VISE-JAW', 10, 0)] });
    const e = errorOf(text);
    expect(e.code).toBe('missing-block');
    expect(e.block).toBe('VISE-JAW');
    expect(e.line).toBe(lineOf(text, 'INSERT'));
    expect(e.message).toBe(`An INSERT in the ENTITIES section at line ${e.line} refers to block "VISE-JAW", which the BLOCKS section does not define.`);
  });

  it('an INSERT of a missing block inside another block', () => {
    const text = dxfDocument({ blocks: [{ name: 'OUTER', entities: [insert('0', 'GONE', 0, 0)] }], entities: [insert('0', 'OUTER', 0, 0)] });
    const e = errorOf(text);
    expect(e.message).toBe(`An INSERT in block "OUTER" at line ${lineOf(text, 'INSERT')} refers to block "GONE", which the BLOCKS section does not define.`);
  });

  it('recursive blocks: A inserts B, which inserts A', () => {
    const text = dxfDocument({
      blocks: [
        { name: 'A', entities: [circle('0', 0, 0, 1), insert('0', 'B', 5, 0)] },
        { name: 'B', entities: [insert('0', 'A', 5, 0)] },
      ],
      entities: [insert('0', 'A', 0, 0)],
    });
    const e = errorOf(text);
    expect(e.code).toBe('recursive-block');
    expect(e.block).toBe('A');
    expect(e.message).toBe('Block "A" inserts "B" inserts "A" again: blocks that insert themselves cannot be expanded.');
  });

  it('a block that inserts itself', () => {
    const e = errorOf(dxfDocument({ blocks: [{ name: 'SELF', entities: [insert('0', 'SELF', 1, 0)] }], entities: [insert('0', 'SELF', 0, 0)] }));
    expect(e.code).toBe('recursive-block');
    expect(e.message).toBe('Block "SELF" inserts "SELF" again: blocks that insert themselves cannot be expanded.');
  });

  it('too many entities in the file, refused before parsing', () => {
    const e = errorOf(dxfDocument({ entities: [1, 2, 3, 4].map((i) => circle('C', i, 0, 1)) }), { maxEntities: 3 });
    expect(e.code).toBe('too-many-entities');
    expect(e.message).toMatch(/^The drawing has more than 3 entities \(counting block definitions\), more than Gridset reads from one file; the limit was passed at line \d+\.$/);
  });

  it('too many entities once blocks are expanded', () => {
    const ten = { name: 'TEN', entities: Array.from({ length: 10 }, (_, i) => circle('0', i, 0, 0.1)) };
    const hundred = { name: 'HUNDRED', entities: Array.from({ length: 10 }, (_, i) => insert('0', 'TEN', 0, i)) };
    const text = dxfDocument({ blocks: [ten, hundred], entities: [insert('0', 'HUNDRED', 0, 0), insert('0', 'HUNDRED', 0, 100)] });
    expect(inspectDxf(text, { maxEntities: 200 }).circles).toHaveLength(200);
    const e = errorOf(text, { maxEntities: 199 });
    expect(e.code).toBe('too-many-entities');
    expect(e.message).toBe('Once its blocks are inserted the drawing has more than 199 entities, more than Gridset reads from one file.');
  });

  it('a POLYLINE without SEQEND (dxf-parser would loop forever)', () => {
    const text = dxfDocument({
      entities: [entity('POLYLINE', 'P', [66, 1], [70, 1]), entity('VERTEX', 'P', [10, 0], [20, 0]), entity('VERTEX', 'P', [10, 1], [20, 0]), line('L', 0, 0, 1, 1)],
    });
    const e = errorOf(text);
    expect(e.code).toBe('malformed');
    expect(e.line).toBe(lineOf(text, 'POLYLINE'));
    expect(e.message).toMatch(/^The POLYLINE at line \d+ is not closed by SEQEND: line \d+ starts LINE instead\.$/);
  });

  it('a LAYER table holding another kind of record (dxf-parser would loop forever)', () => {
    const text = pairsText([
      [0, 'SECTION'], [2, 'TABLES'], [0, 'TABLE'], [2, 'LAYER'], [70, 1], [0, 'LAYER'], [2, 'A'], [0, 'LTYPE'], [2, 'X'], [0, 'ENDTAB'], [0, 'ENDSEC'],
      [0, 'SECTION'], [2, 'ENTITIES'], ...line('A', 0, 0, 1, 1), [0, 'ENDSEC'], [0, 'EOF'],
    ]);
    const e = errorOf(text);
    expect(e.code).toBe('malformed');
    expect(e.message).toBe('The LAYER table that starts at line 6 holds a LTYPE record at line 16; it may hold only LAYER records.');
  });

  it('a line where a group code should be', () => {
    const text = dxfDocument({ entities: [line('L', 0, 0, 1, 1)] }).replace(' 11\n', 'eleven\n');
    const e = errorOf(text);
    expect(e.code).toBe('malformed');
    expect(e.line).toBe(lineOf(text, 'eleven'));
    expect(e.message).toBe(`Line ${e.line} should hold a group code (a whole number) but holds "eleven"; the file is damaged or its lines are out of step.`);
  });

  it('an LWPOLYLINE that lists vertices without a vertex count', () => {
    const text = dxfDocument({ entities: [entity('LWPOLYLINE', 'P', [70, 0], [10, 0], [20, 0], [10, 1], [20, 1])] });
    const e = errorOf(text);
    expect(e.code).toBe('malformed');
    expect(e.message).toBe(`The LWPOLYLINE at line ${lineOf(text, 'LWPOLYLINE')} in the ENTITIES section lists vertices, but its vertex count (group 90) is missing or zero.`);
  });

  it('a coordinate that is not a number', () => {
    const e = errorOf(dxfDocument({ entities: [line('L', 0, 0, 1, 1)] }).replace(' 21\n1\n', ' 21\nabc\n'));
    expect(e.code).toBe('malformed');
    expect(e.message).toBe('A LINE entity on layer "L" has a coordinate that is not a finite number.');
  });
});
