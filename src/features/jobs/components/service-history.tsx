import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { ChevronLeft, ChevronRight, ClipboardCheck, Cpu, Plus, SlidersHorizontal } from 'lucide-react';
import { paths } from '@/config/paths';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Select } from '@/components/ui/input';
import { Skeleton } from '@/components/ui/skeleton';
import { formatDate } from '@/lib/format';
import type { ApiHistoryEntry, ApiHistoryType } from '@/types/api';
import { HISTORY_PAGE_SIZE, siteHistoryQuery, siteZonesQuery } from '../api/jobs-queries';
import { formatTime } from '../time';
import { NewJobDialog } from './new-job-dialog';
import type { PickedSite } from './site-picker';

const TYPE_LABELS: Record<ApiHistoryType, string> = { job: 'Jobs', zone_change: 'Zone changes', programming: 'Panel programming' };
const TYPE_ICONS = { job: ClipboardCheck, zone_change: SlidersHorizontal, programming: Cpu } as const;

function useEntryHref(siteId: string) {
  const zones = useQuery(siteZonesQuery(siteId));
  return (entry: ApiHistoryEntry): string | null => {
    if (entry.link.kind === 'job') return paths.firm.job(entry.link.id);
    if (entry.link.kind === 'panel') return paths.firm.panel(entry.link.id);
    const zone = zones.data?.zones.find((z) => z.id === entry.link.id);
    return zone ? paths.firm.panel(zone.panelId) : null;
  };
}

/** The site's service history: closed jobs, zone changes and panel programming, newest first. */
export function ServiceHistoryCard({ siteId, timeZone }: { siteId: string; timeZone: string }) {
  const [type, setType] = useState<ApiHistoryType | ''>('');
  const [page, setPage] = useState(1);
  const history = useQuery(siteHistoryQuery(siteId, type || undefined, page));
  const hrefOf = useEntryHref(siteId);
  const total = history.data?.page.total ?? 0;
  const pages = Math.max(1, Math.ceil(total / HISTORY_PAGE_SIZE));
  const selectId = `history-type-${siteId}`;

  return (
    <Card
      title="Service history"
      action={
        <span className="w-44">
          <label htmlFor={selectId} className="sr-only">
            Show
          </label>
          <Select
            id={selectId}
            value={type}
            onChange={(e) => {
              setType(e.target.value as ApiHistoryType | '');
              setPage(1);
            }}
          >
            <option value="">Everything</option>
            {(Object.keys(TYPE_LABELS) as ApiHistoryType[]).map((t) => (
              <option key={t} value={t}>
                {TYPE_LABELS[t]}
              </option>
            ))}
          </Select>
        </span>
      }
    >
      {history.isPending ? (
        <Skeleton className="h-24 w-full" />
      ) : history.isError ? (
        <p className="text-sm text-clay-600">{history.error.message}</p>
      ) : history.data.data.length === 0 ? (
        <p className="text-sm text-slate-500">
          {type
            ? `No ${TYPE_LABELS[type].toLowerCase()} recorded yet.`
            : 'Nothing yet. Completed and cancelled jobs, zone changes and panel programming appear here.'}
        </p>
      ) : (
        <ol className={history.isPlaceholderData ? 'opacity-60' : undefined}>
          {history.data.data.map((entry, i) => {
            const Icon = TYPE_ICONS[entry.type];
            const href = hrefOf(entry);
            return (
              <li key={`${entry.link.kind}-${entry.link.id}-${entry.at}-${i}`} className="relative flex gap-3 pb-4 last:pb-0">
                <span className="relative flex flex-col items-center">
                  <span className="grid size-7 place-items-center rounded-full border border-line bg-paper text-slate-500">
                    <Icon className="size-3.5" aria-hidden="true" />
                  </span>
                  <span className="w-px flex-1 bg-line" aria-hidden="true" />
                </span>
                <div className="min-w-0 flex-1 pt-0.5">
                  <p className="text-xs text-slate-500 tabular-nums">
                    <time dateTime={entry.at}>
                      {formatDate(entry.at, timeZone)}, {formatTime(entry.at, timeZone)}
                    </time>
                  </p>
                  {href ? (
                    <Link to={href} className="text-sm font-medium break-words text-brass-700 hover:underline">
                      {entry.title}
                    </Link>
                  ) : (
                    <p className="text-sm font-medium break-words">{entry.title}</p>
                  )}
                  {entry.detail && <p className="text-xs break-words text-slate-500">{entry.detail}</p>}
                </div>
              </li>
            );
          })}
        </ol>
      )}
      {pages > 1 && (
        <div className="mt-3 flex items-center justify-between border-t border-line pt-2 text-xs text-slate-500">
          <span>
            Page {page} of {pages}
          </span>
          <span className="flex gap-1">
            <Button variant="ghost" size="sm" onClick={() => setPage(page - 1)} disabled={page <= 1} aria-label="Newer entries">
              <ChevronLeft className="size-4" aria-hidden="true" />
            </Button>
            <Button variant="ghost" size="sm" onClick={() => setPage(page + 1)} disabled={page >= pages} aria-label="Older entries">
              <ChevronRight className="size-4" aria-hidden="true" />
            </Button>
          </span>
        </div>
      )}
    </Card>
  );
}

/** "New job" for one site: the dialog opens with the site already chosen. */
export function NewJobButton({ site, onCreated }: { site: PickedSite; onCreated?: (jobId: string) => void }) {
  const [open, setOpen] = useState(false);
  return (
    <>
      <Button onClick={() => setOpen(true)}>
        <Plus className="size-4" aria-hidden="true" /> New job
      </Button>
      <NewJobDialog open={open} onClose={() => setOpen(false)} site={site} onCreated={(job) => onCreated?.(job.id)} />
    </>
  );
}
