import type { Unit } from '../schemas/common';
import { PROBE_CHECK_TOLERANCE } from '../units/units';
import type { Station } from '../schemas/template';

/** A machine position, in the template's unit. */
export interface MachinePosition {
  x: number;
  y: number;
  z: number;
}

export interface StationWorkOffset {
  station: string;
  number: number;
  x: number;
  y: number;
  z: number;
  c: number;
}

/**
 * One work offset per station: the machine position of the shared offset (entered or probed
 * once) plus the station's translation. Holds when the plate is trammed square to the
 * machine's X axis, which a pinned plate is set up to be; C is carried along for controls
 * that rotate a work offset.
 */
export function stationWorkOffsets(stations: readonly Station[], sharedOffsetAt: MachinePosition): StationWorkOffset[] {
  return [...stations]
    .sort((a, b) => a.number - b.number)
    .map((s) => ({ station: s.id, number: s.number, x: sharedOffsetAt.x + s.x, y: sharedOffsetAt.y + s.y, z: sharedOffsetAt.z + s.z, c: s.c }));
}

export interface ProbeCheck {
  /** Distance in XY between the probed and the computed datum, in the given unit. */
  deviation: number;
  tolerance: number;
  withinTolerance: boolean;
}

/**
 * A probed station against its computed position. Pinned stations repeat within a few
 * thousandths of an inch (common practice), so a deviation beyond the probe-check tolerance
 * points at a wrong hole, a burr under a rail or a bad shared offset, not at normal scatter.
 */
export function checkProbedStation(computed: { x: number; y: number }, probed: { x: number; y: number }, unit: Unit, tolerance = PROBE_CHECK_TOLERANCE[unit]): ProbeCheck {
  const deviation = Math.hypot(probed.x - computed.x, probed.y - computed.y);
  return { deviation, tolerance, withinTolerance: deviation <= tolerance };
}
