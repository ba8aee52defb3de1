import type { Unit } from '../schemas/common';

/** 1 in = 25.4 mm exactly (NIST SP 811, Appendix B, "inch ... 2.54 E+00 centimeter", exact). */
export const MM_PER_INCH = 25.4;

/** Decimals shown for a length: the shop-floor convention of 0.0001 in and 0.001 mm resolution. */
export const DISPLAY_DECIMALS: Readonly<Record<Unit, number>> = { in: 4, mm: 3 };

/**
 * How far a non-primary dowel may sit from a grid-hole center and still count as on the grid.
 * A bushed plate's hole positions are held to about this; anything farther means the catalog
 * geometry or the placement is wrong, not that the pin will "find" the hole.
 */
export const GRID_TOLERANCE: Readonly<Record<Unit, number>> = { in: 0.0005, mm: 0.01 };

/**
 * How far a probed station may sit from its computed position before the setup is questioned.
 * Pinned stations repeat within a few thousandths of an inch (common practice).
 */
export const PROBE_CHECK_TOLERANCE: Readonly<Record<Unit, number>> = { in: 0.003, mm: 0.08 };

export function toMm(value: number, unit: Unit): number {
  return unit === 'in' ? value * MM_PER_INCH : value;
}

export function fromMm(mm: number, unit: Unit): number {
  return unit === 'in' ? mm / MM_PER_INCH : mm;
}

/** Same-unit conversion returns the value untouched, so no rounding noise is added. */
export function convert(value: number, from: Unit, to: Unit): number {
  if (from === to) return value;
  return from === 'in' ? value * MM_PER_INCH : value / MM_PER_INCH;
}

/**
 * Round half away from zero at a decimal place, on the number's shortest decimal form
 * (so 1.00005 rounds up as it reads, instead of down as its binary value would).
 */
export function roundTo(value: number, decimals: number): number {
  if (!Number.isFinite(value)) return value;
  const sign = value < 0 ? -1 : 1;
  const abs = String(Math.abs(value));
  // Values printed in exponent form (below 1e-6 or above 1e21) are far from any rounding edge.
  const rounded = abs.includes('e')
    ? sign * (Math.round(Math.abs(value) * 10 ** decimals) / 10 ** decimals)
    : sign * Number(`${Math.round(Number(`${abs}e${decimals}`))}e-${decimals}`);
  return rounded === 0 ? 0 : rounded; // no "-0"
}

export function roundForDisplay(value: number, unit: Unit): number {
  return roundTo(value, DISPLAY_DECIMALS[unit]);
}

/** The number alone at display precision, e.g. "-7.5000" (in) or "190.500" (mm); never "-0.000". */
export function formatNumber(value: number, unit: Unit): string {
  return roundForDisplay(value, unit).toFixed(DISPLAY_DECIMALS[unit]);
}

/** A length with its unit, e.g. "-7.5000 in" or "190.500 mm". */
export function formatLength(value: number, unit: Unit): string {
  return `${formatNumber(value, unit)} ${unit}`;
}
