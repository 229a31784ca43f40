import { useState } from 'react';
import { UserCog, UserCheck, UserX } from 'lucide-react';
import { INVITABLE_STAFF_ROLES, ROLE_LABELS, type InvitableStaffRole } from '@domain/roles';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormError, FormField } from '@/components/ui/form-field';
import { Select } from '@/components/ui/input';
import { useToast } from '@/components/ui/toast';
import { ApiError } from '@/lib/api-client';
import type { ApiUser } from '@/types/api';
import { useUpdateStaff } from '../api/staff-mutations';

/** Change role / deactivate / reactivate one colleague (owner only; never the owner). */
export function StaffMemberActions({ member }: { member: ApiUser }) {
  const [open, setOpen] = useState<'role' | 'active' | null>(null);
  const [role, setRole] = useState<InvitableStaffRole>(member.role === 'coordinator' ? 'coordinator' : 'technician');
  const [error, setError] = useState<string | null>(null);
  const update = useUpdateStaff();
  const toast = useToast();
  if (member.role === 'owner') return <span className="hidden text-xs text-slate-500 sm:inline">Firm owner</span>;

  const close = () => {
    setOpen(null);
    setError(null);
  };
  const run = (input: { role?: InvitableStaffRole; active?: boolean }, done: string) =>
    update.mutate(
      { userId: member.id, input },
      {
        onSuccess: () => {
          toast.success(done);
          close();
        },
        onError: (e) => setError(e instanceof ApiError ? e.message : 'Something went wrong. Try again.'),
      },
    );

  return (
    <div className="flex justify-end gap-0.5 sm:gap-1">
      {member.active && (
        <Button variant="ghost" size="sm" onClick={() => setOpen('role')} aria-label={`Change role of ${member.name}`} title="Change role" className="px-2 sm:px-3">
          <UserCog className="size-4 sm:hidden" aria-hidden="true" />
          <span className="hidden sm:inline">Change role</span>
        </Button>
      )}
      <Button
        variant="ghost"
        size="sm"
        onClick={() => setOpen('active')}
        aria-label={`${member.active ? 'Deactivate' : 'Reactivate'} ${member.name}`}
        title={member.active ? 'Deactivate' : 'Reactivate'}
        className="px-2 sm:px-3"
      >
        {member.active ? <UserX className="size-4 sm:hidden" aria-hidden="true" /> : <UserCheck className="size-4 sm:hidden" aria-hidden="true" />}
        <span className="hidden sm:inline">{member.active ? 'Deactivate' : 'Reactivate'}</span>
      </Button>

      <Dialog open={open === 'role'} onClose={close} title={`Change ${member.name}’s role`} description="The new role applies from their next click; they stay signed in.">
        <div className="space-y-4">
          <FormError message={error} />
          <FormField label="Role">
            <Select value={role} onChange={(e) => setRole(e.target.value as InvitableStaffRole)}>
              {INVITABLE_STAFF_ROLES.map((r) => (
                <option key={r} value={r}>
                  {ROLE_LABELS[r]}
                </option>
              ))}
            </Select>
          </FormField>
          <div className="flex justify-end gap-2">
            <Button variant="secondary" onClick={close}>
              Cancel
            </Button>
            <Button busy={update.isPending} disabled={role === member.role} onClick={() => run({ role }, `${member.name} is now ${ROLE_LABELS[role].toLowerCase()}.`)}>
              Save role
            </Button>
          </div>
        </div>
      </Dialog>

      <Dialog
        open={open === 'active'}
        onClose={close}
        title={member.active ? `Deactivate ${member.name}?` : `Reactivate ${member.name}?`}
        description={
          member.active
            ? 'They are signed out at once and can no longer sign in. Everything they recorded stays.'
            : 'They can sign in again with their existing password, with the role they had.'
        }
      >
        <div className="space-y-4">
          <FormError message={error} />
          <div className="flex justify-end gap-2">
            <Button variant="secondary" onClick={close}>
              Cancel
            </Button>
            <Button
              variant={member.active ? 'danger' : 'primary'}
              busy={update.isPending}
              onClick={() => run({ active: !member.active }, member.active ? `${member.name} is deactivated.` : `${member.name} can sign in again.`)}
            >
              {member.active ? 'Deactivate' : 'Reactivate'}
            </Button>
          </div>
        </div>
      </Dialog>
    </div>
  );
}
