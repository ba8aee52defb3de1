import { Page } from '../components/ui/page';
import { ErrorText } from '../components/ui/notice';
import { useComponents } from '../features/catalog/api';
import { StockCheckScreen } from '../features/stock-check/components/stock-check-screen';

/** The operator's question at the machine: which bars go on which setting? The catalog gives the rails. */
export function StockCheckRoute() {
  const components = useComponents();
  return (
    <Page title="Stock check" subtitle="Measured bars against a jaw rail's clamp window, sorted into as few rail settings as possible.">
      {components.isPending ? (
        <p className="text-slate-700">Loading the catalog…</p>
      ) : components.error ? (
        <ErrorText error={components.error} />
      ) : (
        <StockCheckScreen components={components.data.items} />
      )}
    </Page>
  );
}
