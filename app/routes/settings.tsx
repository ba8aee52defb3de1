import { may } from '../../shared/schemas/auth';
import { Page } from '../components/ui/page';
import { ErrorText } from '../components/ui/notice';
import { useMe } from '../features/auth/api';
import { useShopSettings } from '../features/settings/api';
import { SettingsForm } from '../features/settings/components/settings-form';

export function SettingsRoute() {
  const me = useMe();
  const settings = useShopSettings();
  return (
    <Page title="Shop settings" subtitle="The shop's name, the unit new work starts in, and the default tolerances.">
      <ErrorText error={settings.error} />
      {settings.data ? <SettingsForm settings={settings.data} readOnly={!may(me.data?.role, 'editSettings')} /> : null}
    </Page>
  );
}
