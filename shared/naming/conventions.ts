import type { NamingConvention } from '../schemas/naming';

/**
 * What a new shop starts with: layer names held only to the DXF R12 limits (which every layer
 * rule adds anyway), component codes of letters, digits, ".", "-" and "_" as the catalog stores them.
 */
export const DEFAULT_CONVENTION: NamingConvention = {
  version: 1,
  layer: {
    patterns: ['{layer}'],
    tokens: [{ name: 'layer', type: 'regex', regex: '[\\s\\S]+' }],
    case: 'any',
    minLength: 1,
    maxLength: 31,
  },
  component: {
    patterns: ['{code}'],
    tokens: [
      {
        name: 'code',
        type: 'regex',
        regex: '[A-Za-z0-9][A-Za-z0-9._-]*',
        hint: 'letters, digits, ".", "-" and "_", starting with a letter or digit',
      },
    ],
    case: 'any',
    minLength: 1,
    maxLength: 40,
  },
};

/**
 * The invented demo shop's convention. Component codes say what the part is and its size:
 * CR-8 a center rail with 8 stops, SR-4 a short rail with 4, VS-6 a vise with 6 in jaws,
 * JR-1.000 a jaw rail holding 1.000 in, JR-S4-1.000 the jaw rail for SR-4, ST-0.5 a 0.5 in
 * dowel stop, CR-M-200 and JR-M-30 metric rails (200 mm long, holding 30 mm).
 * Layers carry no "." (DXF R12), so a jaw rail's width is written in thousandths: FX-JR-1000.
 * Part outlines go on PART-<part number>, the plate and station marks on GRID-<what>.
 */
export const DEMO_CONVENTION: NamingConvention = {
  version: 1,
  layer: {
    patterns: ['FX-{kind}-{size}', 'FX-JR-{width}', 'FX-JR-S{stops}', 'FX-ST', 'FX-{rail}M-{mm}', 'PART-{part}', 'GRID-{what}'],
    tokens: [
      { name: 'kind', type: 'list', values: ['CR', 'SR', 'VS'] },
      { name: 'size', type: 'number', format: '0', min: 1, max: 99 },
      { name: 'width', type: 'number', format: '0000', min: 100, max: 12000 },
      { name: 'stops', type: 'number', format: '0', min: 1, max: 99 },
      { name: 'rail', type: 'list', values: ['CR', 'JR'] },
      { name: 'mm', type: 'number', format: '0', min: 1, max: 2000 },
      { name: 'part', type: 'regex', regex: '[A-Z0-9][A-Z0-9_-]*', hint: 'a part number such as 10452-A' },
      { name: 'what', type: 'list', values: ['PLATE', 'HOLES', 'ORIGIN', 'STATIONS', 'NUMBERS', 'DRAFT'] },
    ],
    case: 'upper',
    minLength: 2,
    maxLength: 31,
  },
  component: {
    patterns: ['{kind}-{size}', 'JR-{width}', 'JR-S{stops}-{width}', 'ST-{dia}', '{rail}-M-{mm}'],
    tokens: [
      { name: 'kind', type: 'list', values: ['CR', 'SR', 'VS'] },
      { name: 'size', type: 'number', format: '0', min: 1, max: 99 },
      { name: 'width', type: 'number', format: '0.000', min: 0.1, max: 12 },
      { name: 'stops', type: 'number', format: '0', min: 1, max: 99 },
      { name: 'dia', type: 'number', format: '0.0##', min: 0.1, max: 2 },
      { name: 'rail', type: 'list', values: ['CR', 'JR'] },
      { name: 'mm', type: 'number', format: '0', min: 1, max: 2000 },
    ],
    case: 'upper',
    minLength: 2,
    maxLength: 40,
  },
};
