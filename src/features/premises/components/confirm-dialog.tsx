import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormError } from '@/components/ui/form-field';
import { ApiError } from '@/lib/api-client';

export interface PendingConfirm {
  title: string;
  description: string;
  confirmLabel: string;
  run: () => Promise<unknown>;
  /** after it worked (a toast, focus somewhere sensible) */
  done?: () => void;
}

/** Confirms a delete that takes contents with it (a floor's rooms, a room's openings, a plan's pins). */
export function ConfirmDialog({ pending, onClose }: { pending: PendingConfirm | null; onClose: () => void }) {
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const close = () => {
    setError(null);
    onClose();
  };
  return (
    <Dialog open={pending !== null} onClose={close} title={pending?.title ?? ''} description={pending?.description}>
      <div className="space-y-4">
        <FormError message={error} />
        <div className="flex justify-end gap-2">
          <Button variant="secondary" onClick={close}>
            Cancel
          </Button>
          <Button
            variant="danger"
            busy={busy}
            onClick={async () => {
              if (!pending) return;
              setBusy(true);
              setError(null);
              try {
                await pending.run();
                pending.done?.();
                close();
              } catch (err) {
                setError(err instanceof ApiError ? err.message : 'Something went wrong. Try again.');
              } finally {
                setBusy(false);
              }
            }}
          >
            {pending?.confirmLabel ?? 'Delete'}
          </Button>
        </div>
      </div>
    </Dialog>
  );
}
