import { useMemo, useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { contrastRatio, isHexColour, readableAccent } from '@domain/colour';
import { firmSettingsSchema, type FirmSettingsInput } from '@domain/schemas/firm';
import { timeZoneOptions } from '@domain/time-zones';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { FormError, FormField } from '@/components/ui/form-field';
import { Input, Select } from '@/components/ui/input';
import { useToast } from '@/components/ui/toast';
import { applyServerErrors } from '@/lib/form-errors';
import type { ApiFirm } from '@/types/api';
import { useUpdateFirm } from '../api/firm-queries';

const FIELDS = ['name', 'shortName', 'phone', 'timeZone', 'licenceNumber', 'monitoringCenterName', 'monitoringCenterPhone', 'accentColor'] as const;

export function FirmSettingsForm({ firm }: { firm: ApiFirm }) {
  const update = useUpdateFirm();
  const toast = useToast();
  const zones = useMemo(() => timeZoneOptions(), []);
  const [formError, setFormError] = useState<string | null>(null);
  const { register, handleSubmit, setError, formState, watch, setValue, reset } = useForm<FirmSettingsInput>({
    resolver: zodResolver(firmSettingsSchema),
    defaultValues: {
      name: firm.name,
      shortName: firm.shortName,
      timeZone: firm.timeZone,
      licenceNumber: firm.licenceNumber ?? '',
      monitoringCenterName: firm.monitoringCenterName,
      monitoringCenterPhone: firm.monitoringCenterPhone,
      phone: firm.phone ?? '',
      accentColor: firm.accentColor,
    },
  });
  const accent = watch('accentColor');
  const validAccent = isHexColour(accent ?? '');
  const shown = validAccent ? readableAccent(accent) : '#8f5c17';
  const darkened = validAccent && shown.toLowerCase() !== accent.toLowerCase();

  const onSubmit = handleSubmit((values) => {
    setFormError(null);
    update.mutate(values, {
      onSuccess: (saved) => {
        toast.success('Firm settings saved.');
        reset({ ...values, shortName: saved.shortName });
      },
      onError: (err) => setFormError(applyServerErrors(err, setError, FIELDS)),
    });
  });
  const e = formState.errors;

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-6">
      <FormError message={formError} />
      <Card title="Firm">
        <div className="grid gap-4 sm:grid-cols-2">
          <FormField label="Firm name" error={e.name?.message}>
            <Input autoComplete="organization" {...register('name')} />
          </FormField>
          <FormField label="Office phone" error={e.phone?.message} hint="Shown to your clients in the portal.">
            <Input type="tel" inputMode="tel" autoComplete="tel" {...register('phone')} />
          </FormField>
          <FormField label="Licence number" error={e.licenceNumber?.message} hint="Your state or local alarm licence, printed on certificates.">
            <Input {...register('licenceNumber')} />
          </FormField>
          <FormField label="Time zone" error={e.timeZone?.message} hint="Visits are shown in this zone unless a site has its own.">
            <Select {...register('timeZone')}>
              {zones.map((z) => (
                <option key={z} value={z}>
                  {z.replace(/_/g, ' ')}
                </option>
              ))}
            </Select>
          </FormField>
        </div>
      </Card>

      <Card title="Monitoring center">
        <div className="grid gap-4 sm:grid-cols-2">
          <FormField label="Name" error={e.monitoringCenterName?.message}>
            <Input {...register('monitoringCenterName')} />
          </FormField>
          <FormField label="Phone" error={e.monitoringCenterPhone?.message}>
            <Input type="tel" inputMode="tel" {...register('monitoringCenterPhone')} />
          </FormField>
        </div>
      </Card>

      <Card title="Client portal">
        <div className="grid gap-4 sm:grid-cols-2">
          <FormField label="Short name" error={e.shortName?.message} hint="Used in your portal’s address. Lowercase letters, digits and hyphens.">
            <Input autoCapitalize="none" spellCheck={false} className="font-mono" {...register('shortName')} />
          </FormField>
          <FormField label="Accent colour" error={e.accentColor?.message} hint="Buttons and the header of your clients’ portal.">
            <div className="flex items-center gap-2">
              <input
                type="color"
                aria-label="Pick the accent colour"
                value={validAccent ? accent : '#8f5c17'}
                onChange={(ev) => setValue('accentColor', ev.target.value, { shouldDirty: true, shouldValidate: true })}
                className="h-10 w-12 cursor-pointer rounded-md border border-line-strong bg-card p-1"
              />
              <Input className="font-mono" spellCheck={false} {...register('accentColor')} />
            </div>
          </FormField>
        </div>
        <div className="mt-4 flex flex-wrap items-center gap-3 text-sm">
          <span className="inline-flex h-10 items-center rounded-md px-4 font-medium text-white" style={{ backgroundColor: shown }}>
            Request service
          </span>
          <span className="text-slate-500">
            {validAccent
              ? darkened
                ? `Darkened to ${shown} so white text stays readable (contrast ${contrastRatio(shown, '#ffffff').toFixed(1)}:1).`
                : `Readable: contrast ${contrastRatio(shown, '#ffffff').toFixed(1)}:1 with white text.`
              : 'Enter a colour as #rrggbb.'}
          </span>
        </div>
      </Card>

      <div className="flex justify-end">
        <Button type="submit" busy={update.isPending} disabled={!formState.isDirty}>
          Save settings
        </Button>
      </div>
    </form>
  );
}
