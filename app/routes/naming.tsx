import { may } from '../../shared/schemas/auth';
import { Page } from '../components/ui/page';
import { ErrorText } from '../components/ui/notice';
import { useMe } from '../features/auth/api';
import { useConvention } from '../features/naming/api';
import { ConventionView } from '../features/naming/components/convention-view';
import { NameTester } from '../features/naming/components/name-tester';

export function NamingRoute() {
  const me = useMe();
  const convention = useConvention();
  return (
    <Page title="Naming convention" subtitle="The shop's rules for layer names and component codes.">
      <NameTester />
      <ErrorText error={convention.error} />
      {convention.data ? <ConventionView key={convention.data.version} convention={convention.data} canEdit={may(me.data?.role, 'editNaming')} /> : null}
    </Page>
  );
}
