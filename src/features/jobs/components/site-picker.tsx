import { useEffect, useId, useState } from 'react';
import { keepPreviousData, useQuery } from '@tanstack/react-query';
import { MapPin } from 'lucide-react';
import { Button } from '@/components/ui/button';
import { Input } from '@/components/ui/input';
import { cn } from '@/lib/cn';
import type { ApiSite } from '@/types/api';
import { siteSearchQuery } from '../api/jobs-queries';
import { addressLine } from './job-bits';

export interface PickedSite {
  id: string;
  name: string;
  timeZone: string;
  clientName?: string | undefined;
}

function useDebounced<T>(value: T, ms: number): T {
  const [debounced, setDebounced] = useState(value);
  useEffect(() => {
    const t = window.setTimeout(() => setDebounced(value), ms);
    return () => window.clearTimeout(t);
  }, [value, ms]);
  return debounced;
}

/** Search the firm's sites by name, street, city or account number and pick one. */
export function SitePicker({
  value,
  onChange,
  id,
  invalid,
  'aria-describedby': describedBy,
}: {
  value: PickedSite | null;
  onChange: (site: PickedSite | null) => void;
  id?: string;
  invalid?: boolean;
  'aria-describedby'?: string;
}) {
  const [q, setQ] = useState('');
  const term = useDebounced(q.trim(), 250);
  const results = useQuery({ ...siteSearchQuery(term), enabled: !value, placeholderData: keepPreviousData });
  const listId = useId();

  if (value) {
    return (
      <div className="flex items-center justify-between gap-2 rounded-md border border-line-strong bg-paper/60 px-3 py-2">
        <span className="flex min-w-0 items-center gap-2 text-sm">
          <MapPin className="size-4 shrink-0 text-slate-500" aria-hidden="true" />
          <span className="min-w-0">
            <span className="block truncate font-medium">{value.name}</span>
            {value.clientName && <span className="block truncate text-xs text-slate-500">{value.clientName}</span>}
          </span>
        </span>
        <Button variant="ghost" size="sm" onClick={() => onChange(null)}>
          Change site
        </Button>
      </div>
    );
  }

  const sites: ApiSite[] = results.data ?? [];
  return (
    <div>
      <Input
        id={id}
        invalid={invalid}
        aria-describedby={describedBy}
        type="search"
        autoComplete="off"
        placeholder="Search by site, street, city or account"
        aria-controls={listId}
        value={q}
        onChange={(e) => setQ(e.target.value)}
      />
      <ul
        id={listId}
        aria-label="Matching sites"
        className={cn('mt-1 max-h-52 overflow-y-auto rounded-md border border-line', sites.length === 0 && 'border-dashed')}
      >
        {results.isPending ? (
          <li className="px-3 py-2 text-sm text-slate-500">Searching…</li>
        ) : sites.length === 0 ? (
          <li className="px-3 py-2 text-sm text-slate-500">{term ? 'No site matches. Try part of the street or the city.' : 'No sites yet.'}</li>
        ) : (
          sites.map((s) => (
            <li key={s.id} className="border-b border-line last:border-b-0">
              <button
                type="button"
                className="block min-h-11 w-full px-3 py-1.5 text-left hover:bg-paper focus-visible:bg-paper"
                onClick={() => onChange({ id: s.id, name: s.name, timeZone: s.timeZone, clientName: s.clientName })}
              >
                <span className="block truncate text-sm font-medium">{s.name}</span>
                <span className="block truncate text-xs text-slate-500">{[s.clientName, addressLine(s.address)].filter(Boolean).join(' · ')}</span>
              </button>
            </li>
          ))
        )}
      </ul>
    </div>
  );
}
