import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { serviceRequestSchema, type ServiceRequestInput } from '@domain/schemas/portal';
import { Button } from '@/components/ui/button';
import { FormError, FormField } from '@/components/ui/form-field';
import { Select, Textarea } from '@/components/ui/input';
import { useToast } from '@/components/ui/toast';
import { applyServerErrors } from '@/lib/form-errors';
import type { PortalDevice } from '@/types/api';
import { useRequestService } from '../api/portal-queries';

/** "Ask for a visit": what is wrong, when suits, and (optionally) which device. */
export function ServiceRequestForm({ siteId, devices, firmName }: { siteId: string; devices: readonly PortalDevice[]; firmName: string }) {
  const request = useRequestService(siteId);
  const toast = useToast();
  const [formError, setFormError] = useState<string | null>(null);
  const { register, handleSubmit, setError, reset, formState } = useForm<ServiceRequestInput>({
    resolver: zodResolver(serviceRequestSchema),
    defaultValues: { description: '', preferredTimes: '' },
  });
  const e = formState.errors;

  const onSubmit = handleSubmit((values) => {
    setFormError(null);
    request.mutate(values, {
      onSuccess: () => {
        toast.success(`Request sent. ${firmName} will be in touch to book the visit.`);
        reset();
      },
      onError: (err) => setFormError(applyServerErrors(err, setError, ['description', 'preferredTimes', 'zoneId'])),
    });
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4" aria-label="Ask for a visit">
      <FormError message={formError} />
      <FormField label="What needs attention?" error={e.description?.message} hint="For example: the back door sensor beeps twice when we open it.">
        <Textarea rows={4} {...register('description')} />
      </FormField>
      {devices.length > 0 && (
        <FormField label="Which device? (optional)" error={e.zoneId?.message}>
          <Select className="h-12" {...register('zoneId', { setValueAs: (v: string) => v || undefined })}>
            <option value="">Not sure, or not one device</option>
            {devices.map((d) => (
              <option key={d.id} value={d.id}>
                {d.description} — {d.kind}
              </option>
            ))}
          </Select>
        </FormField>
      )}
      <FormField label="When suits you?" error={e.preferredTimes?.message} hint="Days and times someone is home, for example: weekday mornings, not Fridays.">
        <Textarea rows={2} {...register('preferredTimes')} />
      </FormField>
      <Button type="submit" size="lg" className="w-full sm:w-auto" busy={request.isPending}>
        Send request
      </Button>
    </form>
  );
}
