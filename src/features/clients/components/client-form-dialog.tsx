import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { clientSchema, type ClientInput, type ClientValues } from '@domain/schemas/client';
import { formatPhone } from '@domain/phone';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormError, FormField } from '@/components/ui/form-field';
import { Input, Select, Textarea } from '@/components/ui/input';
import { useToast } from '@/components/ui/toast';
import { applyServerErrors } from '@/lib/form-errors';
import type { ApiClient } from '@/types/api';
import { useCreateClient, useUpdateClient } from '../api/clients-queries';

const FIELDS = ['name', 'email', 'phone', 'altPhone', 'notes', 'status'] as const;

/** Create a client, or edit one when `client` is given. */
export function ClientFormDialog({ open, onClose, client, onSaved }: { open: boolean; onClose: () => void; client?: ApiClient; onSaved?: (client: ApiClient) => void }) {
  const create = useCreateClient();
  const update = useUpdateClient(client?.id ?? '');
  const toast = useToast();
  const [formError, setFormError] = useState<string | null>(null);
  const { register, handleSubmit, setError, formState, reset } = useForm<ClientInput, unknown, ClientValues>({
    resolver: zodResolver(clientSchema),
    values: {
      name: client?.name ?? '',
      email: client?.email ?? '',
      phone: client?.phone ? formatPhone(client.phone) : '',
      altPhone: client?.altPhone ? formatPhone(client.altPhone) : '',
      notes: client?.notes ?? '',
      status: client?.status ?? 'active',
    },
  });
  const close = () => {
    reset();
    setFormError(null);
    onClose();
  };
  const mutation = client ? update : create;
  const onSubmit = handleSubmit((values) => {
    setFormError(null);
    mutation.mutate(values, {
      onSuccess: (saved) => {
        toast.success(client ? 'Client saved.' : `${saved.name} added.`);
        onSaved?.(saved);
        close();
      },
      onError: (err) => setFormError(applyServerErrors(err, setError, FIELDS)),
    });
  });
  const e = formState.errors;
  return (
    <Dialog open={open} onClose={close} title={client ? `Edit ${client.name}` : 'New client'} description={client ? undefined : 'The household or business you look after. Add their sites next.'}>
      <form onSubmit={onSubmit} noValidate className="space-y-4">
        <FormError message={formError} />
        <FormField label="Name" error={e.name?.message} hint="As the household wants to be addressed, like “Maren and Joel Osk”.">
          <Input autoComplete="off" {...register('name')} />
        </FormField>
        <FormField label="E-mail" error={e.email?.message}>
          <Input type="email" inputMode="email" autoComplete="off" {...register('email')} />
        </FormField>
        <div className="grid gap-4 sm:grid-cols-2">
          <FormField label="Phone" error={e.phone?.message}>
            <Input type="tel" inputMode="tel" autoComplete="off" {...register('phone')} />
          </FormField>
          <FormField label="Other phone" error={e.altPhone?.message}>
            <Input type="tel" inputMode="tel" autoComplete="off" {...register('altPhone')} />
          </FormField>
        </div>
        <FormField label="Internal notes" error={e.notes?.message} hint="Staff only; never shown to the client.">
          <Textarea rows={3} {...register('notes')} />
        </FormField>
        {client && (
          <FormField label="Status" error={e.status?.message}>
            <Select {...register('status')}>
              <option value="active">Active</option>
              <option value="cancelled">Cancelled</option>
            </Select>
          </FormField>
        )}
        <div className="flex justify-end gap-2 pt-2">
          <Button variant="secondary" onClick={close}>
            Cancel
          </Button>
          <Button type="submit" busy={mutation.isPending}>
            {client ? 'Save client' : 'Add client'}
          </Button>
        </div>
      </form>
    </Dialog>
  );
}
