import { useState } from 'react';
import {
  columnFilteringFeature,
  createColumnHelper,
  createFilteredRowModel,
  createSortedRowModel,
  filterFn_includesString,
  globalFilteringFeature,
  rowSortingFeature,
  sortFn_alphanumeric,
  sortFn_basic,
  tableFeatures,
  useTable,
  type ColumnDef,
  type SortingState,
  type RowData,
} from '@tanstack/react-table';
import { ArrowDown, ArrowUp, ArrowUpDown } from 'lucide-react';

/** The one feature set every Gridset table uses: sorting and a text filter over all columns. */
export const gridsetTableFeatures = tableFeatures({
  columnFilteringFeature,
  globalFilteringFeature,
  rowSortingFeature,
  filteredRowModel: createFilteredRowModel(),
  sortedRowModel: createSortedRowModel(),
  filterFns: { includesString: filterFn_includesString },
  sortFns: { alphanumeric: sortFn_alphanumeric, basic: sortFn_basic },
  columnMeta: {} as { numeric?: boolean },
});
export type GridsetTableFeatures = typeof gridsetTableFeatures;
export const columnHelperFor = <Row extends RowData>() => createColumnHelper<GridsetTableFeatures, Row>();

interface DataTableProps<Row extends RowData> {
  // eslint-disable-next-line @typescript-eslint/no-explicit-any -- columns of mixed value types; TanStack Table documents any for TValue here
  columns: ColumnDef<GridsetTableFeatures, Row, any>[];
  data: Row[];
  filter?: string;
  caption: string;
  empty?: string;
  getRowId?: (row: Row) => string;
  /** Below 640 px wide each row becomes a card of label–value lines instead of a table that scrolls sideways. */
  stackOnPhone?: boolean;
}

export function DataTable<Row extends RowData>({ columns, data, filter = '', caption, empty = 'Nothing here yet.', getRowId, stackOnPhone = false }: DataTableProps<Row>) {
  const [sorting, setSorting] = useState<SortingState>([]);
  const table = useTable({
    features: gridsetTableFeatures,
    columns,
    data,
    getRowId: getRowId ? (row: Row) => getRowId(row) : undefined,
    state: { sorting, globalFilter: filter },
    onSortingChange: setSorting,
    globalFilterFn: 'includesString',
  });
  const rows = table.getRowModel().rows;
  // Stacked: the same table element, laid out as blocks on a phone (the header row hidden, each cell labelled).
  const st = stackOnPhone
    ? { table: 'block sm:table', thead: 'hidden sm:table-header-group', tbody: 'block sm:table-row-group', tr: 'block p-2 sm:table-row sm:p-0', td: 'grid grid-cols-[8rem_minmax(0,1fr)] gap-x-3 py-1 sm:table-cell sm:px-3 sm:py-2', label: 'font-sans font-semibold text-left text-slate-700 sm:hidden' }
    : { table: '', thead: '', tbody: '', tr: '', td: 'px-3 py-2', label: '' };
  return (
    // relative: the visually hidden caption (absolutely placed) stays inside the scroller instead of widening the page.
    <div className="relative overflow-x-auto rounded border border-slate-300 bg-white">
      <table className={`w-full border-collapse text-[15px] ${st.table}`}>
        <caption className="sr-only">{caption}</caption>
        <thead className={`bg-slate-100 ${st.thead}`}>
          {table.getHeaderGroups().map((group) => (
            <tr key={group.id}>
              {group.headers.map((header) => {
                const sorted = header.column.getIsSorted();
                const numeric = header.column.columnDef.meta?.numeric;
                return (
                  <th key={header.id} scope="col" aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : undefined}
                    className={`border-b border-slate-300 px-3 py-2 font-semibold text-slate-700 ${numeric ? 'text-right' : 'text-left'}`}>
                    {header.isPlaceholder ? null : header.column.getCanSort() ? (
                      <button type="button" onClick={header.column.getToggleSortingHandler()} className="inline-flex min-h-8 items-center gap-1 hover:text-accent-700">
                        <table.FlexRender header={header} />
                        {sorted === 'asc' ? <ArrowUp aria-hidden className="h-4 w-4" /> : sorted === 'desc' ? <ArrowDown aria-hidden className="h-4 w-4" /> : <ArrowUpDown aria-hidden className="h-4 w-4 text-slate-400" />}
                      </button>
                    ) : (
                      <table.FlexRender header={header} />
                    )}
                  </th>
                );
              })}
            </tr>
          ))}
        </thead>
        <tbody className={st.tbody}>
          {rows.length === 0 ? (
            <tr><td colSpan={columns.length} className="px-3 py-6 text-center text-slate-600">{empty}</td></tr>
          ) : (
            rows.map((row) => (
              <tr key={row.id} className={`border-b border-slate-200 last:border-0 hover:bg-slate-50 ${st.tr}`}>
                {row.getAllCells().map((cell) => {
                  const header = cell.column.columnDef.header;
                  return (
                    <td key={cell.id} className={`${st.td} ${cell.column.columnDef.meta?.numeric ? 'num' : ''}`}>
                      {stackOnPhone ? (
                        <>
                          {typeof header === 'string' ? <span aria-hidden className={st.label}>{header}</span> : null}
                          <span className="min-w-0"><table.FlexRender cell={cell} /></span>
                        </>
                      ) : <table.FlexRender cell={cell} />}
                    </td>
                  );
                })}
              </tr>
            ))
          )}
        </tbody>
      </table>
    </div>
  );
}
