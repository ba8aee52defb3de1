import { Page } from '../components/ui/page';
import { OutboxList } from '../features/outbox/components/outbox-list';

export function OutboxRoute() {
  return (
    <Page
      title="Outbox"
      subtitle="Every mail Gridset has sent, newest first. Without an SMTP server (SMTP_URL) mail goes nowhere else: it stays here and as .eml files in the data folder's outbox, and you pass the links on."
    >
      <OutboxList />
    </Page>
  );
}
