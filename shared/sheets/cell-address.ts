/**
 * Spreadsheet column letters and A1 cell addresses, as SpreadsheetML writes them (ECMA-376 Part 1,
 * §18.3.1.4, the c element's r attribute, and §18.17.2.3.1, A1-style cell references): columns
 * A–Z, then AA–ZZ, then AAA…, rows from 1. Columns are numbered from 1 here, as the sheet shows them;
 * a caller holding a 0-based array index adds 1.
 * Letters are read regardless of case. A sheet runs from A1 to XFD1048576 (ECMA-376 Part 1,
 * §18.17, limits), so anything outside is refused rather than written into a file no reader opens.
 */

export const MAX_COLUMN = 16_384; // XFD
export const MAX_ROW = 1_048_576;

const A = 'A'.charCodeAt(0);

function assertColumn(n: number): void {
  if (!Number.isInteger(n) || n < 1 || n > MAX_COLUMN) {
    throw new RangeError(`A column number must be a whole number from 1 to ${MAX_COLUMN} (A to XFD); got ${n}.`);
  }
}

/** 1 → A, 26 → Z, 27 → AA, 702 → ZZ, 703 → AAA: base 26 with digits 1–26 (there is no zero letter). */
export function columnLetter(n: number): string {
  assertColumn(n);
  let letters = '';
  let rest = n;
  while (rest > 0) {
    const digit = (rest - 1) % 26;
    letters = String.fromCharCode(A + digit) + letters;
    rest = (rest - 1 - digit) / 26;
  }
  return letters;
}

/** AA → 27; letters only, in either case. */
export function columnNumber(letters: string): number {
  if (!/^[A-Za-z]{1,3}$/.test(letters)) {
    throw new RangeError(`A column is written with 1 to 3 letters, A to XFD; got "${letters}".`);
  }
  let n = 0;
  for (const ch of letters.toUpperCase()) n = n * 26 + (ch.charCodeAt(0) - A + 1);
  if (n > MAX_COLUMN) throw new RangeError(`Column "${letters}" is past XFD, the last column of a sheet.`);
  return n;
}

/** (1, 1) → A1, (28, 5) → AB5. */
export function cellAddress(col: number, row: number): string {
  if (!Number.isInteger(row) || row < 1 || row > MAX_ROW) {
    throw new RangeError(`A row number must be a whole number from 1 to ${MAX_ROW}; got ${row}.`);
  }
  return `${columnLetter(col)}${row}`;
}

/** "B7" → { col: 2, row: 7 }: letters then a row number, no "$" and no spaces; letters in either case. */
export function parseCellAddress(address: string): { col: number; row: number } {
  const m = /^([A-Za-z]{1,3})([1-9]\d{0,6})$/.exec(address);
  if (!m) throw new RangeError(`A cell address is column letters then a row number, e.g. B7; got "${address.slice(0, 20)}".`);
  const row = Number(m[2]);
  if (row > MAX_ROW) throw new RangeError(`Row ${row} is past ${MAX_ROW}, the last row of a sheet.`);
  return { col: columnNumber(m[1]!), row };
}
