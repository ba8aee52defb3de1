/**
 * The words a part program may hold (README, "Whole-table program"), and why the common ones it
 * may not are refused. Codes as in the LinuxCNC G-code reference and NISTIR 6556.
 */
export const MOTION = new Set([0, 1, 2, 3, 73, 80, 81, 82, 83, 84, 85, 86, 87, 88, 89]);
export const ALLOWED_G = new Set([...MOTION, 4, 17, 20, 21, 28, 40, 41, 42, 43, 49, 53, 54, 55, 56, 57, 58, 59, 90, 91, 94, 98, 99]);
export const ALLOWED_M = new Set([0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 30]);
export const ALLOWED_LETTERS = new Set(['G', 'M', 'X', 'Y', 'Z', 'I', 'J', 'R', 'Q', 'P', 'L', 'F', 'S', 'T', 'H', 'D', 'N', 'O']);

export const G_REASON: Record<string, string> = {
  '10': 'G10 writes offsets and tables; the whole-table program sets the station offsets itself',
  '92': 'G92 shifts the coordinate system; the part program must run in the shared work offset as it is',
  '52': 'G52 local shifts are written by Gridset for each station, not by the part program',
  '68': 'G68 rotation is written by Gridset for turned stations, not by the part program',
  '69': 'G69 belongs to coordinate rotation, which the part program does not use',
  '18': 'only the XY plane (G17) is supported',
  '19': 'only the XY plane (G17) is supported',
  '15': 'polar coordinates are not supported',
  '16': 'polar coordinates are not supported',
  '50': 'scaling is not supported',
  '51': 'scaling is not supported',
  '50.1': 'mirroring is not supported',
  '51.1': 'mirroring is not supported',
  '90.1': 'only incremental arc centers (I J from the start, the default) are supported',
  '91.1': 'only incremental arc centers (I J from the start, the default) are supported',
};
