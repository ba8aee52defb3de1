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
}

/** A column's header as the label of its value in a phone-width card: the header text, or the column's id when the header is drawn. */
const labelOf = (header: unknown, id: string): string => (typeof header === 'string' ? header : id);

export function DataTable<Row extends RowData>({ columns, data, filter = '', caption, empty = 'Nothing here yet.', getRowId }: DataTableProps<Row>) {
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
  return (
    // relative: the visually hidden caption (absolutely placed) stays inside the scroller instead of widening the page.
    // Below the md breakpoint each row is a card of label–value lines, so nothing is cut off or scrolled
    // sideways on a phone: numbers two to a line, text a line each; the header row stays as a wrap of
    // sort buttons.
    <div className="relative overflow-x-auto rounded border border-slate-300 bg-white">
      <table className="w-full border-collapse text-[15px] max-md:block">
        <caption className="sr-only">{caption}</caption>
        <thead className="bg-slate-100 max-md:block">
          {table.getHeaderGroups().map((group) => (
            <tr key={group.id} className="max-md:flex max-md:flex-wrap max-md:gap-x-1">
              {group.headers.map((header) => {
                const sorted = header.column.getIsSorted();
                const numeric = header.column.columnDef.meta?.numeric;
                return (
                  <th key={header.id} scope="col" aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : undefined}
                    className={`border-b border-slate-300 px-3 py-2 font-semibold text-slate-700 max-md:border-0 max-md:py-1 ${numeric ? 'text-right' : 'text-left'}`}>
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
        <tbody className="max-md:block">
          {rows.length === 0 ? (
            <tr className="max-md:block"><td colSpan={columns.length} className="px-3 py-6 text-center text-slate-600 max-md:block">{empty}</td></tr>
          ) : (
            rows.map((row) => (
              <tr key={row.id} className="border-b border-slate-200 last:border-0 hover:bg-slate-50 max-md:grid max-md:grid-cols-2 max-md:gap-x-4 max-md:px-3 max-md:py-2">
                {row.getAllCells().map((cell) => (
                  // The label is drawn by CSS from data-label with empty alternative text (CSS Generated Content
                  // Level 3, "content" alt text), so the cell's text (read aloud, copied, or read
                  // by a script) stays only its value; a screen reader still has the header row.
                  <td key={cell.id} data-label={labelOf(cell.column.columnDef.header, cell.column.id)}
                    className={`px-3 py-2 max-md:flex max-md:items-center max-md:justify-between max-md:gap-3 max-md:px-0 max-md:py-1 max-md:before:shrink-0 max-md:before:font-sans max-md:before:text-sm max-md:before:font-semibold max-md:before:text-slate-600 max-md:before:content-[attr(data-label)_/_""] ${cell.column.columnDef.meta?.numeric ? 'num' : 'max-md:col-span-2'}`}>
                    <span className="min-w-0 break-words max-md:whitespace-normal max-md:text-right"><table.FlexRender cell={cell} /></span>
                  </td>
                ))}
              </tr>
            ))
          )}
        </tbody>
      </table>
    </div>
  );
}
