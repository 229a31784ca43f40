import { useState } from 'react';
import { useQuery, useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { AlertTriangle, CheckCircle2, ChevronLeft, Download, FileText, Pencil, Plus, Upload } from 'lucide-react';
import { COMM_PATH_LABELS, isLifeSafetyDevice } from '@domain/devices';
import { LifeSafetyCaution } from '@/components/coverage/finding-mark';
import { Button, buttonClass } from '@/components/ui/button';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { TableSkeleton } from '@/components/ui/skeleton';
import { useToast } from '@/components/ui/toast';
import { paths } from '@/config/paths';
import { useAppAbility } from '@/lib/ability';
import { ApiError } from '@/lib/api-client';
import { useSession } from '@/lib/auth';
import { formatDate } from '@/lib/format';
import type { ApiPanel, ApiZone } from '@/types/api';
import { panelQuery, panelUrls, useMarkProgrammed } from '@/features/panels/api/panel-queries';
import { ChangeLog } from '@/features/panels/components/change-log';
import { PanelFormDialog } from '@/features/panels/components/panel-form-dialog';
import { PanelChecks } from '@/features/panels/components/panel-checks';
import { PanelSettingsForm } from '@/features/panels/components/panel-settings-form';
import { StandbyBattery } from '@/features/panels/components/standby-battery';
import { siteQuery } from '@/features/sites/api/sites-queries';
import { panelZonesQuery } from '@/features/zones/api/zone-queries';
import { RemoveZoneDialog } from '@/features/zones/components/remove-zone-dialog';
import { ZoneFormDialog } from '@/features/zones/components/zone-form-dialog';
import { ZoneImportDialog } from '@/features/zones/components/zone-import-dialog';
import { ZoneList } from '@/features/zones/components/zone-list';

export async function loader(queryClient: QueryClient, { params }: LoaderFunctionArgs) {
  const panelId = params.panelId ?? '';
  void queryClient.prefetchQuery(panelZonesQuery(panelId));
  const panel = await queryClient.ensureQueryData(panelQuery(panelId));
  if (!panel.siteName) void queryClient.prefetchQuery(siteQuery(panel.siteId));
  return null;
}

/** Programming state: the "changed since last programmed" banner, or a quiet line when the panel is up to date. */
function ProgrammingState({ panel, timeZone, canMark }: { panel: ApiPanel; timeZone: string | undefined; canMark: boolean }) {
  const mark = useMarkProgrammed(panel.id);
  const toast = useToast();
  const last = panel.programmedAt ? `Last programmed ${formatDate(panel.programmedAt, timeZone)}.` : 'Not programmed yet.';
  const button = canMark && (
    <Button
      variant={panel.changedSinceProgrammed ? 'primary' : 'secondary'}
      size="sm"
      disabled={!panel.changedSinceProgrammed}
      busy={mark.isPending}
      onClick={() =>
        mark.mutate(undefined, {
          onSuccess: () => toast.success(`${panel.label} marked as programmed.`),
          onError: (e) => toast.error(e instanceof ApiError ? e.message : 'Something went wrong. Try again.'),
        })
      }
    >
      Mark as programmed
    </Button>
  );
  if (panel.changedSinceProgrammed)
    return (
      <div role="status" className="flex flex-col gap-3 rounded-md border border-ochre-600/40 bg-ochre-50 px-4 py-3 sm:flex-row sm:items-center sm:justify-between">
        <div className="flex items-start gap-2.5">
          <AlertTriangle className="mt-0.5 size-4 shrink-0 text-ochre-600" aria-hidden="true" />
          <div className="text-sm">
            <p className="font-semibold text-ochre-600">Changed since last programmed</p>
            <p className="text-ink">
              {last} Zones or settings changed after that: program the panel, then mark it as programmed.
            </p>
          </div>
        </div>
        {button}
      </div>
    );
  return (
    <div className="flex flex-col gap-3 rounded-md border border-line bg-card px-4 py-3 sm:flex-row sm:items-center sm:justify-between">
      <p className="flex items-start gap-2.5 text-sm">
        <CheckCircle2 className="mt-0.5 size-4 shrink-0 text-sage-600" aria-hidden="true" />
        <span>
          <span className="font-semibold text-sage-600">{panel.programmedAt ? 'Programmed' : 'Nothing to program'}</span>
          <span className="text-slate-500"> · {panel.programmedAt ? `${last} No changes since.` : 'No zones changed yet.'}</span>
        </span>
      </p>
      {button}
    </div>
  );
}

export default function PanelPage() {
  const { panelId = '' } = useParams();
  const { tenant } = useSession();
  const ability = useAppAbility();
  const { data: panel } = useSuspenseQuery(panelQuery(panelId));
  const site = useQuery({ ...siteQuery(panel.siteId), enabled: !panel.siteName });
  const zones = useQuery(panelZonesQuery(panelId));
  const [adding, setAdding] = useState(false);
  const [editing, setEditing] = useState<ApiZone | null>(null);
  const [removing, setRemoving] = useState<ApiZone | null>(null);
  const [importing, setImporting] = useState(false);
  const [editingPanel, setEditingPanel] = useState(false);

  const canCreateZone = ability.can('create', 'Zone');
  const canEditZones = ability.can('update', 'Zone');
  const canEditPanel = ability.can('update', 'Panel');
  const timeZone = site.data?.timeZone ?? tenant?.timeZone;
  const siteName = panel.siteName ?? (site.data ? [site.data.clientName, site.data.name, site.data.address?.line1].filter(Boolean).join(' · ') : undefined);
  const list = zones.data ?? [];
  const inUse = list.filter((z) => z.status !== 'removed').length;
  const full = panel.nextZoneNumber === null && inUse >= panel.zoneCapacity;
  const hasLifeSafety = list.some((z) => isLifeSafetyDevice(z.deviceType));

  const context = (
    <>
      {panel.makeModel || 'Make and model not recorded'} · {COMM_PATH_LABELS[panel.commPath]} ·{' '}
      <span className="whitespace-nowrap">
        wireless zones {panel.wirelessZoneFrom}–{panel.wirelessZoneTo}
      </span>
    </>
  );

  return (
    <>
      <Link to={paths.firm.site(panel.siteId)} className="mb-2 inline-flex items-center gap-1 text-sm font-medium text-brass-700 hover:underline">
        <ChevronLeft className="size-4" aria-hidden="true" />
        {siteName ?? 'Back to the site'}
      </Link>
      <PageHeader
        title={panel.label}
        context={context}
        action={
          canCreateZone && (
            <Button onClick={() => setAdding(true)} disabled={full} title={full ? 'Every zone of this panel is in use.' : undefined}>
              <Plus className="size-4" aria-hidden="true" /> Add zone
            </Button>
          )
        }
      />

      <div className="space-y-6">
        <div className="-mt-3 flex flex-wrap gap-2">
          {canCreateZone && (
            <Button variant="secondary" size="sm" onClick={() => setImporting(true)}>
              <Upload className="size-4" aria-hidden="true" /> Import zones (CSV)
            </Button>
          )}
          <a href={panelUrls.zonesCsv(panel.id)} download className={buttonClass('secondary', 'sm')}>
            <Download className="size-4" aria-hidden="true" /> Export CSV
          </a>
          <a href={panelUrls.programmingSheet(panel.id)} download className={buttonClass('secondary', 'sm')}>
            <FileText className="size-4" aria-hidden="true" /> Programming sheet (PDF)
          </a>
          {canEditPanel && (
            <Button variant="ghost" size="sm" onClick={() => setEditingPanel(true)}>
              <Pencil className="size-4" aria-hidden="true" /> Edit panel
            </Button>
          )}
        </div>

        <ProgrammingState panel={panel} timeZone={timeZone} canMark={canEditPanel} />

        <section aria-labelledby="zones-heading" className="space-y-3">
          <div className="flex flex-wrap items-baseline justify-between gap-2">
            <h2 id="zones-heading" className="text-lg font-semibold">
              Zones
            </h2>
            <p className={full ? 'text-sm font-medium text-clay-600' : 'text-sm text-slate-500'}>
              {inUse} of {panel.zoneCapacity} in use
              {panel.nextZoneNumber !== null ? ` · next free wireless number ${panel.nextZoneNumber}` : ' · no free wireless number'}
            </p>
          </div>
          {zones.isPending ? (
            <TableSkeleton rows={6} />
          ) : zones.isError ? (
            <p className="text-sm text-clay-600">{zones.error.message}</p>
          ) : list.length === 0 ? (
            <EmptyState
              title="No zones yet"
              action={
                canCreateZone && (
                  <div className="flex flex-wrap justify-center gap-2">
                    <Button onClick={() => setAdding(true)}>
                      <Plus className="size-4" aria-hidden="true" /> Add zone
                    </Button>
                    <Button variant="secondary" onClick={() => setImporting(true)}>
                      <Upload className="size-4" aria-hidden="true" /> Import zones (CSV)
                    </Button>
                  </div>
                )
              }
            >
              Enrol each device as a zone: its number, serial and what it protects. New zones take the next free wireless number.
            </EmptyState>
          ) : (
            <ZoneList zones={list} canEdit={canEditZones} onEdit={setEditing} onRemove={setRemoving} />
          )}
          {hasLifeSafety && <LifeSafetyCaution />}
        </section>

        <div className="grid gap-6 lg:grid-cols-5">
          <div className="lg:col-span-3">
            <PanelSettingsForm key={JSON.stringify(panel.settings)} panel={panel} canEdit={canEditPanel} />
          </div>
          <div className="order-first space-y-6 lg:order-none lg:col-span-2">
            {/* one caution on the page: under the zones when they list smoke, heat or CO devices, else in the checks */}
            <PanelChecks audit={panel.audit} showCaution={!hasLifeSafety} />
            <StandbyBattery panel={panel} timeZone={timeZone} showCaution={!hasLifeSafety && !panel.audit.some((f) => f.lifeSafety)} />
          </div>
        </div>

        <ChangeLog panelId={panel.id} timeZone={timeZone} />
      </div>

      {canCreateZone && (
        <ZoneFormDialog
          key={editing?.id ?? 'new'}
          open={adding || editing !== null}
          onClose={() => {
            setAdding(false);
            setEditing(null);
          }}
          panel={panel}
          zone={editing ?? undefined}
        />
      )}
      {canEditZones && <RemoveZoneDialog panelId={panel.id} zone={removing} onClose={() => setRemoving(null)} />}
      {canCreateZone && <ZoneImportDialog open={importing} onClose={() => setImporting(false)} panelId={panel.id} panelLabel={panel.label} />}
      {canEditPanel && <PanelFormDialog open={editingPanel} onClose={() => setEditingPanel(false)} siteId={panel.siteId} panel={panel} />}
    </>
  );
}
