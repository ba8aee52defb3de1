import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { supplierFlags, type CheckRun } from '../../app/features/stock-check/check-run';
import {
  AA_EXTRUDED_BAR_TOLERANCE_ROWS,
  NO_TOLERANCE_ROW,
  checkSupplierTolerance,
  lookupBarTolerance,
} from '../../shared/clamps/supplier-tolerance';

const MM = 25.4; // 1 in = 25.4 mm exactly (NIST SP 811, Appendix B)

/** A finished stock check as the screen keeps it, with one bar; only what supplierFlags reads is filled in. */
const run = (unit: 'in' | 'mm', stock: CheckRun['stock'], width: number): CheckRun =>
  ({ key: 'k', request: { unit, bars: [{ id: 'B1', width, thickness: stock.thickness ?? 0.5, cornerRadius: 0 }] }, stock } as unknown as CheckRun);

describe('lookupBarTolerance — the AA rows (Aluminum Standards and Data, extrusion cross-section tolerances, standard column)', () => {
  // Only the rows cited from the table are checked by value. The 0.250–0.499 and 1.500–1.999 rows
  // are from memory (see supplier-tolerance.ts); their values are not a standard this test can
  // cite, so what is checked for them is that everything the user sees says "from memory".
  it.each([
    // [nominal in, ± in], source
    [0.5, 0.009], // AA 0.500–0.749: ±0.009
    [0.625, 0.009], // AA 0.500–0.749
    [0.749, 0.009], // AA 0.500–0.749
    [0.7495, 0.009], // between 0.749 and 0.750 reads the row that starts at 0.500
    [0.75, 0.01], // AA 0.750–0.999: ±0.010
    [0.999, 0.01], // AA 0.750–0.999
    [1.0, 0.012], // AA 1.000–1.499: ±0.012
    [1.25, 0.012], // AA 1.000–1.499
    [1.499, 0.012], // AA 1.000–1.499
  ] as const)('%d in → ±%d in (cited row, not from memory)', (nominal, tol) => {
    const r = lookupBarTolerance(nominal, 'in');
    expect(r.tolerance).toBe(tol);
    expect(r.row?.fromMemory).toBe(false);
    expect(r.row !== null && r.fromMemory).toBe(false);
    expect(checkSupplierTolerance(nominal, nominal + 2 * tol, 'in').message).not.toContain('from memory');
  });

  it.each([0.25, 0.375, 0.4999, 1.5, 1.75, 1.999])('%d in reads a row marked from memory, and says so', (nominal) => {
    const r = lookupBarTolerance(nominal, 'in');
    expect(r.row?.fromMemory).toBe(true);
    expect(r.row !== null && r.fromMemory).toBe(true);
  });

  it('every nominal whose row is from memory says so in every message and in the rules the stock check screen lists', () => {
    const memoryRows = AA_EXTRUDED_BAR_TOLERANCE_ROWS.filter((r) => r.fromMemory);
    expect(memoryRows.length).toBeGreaterThan(0);
    fc.assert(
      fc.property(
        fc.constantFrom(...memoryRows),
        fc.double({ min: 0, max: 1, noNaN: true, maxExcluded: true }),
        fc.constantFrom('in' as const, 'mm' as const),
        fc.double({ min: -0.05, max: 0.05, noNaN: true }),
        (row, f, unit, dev) => {
          const nominalIn = row.fromIn + f * (row.toIn - row.fromIn - 1e-6);
          const nominal = unit === 'in' ? nominalIn : nominalIn * MM;
          const found = lookupBarTolerance(nominal, unit);
          expect(found.row?.label).toBe(row.label);
          const check = checkSupplierTolerance(nominal, nominal + dev * (unit === 'in' ? 1 : MM), unit);
          expect(check.fromMemory).toBe(true);
          expect(check.message).toMatch(/from memory: confirm against the current Aluminum Standards and Data/);
          const flags = supplierFlags(run(unit, { width: nominal }, nominal + dev));
          expect(flags.rules).toHaveLength(1);
          expect(flags.rules[0]).toMatch(/row from memory: confirm against the current Aluminum Standards and Data/);
        },
      ),
      { numRuns: 300 },
    );
  });

  it('the rules listed for a cited row do not say from memory', () => {
    const flags = supplierFlags(run('in', { width: 1.0, thickness: 0.5 }, 1.0));
    expect(flags.rules).toEqual(['width ±0.012 in (the 1.000–1.499 in row)', 'thickness ±0.009 in (the 0.500–0.749 in row)']); // AA rows above
  });

  it.each([0.1, 0.2499, 2.0, 3.0, 12])('%d in has no row, and says so', (nominal) => {
    const r = lookupBarTolerance(nominal, 'in');
    expect(r.tolerance).toBeNull();
    expect(r.row).toBeNull();
    expect(r.row === null && r.message).toBe(NO_TOLERANCE_ROW);
  });

  it('rows written in the table are marked as sourced, the neighbours as from memory', () => {
    expect(AA_EXTRUDED_BAR_TOLERANCE_ROWS.filter((r) => !r.fromMemory).map((r) => r.label)).toEqual(['0.500–0.749', '0.750–0.999', '1.000–1.499']);
    expect(AA_EXTRUDED_BAR_TOLERANCE_ROWS.filter((r) => r.fromMemory).map((r) => r.label)).toEqual(['0.250–0.499', '1.500–1.999']);
  });

  it.each([
    // [nominal mm, ± mm]: the inch row, by exact conversion both ways
    [12.7, 0.009 * MM], // 12.7 mm = 0.500 in → ±0.009 in = ±0.2286 mm
    [19.05, 0.01 * MM], // 19.05 mm = 0.750 in → ±0.010 in = ±0.254 mm
    [25.4, 0.012 * MM], // 25.4 mm = 1.000 in → ±0.012 in = ±0.3048 mm
    [25, 0.01 * MM], // 25 mm = 0.984 in → the 0.750–0.999 row
  ] as const)('%d mm → ±%d mm', (nominal, tol) => {
    expect(lookupBarTolerance(nominal, 'mm').tolerance).toBeCloseTo(tol, 12);
  });

  it('a metric size outside the rows has none', () => {
    expect(lookupBarTolerance(60, 'mm').tolerance).toBeNull(); // 60 mm = 2.362 in
  });
});

describe('checkSupplierTolerance — a supplier matter, apart from the clamp window', () => {
  it.each([
    // [nominal, measured, unit, outside]
    [1.0, 1.012, 'in', false], // +0.012 on ±0.012 (AA 1.000–1.499): on the limit, within (1.012 − 1 = 0.01200000000000001 in binary64)
    [1.0, 1.013, 'in', true], // +0.013 > 0.012
    [1.0, 0.987, 'in', true], // −0.013
    [0.75, 0.741, 'in', false], // −0.009 within ±0.010 (AA 0.750–0.999)
    [0.5, 0.51, 'in', true], // +0.010 > ±0.009 (AA 0.500–0.749)
    [25.4, 25.7, 'mm', false], // +0.30 mm within ±0.3048 mm
    [25.4, 25.71, 'mm', true], // +0.31 mm > 0.3048 mm
  ] as const)('%d → %d %s: outside %s', (nominal, measured, unit, outside) => {
    const r = checkSupplierTolerance(nominal, measured, unit);
    expect(r.outside).toBe(outside);
    expect(r.message.includes('a matter for the supplier')).toBe(outside);
  });

  it('words the flag plainly', () => {
    expect(checkSupplierTolerance(1.0, 1.045, 'in').message).toBe(
      '1.0450 in is 0.0450 in over its 1.0000 in nominal, outside ±0.012 in, the standard tolerance for 1.000–1.499 in — a matter for the supplier.',
    );
    expect(checkSupplierTolerance(1.5, 1.51, 'in').message).toContain('from memory');
  });

  it('without a row it does not guess', () => {
    const r = checkSupplierTolerance(3.0, 3.2, 'in');
    expect(r.outside).toBeNull();
    expect(r.tolerance).toBeNull();
    expect(r.message).toContain(NO_TOLERANCE_ROW);
  });
});
