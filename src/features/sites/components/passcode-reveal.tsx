import { useEffect, useState } from 'react';
import { Eye, EyeOff } from 'lucide-react';
import { Button } from '@/components/ui/button';
import { ApiError } from '@/lib/api-client';
import { useRevealPasscode } from '../api/sites-queries';

const SHOW_FOR_MS = 30_000;

/** The verbal passcode stays hidden until asked for; each reveal is logged; it hides again after 30 s. */
export function PasscodeReveal({ siteId, hasPasscode, canReveal }: { siteId: string; hasPasscode: boolean; canReveal: boolean }) {
  const reveal = useRevealPasscode(siteId);
  const [shown, setShown] = useState<string | null>(null);
  useEffect(() => {
    if (!shown) return;
    const timer = window.setTimeout(() => setShown(null), SHOW_FOR_MS);
    return () => window.clearTimeout(timer);
  }, [shown]);

  if (!hasPasscode) return <span className="text-slate-500">None on file</span>;
  return (
    <span className="inline-flex flex-wrap items-center gap-2">
      <span className="font-mono tracking-wider" aria-live="polite">
        {shown ?? '••••••'}
      </span>
      {canReveal &&
        (shown ? (
          <Button variant="ghost" size="sm" onClick={() => setShown(null)}>
            <EyeOff className="size-4" aria-hidden="true" /> Hide
          </Button>
        ) : (
          <Button variant="ghost" size="sm" busy={reveal.isPending} onClick={() => reveal.mutate(undefined, { onSuccess: setShown })}>
            <Eye className="size-4" aria-hidden="true" /> Reveal
          </Button>
        ))}
      {reveal.isError && <span className="text-xs text-clay-600">{reveal.error instanceof ApiError ? reveal.error.message : 'Could not reveal.'}</span>}
      {canReveal && !shown && <span className="text-xs text-slate-500">Each reveal is logged.</span>}
    </span>
  );
}
