import { useRef, useState } from 'react';
import { Camera, FileText, Upload } from 'lucide-react';
import { DOCUMENT_MAX_BYTES } from '@domain/schemas/document';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { FormError } from '@/components/ui/form-field';
import { Input } from '@/components/ui/input';
import { useToast } from '@/components/ui/toast';
import { ApiError } from '@/lib/api-client';
import type { ApiJob } from '@/types/api';
import { jobUrls, useUploadJobFile } from '../api/jobs-queries';

function size(bytes: number): string {
  return bytes < 1024 * 1024 ? `${Math.max(1, Math.round(bytes / 1024))} KB` : `${(bytes / 1024 / 1024).toFixed(1)} MB`;
}

/** Photos and files of the job: a thumbnail grid, each shared with the client or internal; uploads show their progress. */
export function JobFiles({ job, canUpload }: { job: ApiJob; canUpload: boolean }) {
  const upload = useUploadJobFile(job.id);
  const toast = useToast();
  const input = useRef<HTMLInputElement>(null);
  const [file, setFile] = useState<File | null>(null);
  const [title, setTitle] = useState('');
  const [shared, setShared] = useState(false);
  const [progress, setProgress] = useState<number | null>(null);
  const [error, setError] = useState<string | null>(null);

  const send = () => {
    setError(null);
    if (!file) return setError('Choose a photo or a PDF first.');
    if (file.size > DOCUMENT_MAX_BYTES)
      return setError(`That file is ${size(file.size)}; a job file may be at most ${size(DOCUMENT_MAX_BYTES)}. Send a smaller photo.`);
    const form = new FormData();
    form.append('title', title.trim() || file.name.replace(/\.[^.]+$/, ''));
    form.append('sharedWithClient', String(shared));
    form.append('file', file);
    setProgress(0);
    upload.mutate(
      { form, onProgress: setProgress },
      {
        onSuccess: () => {
          toast.success(shared ? 'Uploaded and shared with the client.' : 'Uploaded (internal).');
          setFile(null);
          setTitle('');
          if (input.current) input.current.value = '';
        },
        onError: (err) => setError(err instanceof ApiError ? err.message : 'The upload failed. Try again.'),
        onSettled: () => setProgress(null),
      },
    );
  };

  return (
    <Card title="Photos and files">
      {job.files.length === 0 ? (
        <p className="text-sm text-slate-500">
          {canUpload ? 'No photos yet. Photograph the panel, new devices and anything the next visit should see.' : 'No photos or files on this job.'}
        </p>
      ) : (
        <ul className="grid grid-cols-2 gap-3 sm:grid-cols-3">
          {job.files.map((f) => (
            <li key={f.id} className="min-w-0 overflow-hidden rounded-md border border-line">
              <a
                href={f.fileUrl ?? jobUrls.file(f.id)}
                target="_blank"
                rel="noreferrer"
                className="block"
                aria-label={`Open ${f.title || f.originalName}`}
              >
                {f.thumbnailUrl ? (
                  <img src={f.thumbnailUrl} alt="" loading="lazy" className="aspect-[4/3] w-full bg-slate-100 object-cover" />
                ) : (
                  <span className="grid aspect-[4/3] w-full place-items-center bg-paper text-slate-500">
                    <FileText className="size-8" aria-hidden="true" />
                  </span>
                )}
              </a>
              <div className="space-y-1 p-2">
                <p className="truncate text-sm font-medium" title={f.title || f.originalName}>
                  {f.title || f.originalName}
                </p>
                <p className="flex flex-wrap items-center gap-1 text-xs text-slate-500">
                  {f.sharedWithClient ? <Badge tone="ok">Shared with client</Badge> : <Badge>Internal</Badge>}
                  <span>{size(f.sizeBytes)}</span>
                </p>
              </div>
            </li>
          ))}
        </ul>
      )}
      {canUpload && (
        <div className="mt-4 space-y-3 border-t border-line pt-4">
          <FormError message={error} />
          <div>
            <label htmlFor={`job-file-${job.id}`} className="mb-1 block text-sm font-medium">
              Photo or PDF (up to {size(DOCUMENT_MAX_BYTES)})
            </label>
            <input
              ref={input}
              id={`job-file-${job.id}`}
              type="file"
              accept="image/jpeg,image/png,image/webp,application/pdf"
              onChange={(e) => setFile(e.target.files?.[0] ?? null)}
              className="block w-full text-sm file:mr-3 file:h-12 file:rounded-md file:border file:border-line-strong file:bg-card file:px-4 file:text-sm sm:file:h-10"
            />
          </div>
          <div className="grid gap-3 sm:grid-cols-[1fr_auto] sm:items-end">
            <div>
              <label htmlFor={`job-file-title-${job.id}`} className="mb-1 block text-sm font-medium">
                Title
              </label>
              <Input
                id={`job-file-title-${job.id}`}
                value={title}
                maxLength={200}
                placeholder={file?.name ?? 'Like “Panel after install”'}
                onChange={(e) => setTitle(e.target.value)}
              />
            </div>
            <label className="flex min-h-12 items-center gap-3 text-sm sm:min-h-10">
              <input type="checkbox" className="size-6 accent-brass-600" checked={shared} onChange={(e) => setShared(e.target.checked)} />
              Share with the client
            </label>
          </div>
          {progress !== null && (
            <div>
              <div
                className="h-3 w-full overflow-hidden rounded-md bg-slate-100"
                role="progressbar"
                aria-label="Upload progress"
                aria-valuemin={0}
                aria-valuemax={100}
                aria-valuenow={Math.round(progress * 100)}
              >
                <div className="h-full bg-brass-600 transition-[width]" style={{ width: `${Math.round(progress * 100)}%` }} />
              </div>
              <p className="mt-1 text-xs text-slate-500 tabular-nums">Uploading… {Math.round(progress * 100)}%</p>
            </div>
          )}
          <Button size="lg" variant="secondary" className="w-full sm:w-auto" onClick={send} busy={upload.isPending}>
            {file?.type.startsWith('image/') ? <Camera className="size-5" aria-hidden="true" /> : <Upload className="size-5" aria-hidden="true" />}{' '}
            Upload
          </Button>
        </div>
      )}
    </Card>
  );
}
