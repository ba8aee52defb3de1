import { z } from 'zod';
import { UnitSchema, positive } from './common';

export const ShopSettingsSchema = z.object({
  shopName: z.string().trim().min(1, 'Shop name is required.').max(120, 'Shop name must be 120 characters or fewer.'),
  defaultUnit: UnitSchema,
  /** Default tolerances, kept in inches and in millimetres because shops set each on its own. */
  gridToleranceIn: positive('Grid tolerance (in)'),
  gridToleranceMm: positive('Grid tolerance (mm)'),
  probeToleranceIn: positive('Probe-check tolerance (in)'),
  probeToleranceMm: positive('Probe-check tolerance (mm)'),
});
export type ShopSettings = z.infer<typeof ShopSettingsSchema>;
