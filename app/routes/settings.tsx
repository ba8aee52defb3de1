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
      {may(me.data?.role, 'backups') ? (
        <section aria-labelledby="backup-title" className="mt-6 flex max-w-3xl flex-col gap-2 rounded border border-slate-300 bg-white p-4">
          <h2 id="backup-title" className="text-lg font-semibold">Backup</h2>
          <p className="text-slate-700">One archive of the database and every stored file (uploaded drawings, the outbox), with the SHA-256 of each; restore it with <code>npm run restore</code>. Taking it while people work is safe.</p>
          <div><a className="inline-flex min-h-10 items-center gap-2 rounded border border-slate-400 bg-white px-3 font-semibold text-slate-900 hover:bg-slate-100" href="/api/admin/backup" download>Download a backup</a></div>
        </section>
      ) : null}
    </Page>
  );
}
