import { z } from 'zod';
import { UnitSchema, positive } from './common';

export const ShopSettingsSchema = z.object({
  shopName: z.string().trim().min(1, 'Shop name is required.').max(120, 'Shop name must be 120 characters or fewer.'),
  defaultUnit: UnitSchema,
  /**
   * How far a probed station may sit from the computed table before it is flagged, kept in inches
   * and in millimetres because shops set each on its own. (The dowel-on-hole tolerance is not a
   * setting: 0.0005 in / 0.01 mm is the fit of a pinned component.)
   */
  probeToleranceIn: positive('Probe-check tolerance (in)'),
  probeToleranceMm: positive('Probe-check tolerance (mm)'),
  /** Registers of the extended work-offset family (ext-l20: G10 L20 / G54.1 P1…Pn), as the shop's control has them. */
  extOffsetRegisters: z.number({ message: 'Extended work offsets must be a whole number from 1 to 300.' }).int('Extended work offsets must be a whole number from 1 to 300.').min(1, 'Extended work offsets must be a whole number from 1 to 300.').max(300, 'Extended work offsets must be a whole number from 1 to 300.'),
});
export type ShopSettings = z.infer<typeof ShopSettingsSchema>;
