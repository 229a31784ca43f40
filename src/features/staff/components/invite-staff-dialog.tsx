import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { INVITABLE_STAFF_ROLES, ROLE_DESCRIPTIONS, ROLE_LABELS } from '@domain/roles';
import { staffInvitationSchema, type StaffInvitationInput } from '@domain/schemas/staff';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormError, FormField } from '@/components/ui/form-field';
import { Input, Select } from '@/components/ui/input';
import { useToast } from '@/components/ui/toast';
import { applyServerErrors } from '@/lib/form-errors';
import { useInviteStaff } from '../api/staff-mutations';

export function InviteStaffDialog({ open, onClose }: { open: boolean; onClose: () => void }) {
  const invite = useInviteStaff();
  const toast = useToast();
  const [formError, setFormError] = useState<string | null>(null);
  const { register, handleSubmit, setError, formState, reset, watch } = useForm<StaffInvitationInput>({
    resolver: zodResolver(staffInvitationSchema),
    defaultValues: { email: '', role: 'technician' },
  });
  const role = watch('role');
  const close = () => {
    reset();
    setFormError(null);
    onClose();
  };
  const onSubmit = handleSubmit((values) => {
    setFormError(null);
    invite.mutate(values, {
      onSuccess: (inv) => {
        toast.success(`Invitation sent to ${inv.email}.`);
        close();
      },
      onError: (err) => setFormError(applyServerErrors(err, setError, ['email', 'role'])),
    });
  });
  return (
    <Dialog open={open} onClose={close} title="Invite a colleague" description="They get an e-mail with a link to choose their name and password. The link works once, for 7 days.">
      <form onSubmit={onSubmit} noValidate className="space-y-4">
        <FormError message={formError} />
        <FormField label="E-mail" error={formState.errors.email?.message}>
          <Input type="email" inputMode="email" autoComplete="off" {...register('email')} />
        </FormField>
        <FormField label="Role" error={formState.errors.role?.message} hint={role ? ROLE_DESCRIPTIONS[role] : undefined}>
          <Select {...register('role')}>
            {INVITABLE_STAFF_ROLES.map((r) => (
              <option key={r} value={r}>
                {ROLE_LABELS[r]}
              </option>
            ))}
          </Select>
        </FormField>
        <div className="flex justify-end gap-2 pt-2">
          <Button variant="secondary" onClick={close}>
            Cancel
          </Button>
          <Button type="submit" busy={invite.isPending}>
            Send invitation
          </Button>
        </div>
      </form>
    </Dialog>
  );
}
