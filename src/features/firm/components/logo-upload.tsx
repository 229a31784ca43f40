import { useRef, useState } from 'react';
import { ImageUp, Trash2 } from 'lucide-react';
import { LIMITS } from '@domain/limits';
import { Button } from '@/components/ui/button';
import { useToast } from '@/components/ui/toast';
import { ApiError } from '@/lib/api-client';
import type { ApiFirm } from '@/types/api';
import { useRemoveLogo, useUploadLogo } from '../api/firm-queries';

/** Logo for the client portal and documents: PNG, JPEG or WebP up to 1 MB, with upload progress. */
export function LogoUpload({ firm }: { firm: ApiFirm }) {
  const input = useRef<HTMLInputElement>(null);
  const [progress, setProgress] = useState<number | null>(null);
  const [error, setError] = useState<string | null>(null);
  const upload = useUploadLogo();
  const remove = useRemoveLogo();
  const toast = useToast();

  const onFile = (file: File | undefined) => {
    setError(null);
    if (!file) return;
    if (file.size > LIMITS.logoMaxBytes) {
      setError(`That file is ${(file.size / 1024 / 1024).toFixed(1)} MB; a logo may be at most 1 MB.`);
      return;
    }
    setProgress(0);
    upload.mutate(
      { file, onProgress: setProgress },
      {
        onSuccess: () => toast.success('Logo updated.'),
        onError: (e) => setError(e instanceof ApiError ? e.message : 'The upload failed. Try again.'),
        onSettled: () => {
          setProgress(null);
          if (input.current) input.current.value = '';
        },
      },
    );
  };

  return (
    <div className="flex flex-col gap-4 sm:flex-row sm:items-center">
      <div className="flex size-24 shrink-0 items-center justify-center overflow-hidden rounded-md border border-line bg-paper">
        {firm.logoUrl ? <img src={firm.logoUrl} alt={`${firm.name} logo`} className="max-h-full max-w-full object-contain" /> : <span className="px-2 text-center text-xs text-slate-500">No logo yet</span>}
      </div>
      <div className="flex-1 space-y-2">
        <input ref={input} id="logo-file" type="file" accept="image/png,image/jpeg,image/webp" className="sr-only" onChange={(e) => onFile(e.target.files?.[0])} />
        <div className="flex flex-wrap gap-2">
          <Button variant="secondary" onClick={() => input.current?.click()} busy={upload.isPending}>
            <ImageUp className="size-4" aria-hidden="true" /> {firm.logoUrl ? 'Replace logo' : 'Upload logo'}
          </Button>
          {firm.logoUrl && (
            <Button variant="ghost" onClick={() => remove.mutate(undefined, { onSuccess: () => toast.success('Logo removed.') })} busy={remove.isPending}>
              <Trash2 className="size-4" aria-hidden="true" /> Remove
            </Button>
          )}
        </div>
        <p className="text-xs text-slate-500">PNG, JPEG or WebP, up to 1 MB. Shown in your clients’ portal.</p>
        {progress !== null && (
          <div className="h-2 w-full max-w-xs overflow-hidden rounded-md bg-slate-100" role="progressbar" aria-label="Upload progress" aria-valuemin={0} aria-valuemax={100} aria-valuenow={Math.round(progress * 100)}>
            <div className="h-full bg-brass-600 transition-[width]" style={{ width: `${Math.round(progress * 100)}%` }} />
          </div>
        )}
        {error && (
          <p role="alert" className="text-xs font-medium text-clay-600">
            {error}
          </p>
        )}
      </div>
    </div>
  );
}
