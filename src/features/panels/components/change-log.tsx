import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { ArrowRight, ChevronLeft, ChevronRight } from 'lucide-react';
import { DEVICE_TYPE_LABELS, ZONE_STATUS_LABELS, ZONE_TYPE_LABELS, type DeviceType, type ZoneStatus, type ZoneType } from '@domain/devices';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Skeleton } from '@/components/ui/skeleton';
import { formatDateTime } from '@/lib/format';
import type { ApiFieldChange, ApiZoneChange } from '@/types/api';
import { CHANGE_PAGE_SIZE, panelChangesQuery } from '../api/panel-queries';

const FIELD_LABELS: Record<string, string> = {
  number: 'Zone number',
  description: 'Description',
  deviceType: 'Device type',
  zoneType: 'Zone type',
  serial: 'Serial',
  input: 'Input',
  reportsToMonitoring: 'Reports to monitoring center',
  chime: 'Chime',
  supervised: 'Supervised',
  status: 'Status',
  installedOn: 'Installed on',
  batteryType: 'Battery type',
  batteryChangedOn: 'Battery changed on',
  manufacturedOn: 'Manufactured on',
  roomId: 'Room',
  openingId: 'Opening',
  'settings.exitDelaySec': 'Exit delay (s)',
  'settings.entryDelaySec': 'Entry delay (s)',
  'settings.entryDelay2Sec': 'Second entry delay (s)',
  'settings.abortWindowSec': 'Abort window (s)',
  'settings.swingerLimit': 'Swinger limit (trips)',
  'settings.cancelWindowMin': 'Cancel window (min)',
  'settings.exitRestart': 'Exit-time restart',
  'settings.autoStay': 'Auto-stay if nobody leaves',
  'settings.crossZoning': 'Cross zoning',
  'settings.crossZoneWindowSec': 'Cross-zone window (s)',
  'settings.duress': 'Duress code',
};

const ACTION_WORDS: Record<ApiZoneChange['action'], string> = {
  created: 'added',
  updated: 'changed',
  removed: 'removed',
  deleted: 'removed',
  imported: 'imported',
  programmed: 'Panel marked as programmed',
};

function fieldLabel(field: string): string {
  return FIELD_LABELS[field] ?? field.replace(/^settings\./, '').replace(/([A-Z])/g, (c) => ` ${c.toLowerCase()}`).replace(/^./, (c) => c.toUpperCase());
}

/** A logged value in words: labels for keys, on/off for switches, a dash for nothing. */
export function changeValue(field: string, value: unknown): string {
  if (value === null || value === undefined || value === '') return '—';
  if (typeof value === 'boolean') return value ? 'on' : 'off';
  if (typeof value === 'number') return String(value);
  if (typeof value !== 'string') return JSON.stringify(value);
  if (field === 'deviceType') return DEVICE_TYPE_LABELS[value as DeviceType] ?? value;
  if (field === 'zoneType') return ZONE_TYPE_LABELS[value as ZoneType] ?? value;
  if (field === 'status') return ZONE_STATUS_LABELS[value as ZoneStatus] ?? value;
  return value;
}

/** The entry's changed fields as a list, whichever shape the server sent. */
export function changedFields(change: Pick<ApiZoneChange, 'changes'>): ApiFieldChange[] {
  const raw = change.changes ?? [];
  if (Array.isArray(raw)) return raw;
  return Object.entries(raw).map(([field, pair]) => ({ field, from: pair[0], to: pair[1] }));
}

function headline(c: ApiZoneChange, fields: readonly ApiFieldChange[]): string {
  if (c.action === 'programmed') return ACTION_WORDS.programmed;
  if (c.zoneNumber === null && fields.length > 0 && fields.every((f) => f.field.startsWith('settings.'))) return 'Panel settings changed';
  const zone = c.zoneNumber !== null ? `Zone ${c.zoneNumber}` : 'A zone';
  return `${zone} ${ACTION_WORDS[c.action] ?? c.action}`;
}

const MONO_FIELDS = new Set(['serial']);

function ChangeEntry({ change, timeZone }: { change: ApiZoneChange; timeZone: string | undefined }) {
  const all = changedFields(change);
  // "Marked as programmed" says it all; its bookkeeping fields are not worth listing.
  const fields = change.action === 'programmed' ? [] : all;
  const when = change.at ?? change.createdAt ?? null;
  // Added, or imported as a new zone: every field goes from nothing to its value.
  const isNewRecord = change.action === 'created' || (change.action === 'imported' && all.every((f) => f.from === null || f.from === undefined));
  // Deleted: every field goes from its value to nothing; list what the zone was.
  const isGone = !isNewRecord && all.length > 0 && all.every((f) => f.to === null || f.to === undefined);
  const snapshot = isNewRecord || isGone;
  return (
    <li className="py-3 first:pt-0 last:pb-0">
      <div className="flex flex-wrap items-baseline justify-between gap-x-3 gap-y-0.5">
        <p className="text-sm font-medium">{headline(change, all)}</p>
        <p className="text-xs text-slate-500">
          {change.actorName || 'Someone'}
          {when && (
            <>
              {' · '}
              <time dateTime={when}>{formatDateTime(when, timeZone)}</time>
            </>
          )}
        </p>
      </div>
      {snapshot && fields.length > 0 && (
        // A zone added or deleted: what it is (or was) on one wrapped line, no arrows.
        <dl className={`mt-1 flex flex-wrap gap-x-3 gap-y-0.5 text-sm ${isGone ? 'text-slate-500' : ''}`}>
                    {fields
            .map(({ field, from, to }) => ({ field, value: isGone ? from : to }))
            .filter((f) => f.field !== 'number' && f.value !== null && f.value !== undefined && f.value !== '')
            .map(({ field, value }) => (
              <div key={field} className="inline-flex gap-1">
                <dt className="text-slate-500">{fieldLabel(field)}:</dt>
                <dd className={MONO_FIELDS.has(field) ? 'font-mono' : undefined}>{changeValue(field, value)}</dd>
              </div>
            ))}
        </dl>
      )}
      {!snapshot && fields.length > 0 && (
        <dl className="mt-1 space-y-0.5 text-sm">
          {fields.map(({ field, from, to }) => {
            const mono = MONO_FIELDS.has(field) ? 'font-mono' : '';
            return (
              <div key={field} className="flex flex-wrap items-center gap-x-1.5">
                <dt className="text-slate-500">{fieldLabel(field)}:</dt>
                <dd className="inline-flex flex-wrap items-center gap-1.5">
                  <span className={`${mono} text-slate-500 line-through decoration-slate-500/50`}>
                    <span className="sr-only">from </span>
                    {changeValue(field, from)}
                  </span>
                  <ArrowRight className="size-3 text-slate-500" aria-hidden="true" />
                  <span className="sr-only">to </span>
                  <span className={mono}>{changeValue(field, to)}</span>
                </dd>
              </div>
            );
          })}
        </dl>
      )}
    </li>
  );
}

/** Who changed which zone, when, old → new; newest first, 20 a page. */
export function ChangeLog({ panelId, timeZone }: { panelId: string; timeZone: string | undefined }) {
  const [page, setPage] = useState(1);
  const changes = useQuery(panelChangesQuery(panelId, page));
  const total = changes.data?.page.total ?? 0;
  const pageCount = Math.max(1, Math.ceil(total / CHANGE_PAGE_SIZE));

  return (
    <Card title="Change log">
      {changes.isPending ? (
        <div className="space-y-2" role="status" aria-label="Loading">
          <Skeleton className="h-5 w-2/3" />
          <Skeleton className="h-5 w-1/2" />
        </div>
      ) : changes.isError ? (
        <p className="text-sm text-clay-600">{changes.error.message}</p>
      ) : changes.data.data.length === 0 ? (
        <p className="text-sm text-slate-500">No changes yet. Every zone added, changed or removed is listed here with who did it.</p>
      ) : (
        <>
          <ul className={`divide-y divide-line ${changes.isPlaceholderData ? 'opacity-60' : ''}`}>
            {changes.data.data.map((c) => (
              <ChangeEntry key={c.id} change={c} timeZone={timeZone} />
            ))}
          </ul>
          {pageCount > 1 && (
            <div className="mt-3 flex items-center justify-end gap-1 border-t border-line pt-2 text-xs text-slate-500">
              <Button variant="ghost" size="sm" onClick={() => setPage(page - 1)} disabled={page <= 1} aria-label="Newer changes">
                <ChevronLeft className="size-4" aria-hidden="true" />
              </Button>
              <span>
                Page {page} of {pageCount}
              </span>
              <Button variant="ghost" size="sm" onClick={() => setPage(page + 1)} disabled={page >= pageCount} aria-label="Older changes">
                <ChevronRight className="size-4" aria-hidden="true" />
              </Button>
            </div>
          )}
        </>
      )}
    </Card>
  );
}
