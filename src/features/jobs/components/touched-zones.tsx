import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { ListChecks } from 'lucide-react';
import { paths } from '@/config/paths';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Dialog } from '@/components/ui/dialog';
import { FormError } from '@/components/ui/form-field';
import { Skeleton } from '@/components/ui/skeleton';
import { useToast } from '@/components/ui/toast';
import { ApiError } from '@/lib/api-client';
import type { ApiJob } from '@/types/api';
import { siteZonesQuery, useUpdateJob, type SiteZones } from '../api/jobs-queries';

function Picker({ job, data, open, onClose }: { job: ApiJob; data: SiteZones; open: boolean; onClose: () => void }) {
  const update = useUpdateJob(job.id);
  const toast = useToast();
  const [chosen, setChosen] = useState<Set<string>>(() => new Set(job.touchedZoneIds));
  const [error, setError] = useState<string | null>(null);
  const toggle = (id: string) =>
    setChosen((prev) => {
      const next = new Set(prev);
      if (next.has(id)) next.delete(id);
      else next.add(id);
      return next;
    });
  const save = () => {
    setError(null);
    // keep the zones' order on the panels
    const ids = data.zones.filter((z) => chosen.has(z.id)).map((z) => z.id);
    update.mutate(
      { touchedZoneIds: ids },
      {
        onSuccess: () => {
          toast.success(ids.length === 1 ? '1 touched zone saved.' : `${ids.length} touched zones saved.`);
          onClose();
        },
        onError: (err) => setError(err instanceof ApiError ? err.message : 'Something went wrong. Try again.'),
      },
    );
  };
  return (
    <Dialog
      open={open}
      onClose={onClose}
      title="Zones this job touched"
      description="Each touched zone needs a walk-test result before the job can be completed."
    >
      <div className="space-y-4">
        <FormError message={error} />
        {data.panels.map((panel) => {
          const zones = data.zones.filter((z) => z.panelId === panel.id);
          return (
            <fieldset key={panel.id}>
              <legend className="mb-1 text-sm font-semibold">{panel.label}</legend>
              {zones.length === 0 ? (
                <p className="text-sm text-slate-500">No zones on this panel.</p>
              ) : (
                <ul className="max-h-72 divide-y divide-line overflow-y-auto rounded-md border border-line">
                  {zones.map((z) => (
                    <li key={z.id}>
                      <label className="flex min-h-12 cursor-pointer items-center gap-3 px-3 py-2 text-sm">
                        <input
                          type="checkbox"
                          className="size-6 shrink-0 accent-brass-600"
                          checked={chosen.has(z.id)}
                          onChange={() => toggle(z.id)}
                        />
                        <span>
                          <span className="font-medium tabular-nums">Zone {z.number}</span> {z.description}
                        </span>
                      </label>
                    </li>
                  ))}
                </ul>
              )}
            </fieldset>
          );
        })}
        <div className="flex justify-end gap-2">
          <Button variant="secondary" onClick={onClose}>
            Cancel
          </Button>
          <Button onClick={save} busy={update.isPending}>
            Save touched zones
          </Button>
        </div>
      </div>
    </Dialog>
  );
}

/** The zones the job added, changed or replaced: they are walk-tested first. */
export function TouchedZones({ job, editable }: { job: ApiJob; editable: boolean }) {
  const zones = useQuery(siteZonesQuery(job.siteId));
  const [open, setOpen] = useState(false);
  const touched = new Set(job.touchedZoneIds);
  const list = (zones.data?.zones ?? []).filter((z) => touched.has(z.id));
  return (
    <Card
      title="Zones this job touched"
      action={
        editable &&
        zones.data && (
          <Button variant="secondary" size="sm" onClick={() => setOpen(true)}>
            <ListChecks className="size-4" aria-hidden="true" /> Choose zones
          </Button>
        )
      }
    >
      {zones.isPending ? (
        <Skeleton className="h-8 w-full" />
      ) : zones.isError ? (
        <p className="text-sm text-clay-600">{zones.error.message}</p>
      ) : zones.data.panels.length === 0 ? (
        <p className="text-sm text-slate-500">This site has no panel yet.</p>
      ) : list.length === 0 ? (
        <p className="text-sm text-slate-500">None yet. Choose the zones you add, change or replace; they are walk-tested first.</p>
      ) : (
        <ul className="flex flex-wrap gap-2">
          {list.map((z) => (
            <li key={z.id}>
              <Link
                to={paths.firm.panel(z.panelId)}
                className="inline-flex items-center gap-1 rounded-md border border-line bg-paper px-2 py-1 text-sm hover:border-brass-600"
              >
                <span className="font-medium tabular-nums">Zone {z.number}</span> {z.description}
              </Link>
            </li>
          ))}
        </ul>
      )}
      {zones.data && open && <Picker job={job} data={zones.data} open={open} onClose={() => setOpen(false)} />}
    </Card>
  );
}
