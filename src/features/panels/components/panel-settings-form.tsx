import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { CP01_DEFAULTS, CP01_RANGES, type Cp01Range, type PanelSettings } from '@domain/cp01';
import { panelSettingsSchema } from '@domain/schemas/panel';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { FormError, FormField } from '@/components/ui/form-field';
import { Input } from '@/components/ui/input';
import { useToast } from '@/components/ui/toast';
import { applyServerErrors } from '@/lib/form-errors';
import type { ApiPanel, ApiPanelFinding } from '@/types/api';
import { useUpdatePanel } from '../api/panel-queries';
import { CheckField } from './check-field';

type NumberKey = 'exitDelaySec' | 'entryDelaySec' | 'entryDelay2Sec' | 'abortWindowSec' | 'swingerLimit' | 'cancelWindowMin' | 'crossZoneWindowSec';
type SwitchKey = 'exitRestart' | 'autoStay' | 'crossZoning' | 'duress';

const UNIT_WORDS: Record<Cp01Range['unit'], string> = { s: 's', min: 'min', trips: 'trips' };

const NUMBER_FIELDS: { key: NumberKey; label: string; unit: string }[] = [
  { key: 'exitDelaySec', label: 'Exit delay', unit: 's' },
  { key: 'entryDelaySec', label: 'Entry delay', unit: 's' },
  { key: 'entryDelay2Sec', label: 'Second entry delay', unit: 's' },
  { key: 'abortWindowSec', label: 'Abort window', unit: 's' },
  { key: 'swingerLimit', label: 'Swinger limit', unit: 'trips' },
  { key: 'cancelWindowMin', label: 'Cancel window', unit: 'min' },
  { key: 'crossZoneWindowSec', label: 'Cross-zone window', unit: 's' },
];

const SWITCH_FIELDS: { key: SwitchKey; label: string; hint: string }[] = [
  { key: 'exitRestart', label: 'Exit-time restart', hint: 'Re-entering during the exit delay restarts it once.' },
  { key: 'autoStay', label: 'Auto-stay if nobody leaves', hint: 'Armed away with no exit: the panel arms stay.' },
  { key: 'crossZoning', label: 'Cross zoning', hint: 'Two zones must trip within the window to report.' },
  { key: 'duress', label: 'Duress code', hint: 'A code that disarms and silently calls for help.' },
];

const ALL_FIELDS = [...NUMBER_FIELDS.map((f) => f.key), ...SWITCH_FIELDS.map((f) => f.key)] as const;

/** "CP-01: 45–255 s · default 60" — the range the audit checks, shown beside the field. */
function rangeHint(key: NumberKey, unit: string): string {
  const range = (CP01_RANGES as Partial<Record<NumberKey, Cp01Range>>)[key];
  const def = `default ${CP01_DEFAULTS[key]} ${unit}`;
  if (!range) return key === 'crossZoneWindowSec' ? `Used when cross zoning is on · ${def}` : def;
  const u = UNIT_WORDS[range.unit];
  const span = range.max === null ? `${range.min} ${u} or more` : `${range.min}–${range.max} ${u}`;
  return `CP-01: ${span} · ${def}`;
}

/** The panel's false-alarm-reduction settings, with the CP-01 ranges as hints and open findings marked. */
export function PanelSettingsForm({ panel, canEdit }: { panel: ApiPanel; canEdit: boolean }) {
  const update = useUpdatePanel(panel.id);
  const toast = useToast();
  const [formError, setFormError] = useState<string | null>(null);
  const { register, handleSubmit, setError, formState, reset } = useForm<PanelSettings>({
    resolver: zodResolver(panelSettingsSchema),
    defaultValues: { ...CP01_DEFAULTS, ...panel.settings },
  });
  const e = formState.errors;
  const findingFor = (key: keyof PanelSettings): ApiPanelFinding | undefined => panel.audit.find((f) => f.topic === 'cp01' && f.field === key && f.severity !== 'info');

  const onSubmit = handleSubmit((settings) => {
    setFormError(null);
    update.mutate(
      { settings },
      {
        onSuccess: (saved) => {
          reset({ ...CP01_DEFAULTS, ...saved.settings });
          const errors = saved.audit.filter((f) => f.severity === 'error').length;
          toast.success(errors > 0 ? `Settings saved. ${errors === 1 ? '1 setting is' : `${errors} settings are`} still outside CP-01.` : 'Settings saved.');
        },
        onError: (err) => setFormError(applyServerErrors(err, setError, ALL_FIELDS)),
      },
    );
  });

  return (
    <Card title="Alarm-reduction settings (CP-01)">
      <form onSubmit={onSubmit} noValidate className="space-y-4">
        <FormError message={formError} />
        <fieldset disabled={!canEdit} className="space-y-4">
          <legend className="sr-only">Panel settings</legend>
          <div className="grid grid-cols-2 gap-x-3 gap-y-4 sm:gap-x-4">
            {NUMBER_FIELDS.map((f) => {
              const finding = findingFor(f.key);
              return (
                <FormField
                  key={f.key}
                  label={`${f.label} (${f.unit})`}
                  error={e[f.key]?.message}
                  hint={
                    <>
                      {rangeHint(f.key, f.unit)}
                      {finding && (
                        <span className={finding.severity === 'error' ? 'block font-medium text-clay-600' : 'block font-medium text-ochre-600'}>
                          {finding.severity === 'error' ? 'Outside CP-01' : 'Check against CP-01'}: see panel checks
                        </span>
                      )}
                    </>
                  }
                >
                  <Input type="number" inputMode="numeric" min={0} className="tabular-nums" {...register(f.key, { valueAsNumber: true })} />
                </FormField>
              );
            })}
          </div>
          <div className="grid gap-3 sm:grid-cols-2">
            {SWITCH_FIELDS.map((f) => {
              const finding = findingFor(f.key);
              return (
                <CheckField
                  key={f.key}
                  label={f.label}
                  hint={
                    <>
                      {e[f.key]?.message ?? f.hint}
                      {finding && (
                        <span className={finding.severity === 'error' ? 'block font-medium text-clay-600' : 'block font-medium text-ochre-600'}>
                          {finding.severity === 'error' ? 'Outside CP-01' : 'Check against CP-01'}: see panel checks
                        </span>
                      )}
                    </>
                  }
                  {...register(f.key)}
                />
              );
            })}
          </div>
        </fieldset>
        {canEdit && (
          <div className="flex flex-wrap items-center justify-end gap-2">
            {formState.isDirty && <span className="text-xs text-slate-500">Saving marks the panel as changed since last programmed.</span>}
            <Button type="submit" busy={update.isPending} disabled={!formState.isDirty}>
              Save settings
            </Button>
          </div>
        )}
      </form>
    </Card>
  );
}
