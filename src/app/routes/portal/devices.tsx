import { useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { Bell, BellOff } from 'lucide-react';
import { LifeSafetyCaution, TriangleMark } from '@/components/coverage/finding-mark';
import { EmptyState } from '@/components/ui/empty-state';
import { cn } from '@/lib/cn';
import { portalDevicesQuery } from '@/features/portal/api/portal-queries';
import { DeviceBadges } from '@/features/portal/components/device-badges';
import { PortalTitle } from '@/features/portal/components/portal-parts';
import { deviceLifeWords, isNotProtecting } from '@/features/portal/life-words';
import type { PortalDevice } from '@/types/api';

export async function loader(queryClient: QueryClient, { params }: LoaderFunctionArgs) {
  await queryClient.ensureQueryData(portalDevicesQuery(params.siteId ?? ''));
  return null;
}

/** The triangle's colour for a smoke, heat or CO device: clay when it needs action, ochre to look at, slate when fine. */
function markTone(device: PortalDevice): 'clay' | 'ochre' | 'slate' {
  if (isNotProtecting(device)) return 'clay';
  const tone = deviceLifeWords(device).tone;
  return tone === 'bad' ? 'clay' : tone === 'warn' ? 'ochre' : 'slate';
}

function DeviceCard({ device: d }: { device: PortalDevice }) {
  const notProtecting = isNotProtecting(d);
  return (
    <li className={cn('rounded-md border bg-card p-4', notProtecting ? 'border-clay-600/50' : 'border-line')}>
      <div className="flex flex-wrap items-start justify-between gap-2">
        <h2 className="flex min-w-0 items-start gap-2 text-base font-semibold break-words">
          {d.lifeSafety && <TriangleMark tone={markTone(d)} className="mt-1" />}
          <span className="min-w-0">{d.description}</span>
        </h2>
        <DeviceBadges device={d} />
      </div>
      <p className="text-sm text-slate-500">
        {d.kind}
        {d.lifeSafety && <span className="sr-only"> (smoke, heat or carbon monoxide: life safety)</span>}
      </p>
      <p className={cn('mt-2 text-sm', notProtecting && 'font-medium text-clay-600')}>{d.whenArmed}</p>
      <p className="mt-2 flex items-center gap-1.5 text-sm text-slate-500">
        {d.chime ? <Bell className="size-4" aria-hidden="true" /> : <BellOff className="size-4" aria-hidden="true" />}
        {d.chime ? 'Chimes when opened while the alarm is off' : 'No chime'}
      </p>
    </li>
  );
}

/** The household's devices in its own words: what each is, what it does when the alarm is set, chime, upkeep. */
export default function PortalDevicesPage() {
  const { siteId = '' } = useParams();
  const { data: devices } = useSuspenseQuery(portalDevicesQuery(siteId));
  const anyLifeSafety = devices.some((d) => d.lifeSafety);
  return (
    <>
      <PortalTitle title="Devices" context="Each sensor and alarm by the name your keypad uses, and what it does." />
      {devices.length === 0 ? (
        <EmptyState title="No devices recorded yet">Your firm has not recorded the devices of this home yet.</EmptyState>
      ) : (
        <>
          {anyLifeSafety && (
            <p className="mb-3 flex items-center gap-2 text-sm text-slate-500">
              <TriangleMark tone="slate" />
              <span>The triangle marks smoke, heat and carbon monoxide alarms.</span>
            </p>
          )}
          <ul className="grid gap-3 md:grid-cols-2" aria-label="Devices">
            {devices.map((d) => (
              <DeviceCard key={d.id} device={d} />
            ))}
          </ul>
        </>
      )}
      <LifeSafetyCaution className="mt-5" />
    </>
  );
}
