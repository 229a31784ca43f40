import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { useNavigate } from 'react-router-dom';
import { CP01_DEFAULTS } from '@domain/cp01';
import { COMM_PATH_LABELS, COMM_PATHS } from '@domain/devices';
import { PANEL_OCCUPANCIES, SINGLE_PATH_FAILURE_REPORT_MAX_MIN } from '@domain/panel-power';
import { panelSchema } from '@domain/schemas/panel';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormError, FormField } from '@/components/ui/form-field';
import { Input, Select } from '@/components/ui/input';
import { useToast } from '@/components/ui/toast';
import { paths } from '@/config/paths';
import { applyServerErrors } from '@/lib/form-errors';
import type { ApiPanel } from '@/types/api';
import { useCreatePanel, useUpdatePanel } from '../api/panel-queries';

type PanelFormInput = z.input<typeof panelSchema>;
type PanelFormValues = z.output<typeof panelSchema>;

const FIELDS = [
  'label',
  'makeModel',
  'zoneCapacity',
  'wirelessZoneFrom',
  'wirelessZoneTo',
  'commPath',
  'installedOn',
  'occupancy',
  'standbyCurrentMa',
  'alarmCurrentMa',
  'batteryAh',
  'batteryManufacturedOn',
  'pathFailureReportMin',
] as const satisfies readonly (keyof PanelFormInput)[];

/** Home or business, in the form's own short words. */
const OCCUPANCY_WORDS: Record<(typeof PANEL_OCCUPANCIES)[number], string> = { household: 'Home', commercial: 'Business' };

/** An empty number field is "not recorded" (null), not zero. */
const numberOrNull = (v: unknown) => (v === '' || v === null || v === undefined ? null : Number(v));

/** A new panel: 64 zones, wireless 9–64, cellular, CP-01 default settings. */
export const NEW_PANEL_DEFAULTS = { zoneCapacity: 64, wirelessZoneFrom: 9, wirelessZoneTo: 64, commPath: 'cellular' } as const;

interface PanelFormDialogProps {
  open: boolean;
  onClose: () => void;
  /** Adding: the site the panel belongs to. */
  siteId: string;
  /** Editing: the panel. */
  panel?: ApiPanel;
  /** Adding: prefill "Main panel" for the site's first panel. */
  firstPanel?: boolean;
}

export function PanelFormDialog({ open, onClose, siteId, panel, firstPanel = false }: PanelFormDialogProps) {
  return (
    <Dialog
      open={open}
      onClose={onClose}
      title={panel ? `Edit ${panel.label}` : 'Add panel'}
      description={panel ? 'The panel’s make, zone range and how it reports.' : 'The control panel at this site. Its alarm-reduction settings start at the CP-01 defaults; change them on the panel page.'}
    >
      <PanelForm siteId={siteId} panel={panel} firstPanel={firstPanel} onDone={onClose} />
    </Dialog>
  );
}

function PanelForm({ siteId, panel, firstPanel, onDone }: { siteId: string; panel: ApiPanel | undefined; firstPanel: boolean; onDone: () => void }) {
  const create = useCreatePanel(siteId);
  const update = useUpdatePanel(panel?.id ?? '');
  const toast = useToast();
  const navigate = useNavigate();
  const [formError, setFormError] = useState<string | null>(null);
  const { register, handleSubmit, setError, formState } = useForm<PanelFormInput, unknown, PanelFormValues>({
    resolver: zodResolver(panelSchema),
    defaultValues: panel
      ? {
          label: panel.label,
          makeModel: panel.makeModel,
          zoneCapacity: panel.zoneCapacity,
          wirelessZoneFrom: panel.wirelessZoneFrom,
          wirelessZoneTo: panel.wirelessZoneTo,
          commPath: panel.commPath,
          installedOn: panel.installedOn ?? '',
          occupancy: panel.occupancy ?? 'household',
          standbyCurrentMa: panel.standbyCurrentMa ?? null,
          alarmCurrentMa: panel.alarmCurrentMa ?? null,
          batteryAh: panel.batteryAh ?? null,
          batteryManufacturedOn: panel.batteryManufacturedOn ?? '',
          pathFailureReportMin: panel.pathFailureReportMin ?? null,
        }
      : {
          label: firstPanel ? 'Main panel' : '',
          makeModel: '',
          ...NEW_PANEL_DEFAULTS,
          installedOn: '',
          occupancy: 'household',
          standbyCurrentMa: null,
          alarmCurrentMa: null,
          batteryAh: null,
          batteryManufacturedOn: '',
          pathFailureReportMin: null,
          settings: { ...CP01_DEFAULTS },
        },
  });
  const e = formState.errors;

  const onSubmit = handleSubmit((values) => {
    setFormError(null);
    const failed = (err: unknown) => setFormError(applyServerErrors(err, setError, FIELDS));
    if (panel) {
      const { settings: _settings, ...details } = values;
      update.mutate(details, {
        onSuccess: (saved) => {
          toast.success(`${saved.label} saved.`);
          onDone();
        },
        onError: failed,
      });
    } else {
      create.mutate(values, {
        onSuccess: (saved) => {
          toast.success(`${saved.label} added. Add its zones next.`);
          onDone();
          void navigate(paths.firm.panel(saved.id));
        },
        onError: failed,
      });
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4">
      <FormError message={formError} />
      <div className="grid grid-cols-2 gap-x-3 gap-y-4 sm:gap-x-4">
        <FormField label="Name" error={e.label?.message} hint="How staff tell the panels of a site apart." className="col-span-2 sm:col-span-1">
          <Input autoComplete="off" placeholder="Main panel" {...register('label')} />
        </FormField>
        <FormField label="Make and model" error={e.makeModel?.message} className="col-span-2 sm:col-span-1">
          <Input autoComplete="off" {...register('makeModel')} />
        </FormField>
        <FormField label="Zone capacity" error={e.zoneCapacity?.message} hint="Zones the panel holds.">
          <Input type="number" inputMode="numeric" min={1} max={999} {...register('zoneCapacity', { valueAsNumber: true })} />
        </FormField>
        <FormField label="Communication path" error={e.commPath?.message}>
          <Select {...register('commPath')}>
            {COMM_PATHS.map((c) => (
              <option key={c} value={c}>
                {COMM_PATH_LABELS[c]}
              </option>
            ))}
          </Select>
        </FormField>
        <FormField label="First wireless zone" error={e.wirelessZoneFrom?.message}>
          <Input type="number" inputMode="numeric" min={1} max={999} {...register('wirelessZoneFrom', { valueAsNumber: true })} />
        </FormField>
        <FormField label="Last wireless zone" error={e.wirelessZoneTo?.message} hint="New zones take the next free number in this range.">
          <Input type="number" inputMode="numeric" min={1} max={999} {...register('wirelessZoneTo', { valueAsNumber: true })} />
        </FormField>
        <FormField label="Installed on" error={e.installedOn?.message} className="col-span-2 sm:col-span-1">
          <Input type="date" {...register('installedOn')} />
        </FormField>
      </div>
      <fieldset className="space-y-3 border-t border-line pt-4">
        <legend className="text-sm font-semibold text-ink">Power and path</legend>
        <p className="text-xs text-slate-500">
          Mullion works out the standby battery from these and checks the path when the panel carries smoke, heat or CO devices. Leave a field empty
          until it is measured.
        </p>
        <div className="grid grid-cols-2 gap-x-3 gap-y-4 sm:gap-x-4">
          <FormField label="Occupancy" error={e.occupancy?.message} hint="Decides the alarm time a fire panel’s battery must cover." className="col-span-2 sm:col-span-1">
            <Select {...register('occupancy')}>
              {PANEL_OCCUPANCIES.map((o) => (
                <option key={o} value={o}>
                  {OCCUPANCY_WORDS[o]}
                </option>
              ))}
            </Select>
          </FormField>
          <FormField label="Battery (Ah)" error={e.batteryAh?.message} hint="The standby battery fitted." className="col-span-2 sm:col-span-1">
            <Input type="number" inputMode="decimal" min={0} step="any" className="tabular-nums" {...register('batteryAh', { setValueAs: numberOrNull })} />
          </FormField>
          <FormField label="Standby current (mA)" error={e.standbyCurrentMa?.message} hint="Everything the panel powers, at rest.">
            <Input type="number" inputMode="decimal" min={0} step="any" className="tabular-nums" {...register('standbyCurrentMa', { setValueAs: numberOrNull })} />
          </FormField>
          <FormField label="Alarm current (mA)" error={e.alarmCurrentMa?.message} hint="With the sirens sounding.">
            <Input type="number" inputMode="decimal" min={0} step="any" className="tabular-nums" {...register('alarmCurrentMa', { setValueAs: numberOrNull })} />
          </FormField>
          <FormField label="Battery label date" error={e.batteryManufacturedOn?.message} hint="The date printed on the battery." className="col-span-2 sm:col-span-1">
            <Input type="date" {...register('batteryManufacturedOn')} />
          </FormField>
          <FormField
            label="Minutes until a path failure reaches the monitoring center"
            error={e.pathFailureReportMin?.message}
            hint={`A fire panel on one path: at most ${SINGLE_PATH_FAILURE_REPORT_MAX_MIN} min (NFPA 72).`}
            className="col-span-2 sm:col-span-1"
          >
            <Input type="number" inputMode="numeric" min={0} step={1} className="tabular-nums" {...register('pathFailureReportMin', { setValueAs: numberOrNull })} />
          </FormField>
        </div>
      </fieldset>
      <div className="flex justify-end gap-2 pt-2">
        <Button variant="secondary" onClick={onDone}>
          Cancel
        </Button>
        <Button type="submit" busy={create.isPending || update.isPending}>
          {panel ? 'Save panel' : 'Add panel'}
        </Button>
      </div>
    </form>
  );
}
