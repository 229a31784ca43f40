import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormError } from '@/components/ui/form-field';
import { useToast } from '@/components/ui/toast';
import { ApiError } from '@/lib/api-client';
import type { ApiZone } from '@/types/api';
import { useDeleteZone } from '../api/zone-queries';

/** Confirms taking a zone off the panel; the change log keeps the record. */
export function RemoveZoneDialog({ panelId, zone, onClose }: { panelId: string; zone: ApiZone | null; onClose: () => void }) {
  const remove = useDeleteZone(panelId);
  const toast = useToast();
  const [error, setError] = useState<string | null>(null);
  const close = () => {
    setError(null);
    onClose();
  };
  return (
    <Dialog
      open={zone !== null}
      onClose={close}
      title={zone ? `Remove zone ${zone.number}, “${zone.description}”?` : 'Remove zone'}
      description="The zone leaves this panel’s list and its number and serial become free. The change log keeps a record, and the panel is marked as changed since last programmed."
    >
      <div className="space-y-4">
        <FormError message={error} />
        <div className="flex justify-end gap-2">
          <Button variant="secondary" onClick={close}>
            Cancel
          </Button>
          <Button
            variant="danger"
            busy={remove.isPending}
            onClick={() => {
              if (!zone) return;
              remove.mutate(zone.id, {
                onSuccess: () => {
                  toast.success(`Zone ${zone.number} removed.`);
                  close();
                },
                onError: (e) => setError(e instanceof ApiError ? e.message : 'Something went wrong. Try again.'),
              });
            }}
          >
            Remove zone
          </Button>
        </div>
      </div>
    </Dialog>
  );
}
