/**
 * A large, valid ASCII DXF (R2000, millimetres) for benchmarks: a grid of fixture-plate-like
 * cells, each with an outline (LWPOLYLINE with bulged corners), holes (CIRCLE), slot arcs, lines,
 * points, an occasional label (TEXT) and block INSERT, and now and then an ELLIPSE or a SPLINE.
 * Entities average about 100 bytes, so 20 MB holds about 200,000 of them. The text never exceeds
 * targetBytes (the header alone excepted). Pure and deterministic: the same targetBytes gives the
 * same text.
 */
export function generateLargeDxf(targetBytes: number): string {
  const out: string[] = [];
  let size = 0;
  const tail = '  0\nENDSEC\n  0\nEOF\n';
  let full = false;
  const emit = (s: string): void => {
    if (full || size + s.length + tail.length > targetBytes) {
      full = true;
      return;
    }
    out.push(s);
    size += s.length;
  };
  let handle = 0x100;
  const h = (): string => (handle++).toString(16).toUpperCase();
  // Park–Miller minimal standard generator: deterministic coordinates without Math.random.
  let seed = 20_240_601;
  const rand = (): number => {
    seed = (seed * 48_271) % 2_147_483_647;
    return seed / 2_147_483_647;
  };
  const n = (v: number): string => v.toFixed(4);

  // The header, tables and block are always written, whatever the target.
  const head =
    [
      '  0', 'SECTION', '  2', 'HEADER',
      '  9', '$ACADVER', '  1', 'AC1015',
      '  9', '$INSUNITS', ' 70', '4',
      '  0', 'ENDSEC',
      '  0', 'SECTION', '  2', 'TABLES',
      '  0', 'TABLE', '  2', 'LAYER', ' 70', '4',
      '  0', 'LAYER', '  2', '0', ' 70', '0', ' 62', '7', '  6', 'CONTINUOUS',
      '  0', 'LAYER', '  2', 'OUTLINE', ' 70', '0', ' 62', '1', '  6', 'CONTINUOUS',
      '  0', 'LAYER', '  2', 'HOLES', ' 70', '0', ' 62', '3', '  6', 'CONTINUOUS',
      '  0', 'LAYER', '  2', 'NOTES', ' 70', '0', ' 62', '5', '  6', 'CONTINUOUS',
      '  0', 'ENDTAB',
      '  0', 'ENDSEC',
      '  0', 'SECTION', '  2', 'BLOCKS',
      '  0', 'BLOCK', '  8', '0', '  2', 'CLAMP', ' 70', '0', ' 10', '0.0', ' 20', '0.0', ' 30', '0.0', '  3', 'CLAMP',
      '  0', 'CIRCLE', '  8', 'HOLES', ' 10', '0.0', ' 20', '0.0', ' 40', '3.3',
      '  0', 'CIRCLE', '  8', 'HOLES', ' 10', '20.0', ' 20', '0.0', ' 40', '3.3',
      '  0', 'LINE', '  8', '0', ' 10', '-5.0', ' 20', '-5.0', ' 11', '25.0', ' 21', '-5.0',
      '  0', 'ENDBLK', '  8', '0',
      '  0', 'ENDSEC',
      '  0', 'SECTION', '  2', 'ENTITIES',
      '',
    ].join('\n');
  out.push(head);
  size += head.length;

  let cell = 0;
  while (!full) {
    const x0 = (cell % 100) * 120;
    const y0 = Math.floor(cell / 100) * 90;
    cell++;
    // Outline: 100 × 70 rectangle with 5 mm corner radii (bulge tan(90°/4)).
    const b = '0.4142135624';
    emit(
      `  0\nLWPOLYLINE\n  5\n${h()}\n  8\nOUTLINE\n 90\n8\n 70\n1\n` +
        ` 10\n${n(x0 + 5)}\n 20\n${n(y0)}\n 10\n${n(x0 + 95)}\n 20\n${n(y0)}\n 42\n${b}\n` +
        ` 10\n${n(x0 + 100)}\n 20\n${n(y0 + 5)}\n 10\n${n(x0 + 100)}\n 20\n${n(y0 + 65)}\n 42\n${b}\n` +
        ` 10\n${n(x0 + 95)}\n 20\n${n(y0 + 70)}\n 10\n${n(x0 + 5)}\n 20\n${n(y0 + 70)}\n 42\n${b}\n` +
        ` 10\n${n(x0)}\n 20\n${n(y0 + 65)}\n 10\n${n(x0)}\n 20\n${n(y0 + 5)}\n 42\n${b}\n`,
    );
    for (let k = 0; k < 12; k++) {
      emit(
        `  0\nCIRCLE\n  5\n${h()}\n  8\nHOLES\n 10\n${n(x0 + 10 + rand() * 80)}\n 20\n${n(y0 + 10 + rand() * 50)}\n 40\n${n(1 + rand() * 5)}\n`,
      );
    }
    for (let k = 0; k < 10; k++) {
      const lx = x0 + rand() * 100;
      const ly = y0 + rand() * 70;
      emit(
        `  0\nLINE\n  5\n${h()}\n  8\nOUTLINE\n 10\n${n(lx)}\n 20\n${n(ly)}\n 11\n${n(lx + rand() * 20)}\n 21\n${n(ly + rand() * 20)}\n`,
      );
    }
    for (let k = 0; k < 4; k++) {
      emit(
        `  0\nARC\n  5\n${h()}\n  8\nOUTLINE\n 10\n${n(x0 + 20 + rand() * 60)}\n 20\n${n(y0 + 20 + rand() * 30)}\n 40\n${n(2 + rand() * 8)}\n 50\n${n(rand() * 360)}\n 51\n${n(rand() * 360)}\n`,
      );
    }
    for (let k = 0; k < 3; k++) {
      emit(`  0\nPOINT\n  5\n${h()}\n  8\nHOLES\n 10\n${n(x0 + rand() * 100)}\n 20\n${n(y0 + rand() * 70)}\n`);
    }
    emit(`  0\nTEXT\n  5\n${h()}\n  8\nNOTES\n 10\n${n(x0 + 2)}\n 20\n${n(y0 + 72)}\n 40\n2.5\n  1\nPLATE ${cell}\n`);
    emit(`  0\nINSERT\n  5\n${h()}\n  8\nHOLES\n  2\nCLAMP\n 10\n${n(x0 + 40)}\n 20\n${n(y0 + 35)}\n 50\n${cell % 4 === 0 ? '90.0' : '0.0'}\n`);
    if (cell % 20 === 0) {
      emit(`  0\nELLIPSE\n  5\n${h()}\n  8\nOUTLINE\n 10\n${n(x0 + 50)}\n 20\n${n(y0 + 35)}\n 11\n12.0\n 21\n0.0\n 40\n0.4\n 41\n0.0\n 42\n6.283185307179586\n`);
    }
    if (cell % 40 === 0) {
      emit(
        `  0\nSPLINE\n  5\n${h()}\n  8\nOUTLINE\n 70\n8\n 71\n3\n 74\n4\n` +
          ` 11\n${n(x0 + 10)}\n 21\n${n(y0 + 10)}\n 11\n${n(x0 + 30)}\n 21\n${n(y0 + 30)}\n` +
          ` 11\n${n(x0 + 50)}\n 21\n${n(y0 + 10)}\n 11\n${n(x0 + 70)}\n 21\n${n(y0 + 30)}\n`,
      );
    }
  }
  out.push(tail);
  return out.join('');
}
