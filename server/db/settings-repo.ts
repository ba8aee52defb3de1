import type { Db } from './knex';
import { ShopSettingsSchema, type ShopSettings } from '../../shared/schemas/settings';

export const DEFAULT_SETTINGS: ShopSettings = {
  shopName: 'My shop',
  defaultUnit: 'in',
  // The pinned-station repeat, 0.002–0.003 in (common practice).
  probeToleranceIn: 0.003,
  probeToleranceMm: 0.08,
  extendedOffsetRegisters: 48,
};

export function settingsRepo(db: Db) {
  return {
    async get(): Promise<ShopSettings> {
      const row = await db('settings').where({ key: 'shop' }).first();
      if (!row) return DEFAULT_SETTINGS;
      const parsed = ShopSettingsSchema.safeParse({ ...DEFAULT_SETTINGS, ...JSON.parse(row.value) });
      return parsed.success ? parsed.data : DEFAULT_SETTINGS;
    },
    async put(s: ShopSettings, trx: Db = db): Promise<ShopSettings> {
      await trx('settings').insert({ key: 'shop', value: JSON.stringify(s) }).onConflict('key').merge({ value: JSON.stringify(s), updated_at: trx.fn.now() });
      return s;
    },
  };
}
export type SettingsRepo = ReturnType<typeof settingsRepo>;
