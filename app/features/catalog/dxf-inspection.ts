// The answer's schema lives in shared/schemas/dxf-inspection.ts, parsed on both sides; this type
// stays here for the outline import screen, which imports it from this path.
export type { DxfInspection } from '../../../shared/schemas/dxf-inspection';
