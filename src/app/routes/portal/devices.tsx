import { useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { Bell, BellOff } from 'lucide-react';
import { LifeSafetyCaution } from '@/components/coverage/finding-mark';
import { Badge } from '@/components/ui/badge';
import { EmptyState } from '@/components/ui/empty-state';
import { portalDevicesQuery } from '@/features/portal/api/portal-queries';
import { PortalTitle } from '@/features/portal/components/portal-parts';
import { lifeWords } from '@/features/portal/life-words';

export async function loader(queryClient: QueryClient, { params }: LoaderFunctionArgs) {
  await queryClient.ensureQueryData(portalDevicesQuery(params.siteId ?? ''));
  return null;
}

/** The household's devices in its own words: what each is, what it does when the alarm is set, chime, upkeep. */
export default function PortalDevicesPage() {
  const { siteId = '' } = useParams();
  const { data: devices } = useSuspenseQuery(portalDevicesQuery(siteId));
  return (
    <>
      <PortalTitle title="Devices" context="Each sensor and alarm by the name your keypad uses, and what it does." />
      {devices.length === 0 ? (
        <EmptyState title="No devices recorded yet">Your firm has not recorded the devices of this home yet.</EmptyState>
      ) : (
        <ul className="grid gap-3 md:grid-cols-2" aria-label="Devices">
          {devices.map((d) => {
            const words = lifeWords(d.life);
            return (
              <li key={d.id} className="rounded-md border border-line bg-card p-4">
                <div className="flex flex-wrap items-start justify-between gap-2">
                  <h2 className="min-w-0 text-base font-semibold break-words">{d.description}</h2>
                  <Badge tone={words.tone === 'bad' ? 'bad' : words.tone === 'warn' ? 'warn' : words.tone === 'ok' ? 'ok' : 'neutral'}>{words.text}</Badge>
                </div>
                <p className="text-sm text-slate-500">{d.kind}</p>
                <p className="mt-2 text-sm">{d.whenArmed}</p>
                <p className="mt-2 flex items-center gap-1.5 text-sm text-slate-500">
                  {d.chime ? <Bell className="size-4" aria-hidden="true" /> : <BellOff className="size-4" aria-hidden="true" />}
                  {d.chime ? 'Chimes when opened while the alarm is off' : 'No chime'}
                </p>
              </li>
            );
          })}
        </ul>
      )}
      <LifeSafetyCaution className="mt-5" />
    </>
  );
}
