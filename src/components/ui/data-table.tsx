import { useState } from 'react';
import {
  flexRender,
  getCoreRowModel,
  useReactTable,
  type ColumnDef,
  type OnChangeFn,
  type RowData,
  type SortingState,
} from '@tanstack/react-table';
import { ArrowDown, ArrowUp, ArrowUpDown, ChevronLeft, ChevronRight } from 'lucide-react';
import { cn } from '@/lib/cn';
import { Button } from './button';

declare module '@tanstack/react-table' {
  // eslint-disable-next-line @typescript-eslint/no-unused-vars
  interface ColumnMeta<TData extends RowData, TValue> {
    /** hide on narrow screens */
    hideOnMobile?: boolean;
    align?: 'left' | 'right';
  }
}

export type ColumnMeta = { hideOnMobile?: boolean; align?: 'left' | 'right' };

interface DataTableProps<T> {
  columns: ColumnDef<T, unknown>[];
  data: T[];
  caption: string;
  sorting: SortingState;
  onSortingChange: OnChangeFn<SortingState>;
  page: number;
  pageSize: number;
  total: number;
  onPageChange: (page: number) => void;
  busy?: boolean;
  getRowId?: (row: T) => string;
}

/**
 * A dense staff table on TanStack Table: sorting and paging happen on the server (the
 * list API's `sort`, `page`, `pageSize`), so large lists stay fast.
 */
export function DataTable<T>({ columns, data, caption, sorting, onSortingChange, page, pageSize, total, onPageChange, busy, getRowId }: DataTableProps<T>) {
  const pageCount = Math.max(1, Math.ceil(total / pageSize));
  const table = useReactTable({
    data,
    columns,
    state: { sorting },
    onSortingChange,
    manualSorting: true,
    manualPagination: true,
    enableSortingRemoval: false,
    pageCount,
    getCoreRowModel: getCoreRowModel(),
    ...(getRowId ? { getRowId } : {}),
  });
  const from = total === 0 ? 0 : (page - 1) * pageSize + 1;
  const to = Math.min(total, page * pageSize);

  return (
    <div className="rounded-md border border-line bg-card">
      <div className="relative overflow-x-auto">
        <table className={cn('w-full border-collapse text-sm', busy && 'opacity-60')}>
          <caption className="sr-only">{caption}</caption>
          <thead>
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id} className="border-b border-line">
                {group.headers.map((header) => {
                  const meta = header.column.columnDef.meta;
                  const sorted = header.column.getIsSorted();
                  const canSort = header.column.getCanSort();
                  return (
                    <th
                      key={header.id}
                      scope="col"
                      aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : undefined}
                      className={cn(
                        'h-9 px-3 text-left text-xs font-semibold text-slate-500 whitespace-nowrap',
                        meta?.hideOnMobile && 'hidden md:table-cell',
                        meta?.align === 'right' && 'text-right',
                      )}
                    >
                      {header.isPlaceholder ? null : canSort ? (
                        <button type="button" onClick={header.column.getToggleSortingHandler()} className="inline-flex items-center gap-1 hover:text-ink">
                          {flexRender(header.column.columnDef.header, header.getContext())}
                          {sorted === 'asc' ? (
                            <ArrowUp className="size-3.5" aria-hidden="true" />
                          ) : sorted === 'desc' ? (
                            <ArrowDown className="size-3.5" aria-hidden="true" />
                          ) : (
                            <ArrowUpDown className="size-3.5 opacity-50" aria-hidden="true" />
                          )}
                        </button>
                      ) : (
                        flexRender(header.column.columnDef.header, header.getContext())
                      )}
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody>
            {table.getRowModel().rows.map((row) => (
              <tr key={row.id} className="border-b border-line last:border-b-0 hover:bg-paper/60">
                {row.getVisibleCells().map((cell) => {
                  const meta = cell.column.columnDef.meta;
                  return (
                    <td
                      key={cell.id}
                      className={cn('h-9 px-3 py-1.5 align-middle', meta?.hideOnMobile && 'hidden md:table-cell', meta?.align === 'right' && 'text-right')}
                    >
                      {flexRender(cell.column.columnDef.cell, cell.getContext())}
                    </td>
                  );
                })}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <div className="flex items-center justify-between gap-2 border-t border-line px-3 py-2 text-xs text-slate-500">
        <span aria-live="polite">
          {total === 0 ? 'No rows' : `${from}–${to} of ${total}`}
        </span>
        <div className="flex items-center gap-1">
          <Button variant="ghost" size="sm" onClick={() => onPageChange(page - 1)} disabled={page <= 1} aria-label="Previous page">
            <ChevronLeft className="size-4" aria-hidden="true" />
          </Button>
          <span>
            Page {page} of {pageCount}
          </span>
          <Button variant="ghost" size="sm" onClick={() => onPageChange(page + 1)} disabled={page >= pageCount} aria-label="Next page">
            <ChevronRight className="size-4" aria-hidden="true" />
          </Button>
        </div>
      </div>
    </div>
  );
}

/** "name" / "-name" for the list API, from TanStack's sorting state. */
export function sortParam(sorting: SortingState): string | undefined {
  const first = sorting[0];
  if (!first) return undefined;
  return `${first.desc ? '-' : ''}${first.id}`;
}

/**
 * Sorting and paging state of a server-paged list: a new sort goes back to page 1.
 * Spread `table` into DataTable; send `sort` and `page` to the list API.
 */
export function useServerTable(initialSortId: string) {
  const [sorting, setSorting] = useState<SortingState>([{ id: initialSortId, desc: false }]);
  const [page, setPage] = useState(1);
  const onSortingChange: OnChangeFn<SortingState> = (updater) => {
    setSorting(updater);
    setPage(1);
  };
  return {
    sort: sortParam(sorting),
    page,
    setPage,
    table: { sorting, onSortingChange, page, onPageChange: setPage },
  };
}
