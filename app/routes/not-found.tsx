import { Link } from 'react-router-dom';
import { Page } from '../components/ui/page';

export function NotFoundRoute() {
  return (
    <Page title="Page not found">
      <p>There is no page at this address. <Link className="text-accent-700 underline" to="/">Go to the start page</Link>.</p>
    </Page>
  );
}
