import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { ShopSettingsSchema, type ShopSettings } from '../../../shared/schemas/settings';
import { api } from '../../lib/api-client';

export const settingsKeys = { shop: () => ['settings', 'shop'] as const };
export const shopSettingsQuery = () => queryOptions({ queryKey: settingsKeys.shop(), queryFn: () => api.get('/api/settings', ShopSettingsSchema), staleTime: 5 * 60_000 });
export const useShopSettings = () => useQuery(shopSettingsQuery());
export function useSaveShopSettings() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: (s: ShopSettings) => api.put('/api/settings', s, ShopSettingsSchema), onSuccess: (s) => qc.setQueryData(settingsKeys.shop(), s) });
}
