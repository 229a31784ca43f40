import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { AlertTriangle } from 'lucide-react';
import { DEFAULT_AVERAGE_CURRENT_UA, SMOKE_ALARM_MAX_YEARS, mergeUpkeepSettings, type UpkeepSettings } from '@domain/device-life';
import { DEVICE_TYPE_LABELS, type DeviceType } from '@domain/devices';
import { LIFE_SAFETY_CAUTION } from '@domain/life-safety';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { FormError } from '@/components/ui/form-field';
import { Input } from '@/components/ui/input';
import { Skeleton } from '@/components/ui/skeleton';
import { useToast } from '@/components/ui/toast';
import { ApiError } from '@/lib/api-client';
import { upkeepSettingsQuery, useSaveUpkeepSettings } from '../api/firm-queries';

/** Device types with a battery we track (our usage model has a current for them). */
const BATTERY_DEVICES = (Object.keys(DEFAULT_AVERAGE_CURRENT_UA) as DeviceType[]).filter((t) => DEFAULT_AVERAGE_CURRENT_UA[t] !== null);

type Draft = {
  smoke: string;
  smokeDetector: string;
  heat: string;
  co: string;
  usable: string;
  soon: string;
  years: Partial<Record<DeviceType, string>>;
};

function toDraft(saved: UpkeepSettings): Draft {
  // An answer from before the newer settings: the defaults fill what it lacks.
  const s = mergeUpkeepSettings(saved);
  const years: Partial<Record<DeviceType, string>> = {};
  for (const [type, value] of Object.entries(s.batteryYearsOverride) as [DeviceType, number][]) years[type] = String(value);
  return {
    smoke: String(s.smokeEndOfLifeYears),
    smokeDetector: String(s.smokeDetectorEndOfLifeYears),
    heat: String(s.heatEndOfLifeYears),
    co: String(s.coEndOfLifeYears),
    usable: String(s.usableCapacityFraction),
    soon: String(s.soonDays),
    years,
  };
}

const num = (v: string) => (v.trim() === '' ? Number.NaN : Number(v));

/**
 * The firm's device-life model: smoke alarm, smoke detector, heat and CO end of life, the usable
 * share of a battery's capacity, how early upkeep counts as "soon", and battery-life overrides by
 * device type. Only the owner may change it.
 */
export function UpkeepSettingsForm({ canEdit }: { canEdit: boolean }) {
  const query = useQuery(upkeepSettingsQuery());
  const save = useSaveUpkeepSettings();
  const toast = useToast();
  const [draft, setDraft] = useState<Draft | null>(null);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [formError, setFormError] = useState<string | null>(null);

  if (query.isPending) return <Skeleton className="h-40 w-full" />;
  if (query.isError) return <p className="text-sm text-clay-600">{query.error.message}</p>;
  const current = draft ?? toDraft(query.data.settings);
  const set = (patch: Partial<Draft>) => setDraft({ ...current, ...patch });

  const submit = () => {
    setErrors({});
    setFormError(null);
    const batteryYearsOverride: Partial<Record<DeviceType, number>> = {};
    for (const [type, value] of Object.entries(current.years) as [DeviceType, string][]) if (value.trim() !== '') batteryYearsOverride[type] = num(value);
    save.mutate(
      {
        smokeEndOfLifeYears: num(current.smoke),
        smokeDetectorEndOfLifeYears: num(current.smokeDetector),
        heatEndOfLifeYears: num(current.heat),
        coEndOfLifeYears: num(current.co),
        usableCapacityFraction: num(current.usable),
        soonDays: num(current.soon),
        batteryYearsOverride,
        averageCurrentMicroAmps: query.data.settings.averageCurrentMicroAmps,
      },
      {
        onSuccess: () => {
          toast.success('Device-life settings saved.');
          setDraft(null);
        },
        onError: (err) => {
          if (err instanceof ApiError) {
            setErrors(err.fields);
            setFormError(err.message);
          } else setFormError('Something went wrong. Try again.');
        },
      },
    );
  };

  const field = (id: string, label: string, value: string, onChange: (v: string) => void, hint: string, errorKey: string, inputMode: 'numeric' | 'decimal' = 'numeric') => (
    <div>
      <label htmlFor={id} className="mb-1 block text-sm font-medium">
        {label}
      </label>
      <Input id={id} inputMode={inputMode} value={value} disabled={!canEdit} invalid={!!errors[errorKey]} aria-describedby={`${id}-hint`} onChange={(e) => onChange(e.target.value)} />
      <p id={`${id}-hint`} className={`mt-1 text-xs ${errors[errorKey] ? 'font-medium text-clay-600' : 'text-slate-500'}`}>
        {errors[errorKey] ?? hint}
      </p>
    </div>
  );

  return (
    <Card title="Device life">
      <div className="space-y-5">
        <FormError message={formError} />
        <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
          {field(
            'smoke-years',
            'Household smoke alarm life (UL 217), years',
            current.smoke,
            (v) => set({ smoke: v }),
            `NFPA 72 allows at most ${SMOKE_ALARM_MAX_YEARS} years from the date of manufacture.`,
            'smokeEndOfLifeYears',
          )}
          {field(
            'smoke-detector-years',
            'System smoke detector life (years)',
            current.smokeDetector,
            (v) => set({ smokeDetector: v }),
            'UL 268 detectors on a fire panel. From the date of manufacture; your firm’s own period.',
            'smokeDetectorEndOfLifeYears',
          )}
          {field(
            'heat-years',
            'Heat alarm life (years)',
            current.heat,
            (v) => set({ heat: v }),
            'From the date of manufacture. No fixed code value: your firm’s own period.',
            'heatEndOfLifeYears',
          )}
          {field('co-years', 'CO alarm life (years)', current.co, (v) => set({ co: v }), 'From the date of manufacture. No fixed code value: follow the maker’s label.', 'coEndOfLifeYears')}
          {field(
            'usable-share',
            'Usable share of battery capacity',
            current.usable,
            (v) => set({ usable: v }),
            'Common practice: 0.8. Forecasts use nominal capacity × this share.',
            'usableCapacityFraction',
            'decimal',
          )}
          {field('soon-days', 'Mark as due soon, days ahead', current.soon, (v) => set({ soon: v }), 'Batteries and alarms due within this many days show as “soon”.', 'soonDays')}
        </div>
        <div>
          <p className="text-sm font-medium">Battery life by device type (years)</p>
          <p className="text-xs text-slate-500">Empty: worked out from the battery’s capacity and the device’s average current. Enter years to use your own figure.</p>
          <div className="mt-3 grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
            {BATTERY_DEVICES.map((type) => {
              const key = `batteryYearsOverride.${type}`;
              return (
                <div key={type} className="flex items-center gap-2">
                  <label htmlFor={`years-${type}`} className="w-40 shrink-0 text-sm">
                    {DEVICE_TYPE_LABELS[type]}
                  </label>
                  <div className="flex-1">
                    <Input
                      id={`years-${type}`}
                      inputMode="decimal"
                      placeholder="From battery"
                      disabled={!canEdit}
                      invalid={!!errors[key]}
                      value={current.years[type] ?? ''}
                      onChange={(e) => set({ years: { ...current.years, [type]: e.target.value } })}
                    />
                    {errors[key] && <p className="mt-1 text-xs font-medium text-clay-600">{errors[key]}</p>}
                  </div>
                </div>
              );
            })}
          </div>
        </div>
        <p className="flex gap-2 rounded-md border border-ochre-600/30 bg-ochre-50 px-3 py-2 text-xs text-ink">
          <AlertTriangle className="mt-0.5 size-4 shrink-0 text-ochre-600" aria-hidden="true" />
          <span>{LIFE_SAFETY_CAUTION}</span>
        </p>
        {canEdit && (
          <div className="flex justify-end gap-2">
            {draft && (
              <Button variant="secondary" onClick={() => setDraft(null)}>
                Undo changes
              </Button>
            )}
            <Button onClick={submit} busy={save.isPending} disabled={!draft}>
              Save device life
            </Button>
          </div>
        )}
      </div>
    </Card>
  );
}
