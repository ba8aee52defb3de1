import { describe, expect, it } from 'vitest';
import type { VersionDiff } from '../../shared/schemas/diff';
import { stationValueChanges, stationValueLine } from '../../shared/compare/station-values';

// Hand-made comparison parts: the expected lines are read off the inputs written here.
const translation = (x: number, y: number, z: number, c: number) => ({ x, y, z, c });
const stations: VersionDiff['stations'] = {
  added: [], removed: [], renumbered: [], unchanged: 5,
  changed: [
    // Station 4 (was 2) moved one 2.000 in pitch in +X only: one X line, no Y/Z/C lines.
    { id: 'B-CR:1', number: 4, previousNumber: 2, placement: 'B-CR', stop: 1, from: translation(3, 5, 0.5, 0), to: translation(5, 5, 0.5, 0), dx: 2, dy: 0, dz: 0, dc: 0 },
    // Station 1 turned a quarter turn, from 0° to 90°, in place.
    { id: 'A-CR:0', number: 1, previousNumber: 1, placement: 'A-CR', stop: 0, from: translation(1, 1, 0.5, 0), to: translation(1, 1, 0.5, 90), dx: 0, dy: 0, dz: 0, dc: 90 },
  ],
  widthChanged: [
    { id: 'C-CR:2', number: 3, from: 1.25, to: 1.5 },
    { id: 'B-CR:1', number: 4, from: 1.5, to: null },
  ],
};

describe('every changed station value, before → after', () => {
  it('lists only the values that changed, in station order, X Y Z C then width', () => {
    expect(stationValueChanges(stations).map((v) => [v.number, v.field, v.from, v.to])).toEqual([
      [1, 'c', 0, 90],
      [3, 'width', 1.25, 1.5],
      [4, 'x', 3, 5],
      [4, 'width', 1.5, null],
    ]);
  });

  it('says each in the display unit with its unit: 4 decimals in inches, 3 in mm, 1 in = 25.4 mm (NIST SP 811, Appendix B)', () => {
    const [turn, width, x, gone] = stationValueChanges(stations);
    expect(stationValueLine(width!, 'in', 'in')).toBe('width held 1.2500 in → 1.5000 in at station 3');
    // 1.25 × 25.4 = 31.75, 1.5 × 25.4 = 38.1 (exact products).
    expect(stationValueLine(width!, 'in', 'mm')).toBe('width held 31.750 mm → 38.100 mm at station 3');
    expect(stationValueLine(x!, 'in', 'in')).toBe('X 3.0000 in → 5.0000 in at station 4 (was 2)');
    expect(stationValueLine(turn!, 'in', 'in')).toBe('C 0.000° → 90.000° at station 1');
    expect(stationValueLine(gone!, 'in', 'in')).toBe('width held 1.5000 in → none at station 4 (was 2)');
  });

  it('leaves out a C that only went once round (360° is no turn)', () => {
    const fullTurn: VersionDiff['stations'] = { ...stations, widthChanged: [], changed: [{ ...stations.changed[1]!, to: translation(1, 1, 0.5, 360), dc: 0 }] };
    expect(stationValueChanges(fullTurn)).toEqual([]);
  });
});
