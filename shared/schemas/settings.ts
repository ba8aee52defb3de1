import { z } from 'zod';
import { UnitSchema, plainText, positive } from './common';

export const ShopSettingsSchema = z.object({
  shopName: plainText('Shop name', 120).trim().min(1, 'Shop name is required.'),
  defaultUnit: UnitSchema,
  /**
   * How far a probed station may sit from the computed table before it is flagged, kept in inches
   * and in millimetres because shops set each on its own. (The dowel-on-hole tolerance is not a
   * setting: 0.0005 in / 0.01 mm is the fit of a pinned component.)
   */
  probeToleranceIn: positive('Probe-check tolerance (in)'),
  probeToleranceMm: positive('Probe-check tolerance (mm)'),
  /**
   * How many extended work offsets (G54.1 P1 …) the shop's controls have, for the ext-l20 offsets
   * family; 48 is a common count (from memory) — check the control's manual.
   */
  extendedOffsetRegisters: z
    .number({ message: 'Extended work offsets must be a whole number.' })
    .int('Extended work offsets must be a whole number.')
    .min(1, 'Extended work offsets must be 1 or more.')
    .max(300, 'Extended work offsets must be 300 or fewer.')
    .default(48),
});
export type ShopSettings = z.infer<typeof ShopSettingsSchema>;
