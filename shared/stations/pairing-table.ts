import type { Unit } from '../schemas/common';
import type { Pairing } from '../schemas/template';
import { convert } from '../units/units';
import type { ClampMatch } from './nominal-width';

/** A numbered station with the clamp that holds it, as the pairing table needs it. */
export interface PairedStation {
  id: string;
  placementId: string;
  componentCode: string;
  face: number;
  match: ClampMatch | null;
}

/** Which jaw rail, on which grid hole, holds which width against which fixed face; widths in the template's unit. */
export function pairingTable(ordered: readonly PairedStation[], tu: Unit, pu: Unit): Pairing[] {
  const rows = new Map<string, Pairing>();
  for (const d of ordered) {
    if (!d.match) continue;
    const { clamp } = d.match;
    const key = `${d.placementId}\u0000${d.face}\u0000${clamp.placement}\u0000${clamp.face}`;
    let row = rows.get(key);
    if (!row) {
      row = {
        fixedPlacement: d.placementId,
        fixedComponent: d.componentCode,
        fixedFace: d.face,
        jawPlacement: clamp.placement,
        jawComponent: clamp.component,
        jawFace: clamp.face,
        jawHole: clamp.hole,
        width: convert(d.match.width, pu, tu),
        stations: [],
      };
      rows.set(key, row);
    }
    row.stations.push(d.id);
  }
  return [...rows.values()];
}
