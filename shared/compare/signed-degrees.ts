/**
 * An angle change folded into (−180, 180]: the shortest turn, with a half turn reported as +180
 * whichever way it went, because a half turn has no shorter direction to prefer.
 */
export function signedDegrees(deg: number): number {
  const d = ((deg % 360) + 360) % 360;
  const folded = d > 180 ? d - 360 : d;
  return folded === 0 ? 0 : folded; // no "-0" in the answer
}
