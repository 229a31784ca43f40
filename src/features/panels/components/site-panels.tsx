import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { ChevronRight, Plus, RadioTower } from 'lucide-react';
import { COMM_PATH_LABELS } from '@domain/devices';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { Skeleton } from '@/components/ui/skeleton';
import { paths } from '@/config/paths';
import { useAppAbility } from '@/lib/ability';
import type { ApiPanel } from '@/types/api';
import { panelZonesQuery } from '@/features/zones/api/zone-queries';
import { sitePanelsQuery } from '../api/panel-queries';
import { findingSummary } from './panel-checks';
import { PanelFormDialog } from './panel-form-dialog';

/** "12 of 64 zones", counting zones that hold a number (not removed ones). */
function ZoneCount({ panel }: { panel: ApiPanel }) {
  const zones = useQuery({ ...panelZonesQuery(panel.id), enabled: panel.zoneCount === undefined });
  const count = panel.zoneCount ?? zones.data?.filter((z) => z.status !== 'removed').length;
  if (count === undefined) return <Skeleton className="inline-block h-4 w-20 align-middle" />;
  const full = count >= panel.zoneCapacity;
  return (
    <span className={full ? 'font-medium text-clay-600' : undefined}>
      {count} of {panel.zoneCapacity} zones{full ? ' · full' : ''}
    </span>
  );
}

function PanelRow({ panel }: { panel: ApiPanel }) {
  const cp01 = findingSummary(panel.audit);
  return (
    <li>
      <Link to={paths.firm.panel(panel.id)} className="group flex items-center gap-3 px-4 py-3 hover:bg-paper/60 focus-visible:outline-offset-[-2px]">
        <div className="min-w-0 flex-1 space-y-1">
          <p className="font-medium text-ink group-hover:underline">{panel.label}</p>
          <p className="text-sm text-slate-500">
            {[panel.makeModel || 'Make and model not recorded', COMM_PATH_LABELS[panel.commPath]].join(' · ')}
            {' · '}
            <ZoneCount panel={panel} />
          </p>
          <div className="flex flex-wrap gap-1.5">
            {panel.changedSinceProgrammed && <Badge tone="warn">Changed since last programmed</Badge>}
            <Badge tone={cp01.tone}>{cp01.text}</Badge>
          </div>
        </div>
        <ChevronRight className="size-4 shrink-0 text-slate-500" aria-hidden="true" />
      </Link>
    </li>
  );
}

/** The panels of a site, each linking to its panel page, with "Add panel". */
export function SitePanels({ siteId }: { siteId: string }) {
  const ability = useAppAbility();
  const canAdd = ability.can('create', 'Panel');
  const panels = useQuery(sitePanelsQuery(siteId));
  const [adding, setAdding] = useState(false);
  const addButton = canAdd && (
    <Button variant="secondary" size="sm" onClick={() => setAdding(true)}>
      <Plus className="size-4" aria-hidden="true" /> Add panel
    </Button>
  );

  return (
    <>
      <section className="rounded-md border border-line bg-card" aria-labelledby={`site-panels-${siteId}`}>
        <header className="flex items-center justify-between gap-2 border-b border-line px-4 py-3">
          <h2 id={`site-panels-${siteId}`} className="text-sm font-semibold text-ink">
            Panels
          </h2>
          {panels.data && panels.data.length > 0 && addButton}
        </header>
        {panels.isPending ? (
          <div className="space-y-2 p-4" role="status" aria-label="Loading">
            <Skeleton className="h-5 w-1/3" />
            <Skeleton className="h-4 w-2/3" />
          </div>
        ) : panels.isError ? (
          <p className="p-4 text-sm text-clay-600">{panels.error.message}</p>
        ) : panels.data.length === 0 ? (
          <div className="flex flex-col items-center gap-3 px-4 py-8 text-center">
            <RadioTower className="size-6 text-slate-500" aria-hidden="true" />
            <div>
              <p className="font-medium">No panel yet</p>
              <p className="mt-1 text-sm text-slate-500">Add the control panel, then enrol its zones or import them from a CSV file.</p>
            </div>
            {addButton}
          </div>
        ) : (
          <ul className="divide-y divide-line">
            {panels.data.map((p) => (
              <PanelRow key={p.id} panel={p} />
            ))}
          </ul>
        )}
      </section>
      {canAdd && <PanelFormDialog open={adding} onClose={() => setAdding(false)} siteId={siteId} firstPanel={panels.data?.length === 0} />}
    </>
  );
}
