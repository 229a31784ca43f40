import { useEffect, useMemo, useRef, useState } from 'react';
import { useController, useForm, type Control } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { siteSchema, type SiteInput, type SiteValues } from '@domain/schemas/site';
import { timeZoneOptions } from '@domain/time-zones';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { FormError, FormField } from '@/components/ui/form-field';
import { Input, Select, Textarea } from '@/components/ui/input';
import { MoneyInput } from '@/components/ui/money-input';
import { applyServerErrors } from '@/lib/form-errors';
import type { ApiSite } from '@/types/api';

const FIELDS = [
  'name',
  'timeZone',
  'latitude',
  'longitude',
  'monitoringAccount',
  'accessNotes',
  'passcode',
  'address.line1',
  'address.line2',
  'address.city',
  'address.region',
  'address.postalCode',
  'address.country',
  'permit.number',
  'permit.authority',
  'permit.expiresOn',
  'contract.startsOn',
  'contract.termMonths',
  'contract.monthlyFeeCents',
  'contract.cancelledOn',
  'contract.cancelReason',
] as const;

/** The monthly fee: dollars on screen, cents in the form (receives id/aria from FormField). */
function FeeInput({ control, ...aria }: { control: Control<SiteInput, unknown, SiteValues>; id?: string; invalid?: boolean; 'aria-describedby'?: string }) {
  const { field } = useController({ control, name: 'contract.monthlyFeeCents' });
  return <MoneyInput value={field.value} onChange={field.onChange} onBlur={field.onBlur} {...aria} />;
}

const numberOrNull = (v: unknown) => (v === '' || v === null || v === undefined ? null : Number(v));

export interface SiteFormProps {
  clientId: string;
  site?: ApiSite;
  defaultTimeZone: string;
  busy: boolean;
  submitLabel: string;
  onSubmit: (values: SiteValues, helpers: { fail: (err: unknown) => void }) => void;
  onCancel: () => void;
}

/** The site record: address, monitoring, passcode, access notes, permit and contract. */
export function SiteForm({ clientId, site, defaultTimeZone, busy, submitLabel, onSubmit, onCancel }: SiteFormProps) {
  const zones = useMemo(() => timeZoneOptions(), []);
  const [formError, setFormError] = useState<string | null>(null);
  const formErrorRef = useRef<HTMLDivElement>(null);
  const [clearPasscode, setClearPasscode] = useState(false);
  const { register, handleSubmit, setError, formState, control } = useForm<SiteInput, unknown, SiteValues>({
    resolver: zodResolver(siteSchema),
    defaultValues: {
      clientId,
      name: site?.name ?? 'Home',
      address: site?.address ?? { line1: '', line2: '', city: '', region: '', postalCode: '', country: 'US' },
      timeZone: site?.timeZone ?? defaultTimeZone,
      latitude: site?.latitude ?? null,
      longitude: site?.longitude ?? null,
      monitoringAccount: site?.monitoringAccount ?? '',
      accessNotes: site?.accessNotes ?? '',
      permit: site?.permit ?? { number: '', authority: '', expiresOn: null },
      contract: site?.contract ?? { startsOn: null, termMonths: null, monthlyFeeCents: null, cancelledOn: null, cancelReason: '' },
      passcode: undefined,
    },
  });
  const e = formState.errors;

  // The submit button sits at the end of a long form: bring a message for the whole form
  // (a refusal such as the plan's site limit or a read-only firm) into view where it shows.
  useEffect(() => {
    const el = formErrorRef.current;
    if (formError && el && typeof el.scrollIntoView === 'function') el.scrollIntoView({ behavior: 'smooth', block: 'center' });
  }, [formError]);

  const submit = handleSubmit((values) => {
    setFormError(null);
    const passcode = clearPasscode ? null : values.passcode ? values.passcode : undefined;
    onSubmit({ ...values, passcode }, { fail: (err) => setFormError(applyServerErrors(err, setError, FIELDS)) });
  });

  return (
    <form onSubmit={submit} noValidate className="space-y-6">
      <div ref={formErrorRef} className="empty:hidden">
        <FormError message={formError} />
      </div>
      <Card title="Site">
        <div className="grid gap-4 sm:grid-cols-2">
          <FormField label="Site name" error={e.name?.message} hint="How the household calls it: “Home”, “Lake house”.">
            <Input {...register('name')} />
          </FormField>
          <FormField label="Time zone" error={e.timeZone?.message}>
            <Select {...register('timeZone')}>
              {zones.map((z) => (
                <option key={z} value={z}>
                  {z.replace(/_/g, ' ')}
                </option>
              ))}
            </Select>
          </FormField>
          <FormField label="Street address" error={e.address?.line1?.message} className="sm:col-span-2">
            <Input autoComplete="off" {...register('address.line1')} />
          </FormField>
          <FormField label="Apartment, unit (optional)" error={e.address?.line2?.message} className="sm:col-span-2">
            <Input autoComplete="off" {...register('address.line2')} />
          </FormField>
          <FormField label="City" error={e.address?.city?.message}>
            <Input autoComplete="off" {...register('address.city')} />
          </FormField>
          <FormField label="State or region" error={e.address?.region?.message}>
            <Input autoComplete="off" {...register('address.region')} />
          </FormField>
          <FormField label="Postal code" error={e.address?.postalCode?.message}>
            <Input autoComplete="off" {...register('address.postalCode')} />
          </FormField>
          <FormField label="Country" error={e.address?.country?.message} hint="Two letters, like US.">
            <Input maxLength={2} className="uppercase" {...register('address.country')} />
          </FormField>
          <FormField label="Latitude (optional)" error={e.latitude?.message}>
            <Input inputMode="decimal" {...register('latitude', { setValueAs: numberOrNull })} />
          </FormField>
          <FormField label="Longitude (optional)" error={e.longitude?.message} hint="Used to order a day’s visits by distance.">
            <Input inputMode="decimal" {...register('longitude', { setValueAs: numberOrNull })} />
          </FormField>
        </div>
      </Card>

      <Card title="Monitoring">
        <div className="grid gap-4 sm:grid-cols-2">
          <FormField label="Monitoring account number" error={e.monitoringAccount?.message}>
            <Input className="font-mono uppercase" autoComplete="off" spellCheck={false} {...register('monitoringAccount')} />
          </FormField>
          <FormField
            label={site?.hasPasscode ? 'New verbal passcode' : 'Verbal passcode'}
            error={e.passcode?.message}
            hint={site?.hasPasscode ? 'A passcode is on file. Leave empty to keep it.' : 'Encrypted; staff reveal it when they need it, and each reveal is logged.'}
          >
            <Input type="password" autoComplete="new-password" disabled={clearPasscode} {...register('passcode', { setValueAs: (v: string) => (v === '' ? undefined : v) })} />
          </FormField>
          {site?.hasPasscode && (
            <label className="flex items-center gap-2 text-sm sm:col-span-2">
              <input type="checkbox" className="size-4 accent-brass-600" checked={clearPasscode} onChange={(ev) => setClearPasscode(ev.target.checked)} />
              Remove the passcode on file
            </label>
          )}
          <FormField label="Access notes" error={e.accessNotes?.message} hint="Keys, gate codes, pets, parking. Staff only." className="sm:col-span-2">
            <Textarea rows={3} {...register('accessNotes')} />
          </FormField>
        </div>
      </Card>

      <Card title="Alarm permit">
        <div className="grid gap-4 sm:grid-cols-3">
          <FormField label="Permit number" error={e.permit?.number?.message}>
            <Input className="font-mono" {...register('permit.number')} />
          </FormField>
          <FormField label="Issued by" error={e.permit?.authority?.message}>
            <Input {...register('permit.authority')} />
          </FormField>
          <FormField label="Expires on" error={e.permit?.expiresOn?.message}>
            <Input type="date" {...register('permit.expiresOn', { setValueAs: (v: string) => v || null })} />
          </FormField>
        </div>
      </Card>

      <Card title="Monitoring contract">
        <div className="grid gap-4 sm:grid-cols-3">
          <FormField label="Starts on" error={e.contract?.startsOn?.message}>
            <Input type="date" {...register('contract.startsOn', { setValueAs: (v: string) => v || null })} />
          </FormField>
          <FormField label="Term (months)" error={e.contract?.termMonths?.message}>
            <Input inputMode="numeric" {...register('contract.termMonths', { setValueAs: numberOrNull })} />
          </FormField>
          <FormField label="Monthly fee" error={e.contract?.monthlyFeeCents?.message}>
            <FeeInput control={control} />
          </FormField>
          <FormField label="Cancelled on" error={e.contract?.cancelledOn?.message}>
            <Input type="date" {...register('contract.cancelledOn', { setValueAs: (v: string) => v || null })} />
          </FormField>
          <FormField label="Reason for cancelling" error={e.contract?.cancelReason?.message} className="sm:col-span-2">
            <Input {...register('contract.cancelReason')} />
          </FormField>
        </div>
      </Card>

      <div className="flex justify-end gap-2">
        <Button variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
        <Button type="submit" busy={busy}>
          {submitLabel}
        </Button>
      </div>
    </form>
  );
}
