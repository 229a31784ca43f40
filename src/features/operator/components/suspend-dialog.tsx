import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { operatorActionSchema } from '@domain/schemas/firm';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormError, FormField } from '@/components/ui/form-field';
import { Textarea } from '@/components/ui/input';
import { useToast } from '@/components/ui/toast';
import { applyServerErrors } from '@/lib/form-errors';
import { useSetSuspended } from '../api/operator-queries';

export function SuspendDialog({ tenantId, firmName, suspend, open, onClose }: { tenantId: string; firmName: string; suspend: boolean; open: boolean; onClose: () => void }) {
  const mutation = useSetSuspended(tenantId);
  const toast = useToast();
  const [formError, setFormError] = useState<string | null>(null);
  const { register, handleSubmit, setError, formState, reset } = useForm<{ reason: string }>({
    resolver: zodResolver(operatorActionSchema),
    defaultValues: { reason: '' },
  });
  const close = () => {
    reset();
    setFormError(null);
    onClose();
  };
  const onSubmit = handleSubmit(({ reason }) => {
    mutation.mutate(
      { suspend, reason },
      {
        onSuccess: () => {
          toast.success(suspend ? `${firmName} is suspended.` : `${firmName} is restored.`);
          close();
        },
        onError: (err) => setFormError(applyServerErrors(err, setError, ['reason'])),
      },
    );
  });
  return (
    <Dialog
      open={open}
      onClose={close}
      title={suspend ? `Suspend ${firmName}?` : `Restore ${firmName}?`}
      description={
        suspend
          ? 'Its people are signed out at once and cannot sign in, and its clients lose portal access. Nothing is deleted; restoring brings everything back.'
          : 'Its people can sign in again, and the firm returns to the state it had before the suspension.'
      }
    >
      <form onSubmit={onSubmit} noValidate className="space-y-4">
        <FormError message={formError} />
        <FormField label="Reason (kept in the audit log)" error={formState.errors.reason?.message}>
          <Textarea rows={3} {...register('reason')} />
        </FormField>
        <div className="flex justify-end gap-2">
          <Button variant="secondary" onClick={close}>
            Cancel
          </Button>
          <Button type="submit" variant={suspend ? 'danger' : 'primary'} busy={mutation.isPending}>
            {suspend ? 'Suspend firm' : 'Restore firm'}
          </Button>
        </div>
      </form>
    </Dialog>
  );
}
