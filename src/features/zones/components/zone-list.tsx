import { useMemo, useState } from 'react';
import {
  flexRender,
  getCoreRowModel,
  getFilteredRowModel,
  getPaginationRowModel,
  getSortedRowModel,
  useReactTable,
  type ColumnDef,
  type Row,
  type SortingState,
} from '@tanstack/react-table';
import { ArrowDown, ArrowUp, ArrowUpDown, ChevronLeft, ChevronRight, Info, Pencil, Trash2 } from 'lucide-react';
import { DEVICE_TYPE_LABELS, ZONE_TYPE_LABELS } from '@domain/devices';
import { Button } from '@/components/ui/button';
import { Select } from '@/components/ui/input';
import { SearchField } from '@/components/ui/search-field';
import { cn } from '@/lib/cn';
import type { ApiZone } from '@/types/api';
import { NotProtectingBadge, ZoneLifeBadge } from './zone-life-badge';
import { elsewhereNotes, ZONE_SWITCHES, ZoneStatusBadge, ZoneSwitches } from './zone-bits';

export const ZONE_PAGE_SIZE = 50;

type ZoneColumnMeta = { align?: 'right' };

/** Responsive widths and hiding, by column id. */
const COLUMN_CLASSES: Record<string, string> = { description: 'min-w-28', zoneType: 'min-w-28', input: 'hidden 2xl:table-cell' };

interface ZoneListProps {
  zones: ApiZone[];
  canEdit: boolean;
  onEdit: (zone: ApiZone) => void;
  onRemove: (zone: ApiZone) => void;
}

const SORTS = [
  { id: 'number', label: 'Zone number' },
  { id: 'description', label: 'Description' },
  { id: 'deviceType', label: 'Device type' },
  { id: 'zoneType', label: 'Zone type' },
] as const;

function SerialCell({ zone }: { zone: ApiZone }) {
  if (!zone.serial) return <span className="text-xs text-slate-500">Not yet</span>;
  const notes = elsewhereNotes(zone);
  return (
    <span className="inline-flex items-center gap-1">
      <span className="font-mono">{zone.serial}</span>
      {notes.length > 0 && (
        <span title={notes.join(' ')} className="text-ochre-600">
          <Info className="size-3.5" aria-hidden="true" />
          <span className="sr-only">{notes.join(' ')}</span>
        </span>
      )}
    </span>
  );
}

function zoneMatches(row: Row<ApiZone>, _columnId: string, query: unknown): boolean {
  const q = String(query).trim().toLowerCase();
  if (!q) return true;
  const z = row.original;
  return [String(z.number), z.description, z.serial, DEVICE_TYPE_LABELS[z.deviceType], ZONE_TYPE_LABELS[z.zoneType]].some((v) => v.toLowerCase().includes(q));
}

/**
 * A panel's zones: a dense table on desktop, one card per zone on phones and tablets. The whole list is
 * loaded, so sorting, finding and paging (50 a page) happen here.
 */
export function ZoneList({ zones, canEdit, onEdit, onRemove }: ZoneListProps) {
  const [sorting, setSorting] = useState<SortingState>([{ id: 'number', desc: false }]);
  const [filter, setFilter] = useState('');
  const [pagination, setPagination] = useState({ pageIndex: 0, pageSize: ZONE_PAGE_SIZE });

  const columns = useMemo<ColumnDef<ApiZone, unknown>[]>(() => {
    const cols: ColumnDef<ApiZone, unknown>[] = [
      { id: 'number', accessorKey: 'number', header: 'Zone', cell: ({ row }) => <span className="font-semibold tabular-nums">{row.original.number}</span> },
      { id: 'description', accessorKey: 'description', header: 'Description', cell: ({ row }) => <span className="font-medium">{row.original.description}</span> },
      { id: 'deviceType', accessorFn: (z) => DEVICE_TYPE_LABELS[z.deviceType], header: 'Device type' },
      { id: 'zoneType', accessorFn: (z) => ZONE_TYPE_LABELS[z.zoneType], header: 'Zone type' },
      {
        id: 'serial',
        // Below 2xl the input column is hidden and the input follows the serial.
        header: () => (
          <>
            Serial<span className="2xl:hidden"> / input</span>
          </>
        ),
        enableSorting: false,
        cell: ({ row }) => (
          <span className="whitespace-nowrap">
            <SerialCell zone={row.original} />
            <span className="text-slate-500 2xl:hidden">
              <span aria-hidden="true"> / </span>
              <span className="sr-only">, input </span>
              {row.original.input}
            </span>
          </span>
        ),
      },
      { id: 'input', accessorKey: 'input', header: 'Input', enableSorting: false, cell: ({ row }) => <span className="tabular-nums">{row.original.input}</span> },
      { id: 'switches', header: 'Switches', enableSorting: false, cell: ({ row }) => <ZoneSwitches zone={row.original} /> },
      {
        id: 'status',
        header: 'Status',
        enableSorting: false,
        cell: ({ row }) => (
          <span className="flex flex-col items-start gap-1">
            <ZoneStatusBadge status={row.original.status} />
            <NotProtectingBadge zone={row.original} />
          </span>
        ),
      },
      { id: 'life', header: 'Device life', enableSorting: false, cell: ({ row }) => <ZoneLifeBadge zone={row.original} /> },
    ];
    if (canEdit)
      cols.push({
        id: 'actions',
        header: () => <span className="sr-only">Actions</span>,
        enableSorting: false,
        meta: { align: 'right' } satisfies ZoneColumnMeta,
        cell: ({ row }) => <ZoneActions zone={row.original} onEdit={onEdit} onRemove={onRemove} />,
      });
    return cols;
  }, [canEdit, onEdit, onRemove]);

  // After zones are removed the page may no longer exist: show the last one instead.
  const lastPageIndex = Math.max(0, Math.ceil(zones.length / ZONE_PAGE_SIZE) - 1);
  const shownPagination = { ...pagination, pageIndex: Math.min(pagination.pageIndex, lastPageIndex) };
  const table = useReactTable({
    data: zones,
    columns,
    state: { sorting, globalFilter: filter, pagination: shownPagination },
    onSortingChange: (updater) => {
      setSorting(updater);
      setPagination((p) => ({ ...p, pageIndex: 0 }));
    },
    onPaginationChange: setPagination,
    globalFilterFn: zoneMatches,
    enableSortingRemoval: false,
    autoResetPageIndex: false,
    getRowId: (z) => z.id,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
    getPaginationRowModel: getPaginationRowModel(),
  });

  const rows = table.getRowModel().rows;
  const total = table.getFilteredRowModel().rows.length;
  const pageCount = Math.max(1, table.getPageCount());
  const page = Math.min(shownPagination.pageIndex, pageCount - 1) + 1;
  const from = total === 0 ? 0 : (page - 1) * ZONE_PAGE_SIZE + 1;
  const to = Math.min(total, page * ZONE_PAGE_SIZE);
  const current = sorting[0] ?? { id: 'number', desc: false };

  return (
    <div className="space-y-3">
      <div className="flex flex-col gap-2 sm:flex-row sm:items-center sm:justify-between">
        <div className="w-full sm:max-w-xs">
          <SearchField
            label="Find a zone"
            placeholder="Find by number, description or serial"
            value={filter}
            onChange={(v) => {
              setFilter(v);
              setPagination((p) => ({ ...p, pageIndex: 0 }));
            }}
          />
        </div>
        <div className="flex items-center gap-2 lg:hidden">
          <label htmlFor="zone-sort" className="shrink-0 text-sm text-slate-500">
            Sort by
          </label>
          <Select
            id="zone-sort"
            value={`${current.desc ? '-' : ''}${current.id}`}
            onChange={(e) => {
              const v = e.target.value;
              setSorting([{ id: v.replace(/^-/, ''), desc: v.startsWith('-') }]);
              setPagination((p) => ({ ...p, pageIndex: 0 }));
            }}
          >
            {SORTS.flatMap((s) => [
              <option key={s.id} value={s.id}>
                {s.label}
              </option>,
              <option key={`-${s.id}`} value={`-${s.id}`}>
                {s.label}, reversed
              </option>,
            ])}
          </Select>
        </div>
      </div>

      <div className="rounded-md border border-line bg-card">
        {/* Desktop: the dense table. */}
        <div className="relative hidden overflow-x-auto lg:block">
          <table className="w-full border-collapse text-sm">
            <caption className="sr-only">Zones of this panel</caption>
            <thead>
              {table.getHeaderGroups().map((group) => (
                <tr key={group.id} className="border-b border-line">
                  {group.headers.map((header) => {
                    const meta = header.column.columnDef.meta as ZoneColumnMeta | undefined;
                    const sorted = header.column.getIsSorted();
                    return (
                      <th
                        key={header.id}
                        scope="col"
                        aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : undefined}
                        className={cn('h-9 px-2 text-left text-xs font-semibold whitespace-nowrap text-slate-500 first:pl-3 last:pr-3', COLUMN_CLASSES[header.column.id], meta?.align === 'right' && 'text-right')}
                      >
                        {header.column.getCanSort() ? (
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
              {rows.map((row) => (
                <tr key={row.id} className={cn('border-b border-line last:border-b-0 hover:bg-paper/60', row.original.status === 'removed' && 'text-slate-500')}>
                  {row.getVisibleCells().map((cell) => {
                    const meta = cell.column.columnDef.meta as ZoneColumnMeta | undefined;
                    return (
                      <td key={cell.id} className={cn('h-9 px-2 py-1 align-middle first:pl-3 last:pr-3', COLUMN_CLASSES[cell.column.id], meta?.align === 'right' && 'text-right')}>
                        {flexRender(cell.column.columnDef.cell, cell.getContext())}
                      </td>
                    );
                  })}
                </tr>
              ))}
            </tbody>
          </table>
        </div>

        {/* Phones and tablets: one card per zone. */}
        <ul className="divide-y divide-line lg:hidden" aria-label="Zones of this panel">
          {rows.map((row) => (
            <ZoneCard key={row.id} zone={row.original} canEdit={canEdit} onEdit={onEdit} onRemove={onRemove} />
          ))}
        </ul>

        {total === 0 && <p className="px-4 py-6 text-center text-sm text-slate-500">No zone matches “{filter.trim()}”.</p>}

        <div className="flex flex-wrap items-center justify-between gap-2 border-t border-line px-3 py-2 text-xs text-slate-500">
          <span aria-live="polite">{total === 0 ? 'No zones' : `${from}–${to} of ${total}`}</span>
          <span className="hidden lg:inline">
            {ZONE_SWITCHES.filter((s) => s.short !== 'Chime')
              .map((s) => `${s.short} = ${s.long.split(':')[0]!.toLowerCase()}`)
              .join(' · ')}
          </span>
          <div className="flex items-center gap-1">
            <Button variant="ghost" size="sm" onClick={() => table.previousPage()} disabled={!table.getCanPreviousPage()} aria-label="Previous page">
              <ChevronLeft className="size-4" aria-hidden="true" />
            </Button>
            <span>
              Page {page} of {pageCount}
            </span>
            <Button variant="ghost" size="sm" onClick={() => table.nextPage()} disabled={!table.getCanNextPage()} aria-label="Next page">
              <ChevronRight className="size-4" aria-hidden="true" />
            </Button>
          </div>
        </div>
      </div>
    </div>
  );
}

function ZoneActions({ zone, onEdit, onRemove }: { zone: ApiZone; onEdit: (z: ApiZone) => void; onRemove: (z: ApiZone) => void }) {
  return (
    <div className="flex justify-end gap-0.5">
      <Button variant="ghost" size="sm" className="w-8 px-0" onClick={() => onEdit(zone)} aria-label={`Edit zone ${zone.number}, ${zone.description}`} title="Edit">
        <Pencil className="size-4" aria-hidden="true" />
      </Button>
      <Button variant="ghost" size="sm" className="w-8 px-0 text-clay-600" onClick={() => onRemove(zone)} aria-label={`Remove zone ${zone.number}, ${zone.description}`} title="Remove">
        <Trash2 className="size-4" aria-hidden="true" />
      </Button>
    </div>
  );
}

function ZoneCard({ zone, canEdit, onEdit, onRemove }: { zone: ApiZone; canEdit: boolean; onEdit: (z: ApiZone) => void; onRemove: (z: ApiZone) => void }) {
  const switches = ZONE_SWITCHES.filter((s) => zone[s.key]).map((s) => s.long.split(':')[0]!);
  return (
    <li className="space-y-2 px-4 py-3">
      <div className="flex items-start justify-between gap-3">
        <div className="min-w-0">
          <p className="font-semibold">
            <span className="tabular-nums">Zone {zone.number}</span>
            <span className="text-slate-500"> · </span>
            {zone.description}
          </p>
          <p className="text-sm text-slate-500">
            {DEVICE_TYPE_LABELS[zone.deviceType]} · {ZONE_TYPE_LABELS[zone.zoneType]}
          </p>
        </div>
        <ZoneStatusBadge status={zone.status} />
      </div>
      <NotProtectingBadge zone={zone} className="max-w-full" />
      <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-1 text-sm">
        <dt className="text-slate-500">Serial</dt>
        <dd className="min-w-0">
          <SerialCell zone={zone} />
          <span className="text-slate-500"> · input {zone.input}</span>
        </dd>
        <dt className="text-slate-500">Switches</dt>
        <dd>{switches.length > 0 ? switches.join(' · ') : 'None'}</dd>
        <dt className="text-slate-500">Device life</dt>
        <dd>
          <ZoneLifeBadge zone={zone} />
        </dd>
      </dl>
      {canEdit && (
        <div className="flex gap-2 pt-1">
          <Button variant="secondary" size="md" className="flex-1" onClick={() => onEdit(zone)} aria-label={`Edit zone ${zone.number}, ${zone.description}`}>
            <Pencil className="size-4" aria-hidden="true" /> Edit
          </Button>
          <Button variant="secondary" size="md" className="flex-1 text-clay-600" onClick={() => onRemove(zone)} aria-label={`Remove zone ${zone.number}, ${zone.description}`}>
            <Trash2 className="size-4" aria-hidden="true" /> Remove
          </Button>
        </div>
      )}
    </li>
  );
}
