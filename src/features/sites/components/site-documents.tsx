import { useRef, useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Download, FileText, Trash2, Upload } from 'lucide-react';
import { DOCUMENT_KINDS, DOCUMENT_KIND_LABELS, DOCUMENT_MAX_BYTES, type DocumentKind } from '@domain/schemas/document';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { FormError } from '@/components/ui/form-field';
import { Input, Select } from '@/components/ui/input';
import { Skeleton } from '@/components/ui/skeleton';
import { useToast } from '@/components/ui/toast';
import { ApiError } from '@/lib/api-client';
import { formatDate } from '@/lib/format';
import { documentsQuery, useDeleteDocument, useUpdateDocument, useUploadDocument } from '../api/sites-queries';

function size(bytes: number): string {
  return bytes < 1024 * 1024 ? `${Math.max(1, Math.round(bytes / 1024))} KB` : `${(bytes / 1024 / 1024).toFixed(1)} MB`;
}

/** Permits, contracts, certificates and photos of a site, each shared with the client or kept internal. */
export function SiteDocuments({ siteId, timeZone, canUpload, canEdit }: { siteId: string; timeZone: string; canUpload: boolean; canEdit: boolean }) {
  const documents = useQuery(documentsQuery(siteId));
  const upload = useUploadDocument(siteId);
  const update = useUpdateDocument(siteId);
  const remove = useDeleteDocument(siteId);
  const toast = useToast();
  const fileInput = useRef<HTMLInputElement>(null);
  const [file, setFile] = useState<File | null>(null);
  const [kind, setKind] = useState<DocumentKind>('permit');
  const [title, setTitle] = useState('');
  const [shared, setShared] = useState(false);
  const [progress, setProgress] = useState<number | null>(null);
  const [error, setError] = useState<string | null>(null);

  const send = () => {
    setError(null);
    if (!file) return setError('Choose a file first.');
    if (file.size > DOCUMENT_MAX_BYTES) return setError(`That file is ${size(file.size)}; documents may be at most ${size(DOCUMENT_MAX_BYTES)}.`);
    const form = new FormData();
    form.append('kind', kind);
    form.append('title', title || file.name.replace(/\.[^.]+$/, ''));
    form.append('sharedWithClient', String(shared));
    form.append('file', file);
    setProgress(0);
    upload.mutate(
      { form, onProgress: setProgress },
      {
        onSuccess: () => {
          toast.success('Document uploaded.');
          setFile(null);
          setTitle('');
          if (fileInput.current) fileInput.current.value = '';
        },
        onError: (err) => setError(err instanceof ApiError ? err.message : 'The upload failed. Try again.'),
        onSettled: () => setProgress(null),
      },
    );
  };

  return (
    <Card title="Documents">
      {documents.isPending ? (
        <Skeleton className="h-16 w-full" />
      ) : documents.isError ? (
        <p className="text-sm text-clay-600">{documents.error.message}</p>
      ) : documents.data.length === 0 ? (
        <p className="text-sm text-slate-500">No documents yet: permits, contracts, certificates and photos go here.</p>
      ) : (
        <ul className="divide-y divide-line">
          {documents.data.map((doc) => (
            <li key={doc.id} className="flex flex-col gap-2 py-2 first:pt-0 sm:flex-row sm:items-center sm:justify-between">
              <span className="flex min-w-0 items-start gap-2">
                <FileText className="mt-0.5 size-4 shrink-0 text-slate-500" aria-hidden="true" />
                <span className="min-w-0">
                  <span className="block truncate text-sm font-medium">{doc.title}</span>
                  <span className="block text-xs text-slate-500">
                    {DOCUMENT_KIND_LABELS[doc.kind]} · {size(doc.sizeBytes)} · {formatDate(doc.createdAt, timeZone)}
                  </span>
                </span>
              </span>
              <span className="flex flex-wrap items-center gap-1">
                {doc.sharedWithClient ? <Badge tone="ok">Shared with client</Badge> : <Badge>Internal</Badge>}
                {canEdit && (
                  <Button
                    variant="ghost"
                    size="sm"
                    onClick={() => update.mutate({ id: doc.id, input: { sharedWithClient: !doc.sharedWithClient } }, { onSuccess: () => toast.success(doc.sharedWithClient ? 'Now internal only.' : 'Now shared with the client.') })}
                  >
                    {doc.sharedWithClient ? 'Make internal' : 'Share'}
                  </Button>
                )}
                <a href={`/api/documents/${doc.id}/file`} className="inline-flex h-8 items-center gap-1 rounded-md px-2 text-sm hover:bg-slate-100" aria-label={`Download ${doc.title}`}>
                  <Download className="size-4" aria-hidden="true" />
                </a>
                {canEdit && (
                  <Button variant="ghost" size="sm" className="px-2" aria-label={`Delete ${doc.title}`} onClick={() => remove.mutate(doc.id, { onSuccess: () => toast.success('Document deleted.') })}>
                    <Trash2 className="size-4" aria-hidden="true" />
                  </Button>
                )}
              </span>
            </li>
          ))}
        </ul>
      )}
      {canUpload && (
        <div className="mt-4 space-y-3 border-t border-line pt-4">
          <FormError message={error} />
          <div className="grid gap-2 sm:grid-cols-2">
            <div>
              <label htmlFor={`doc-file-${siteId}`} className="mb-1 block text-xs font-medium">
                File (PDF or image, up to 10 MB)
              </label>
              <input
                ref={fileInput}
                id={`doc-file-${siteId}`}
                type="file"
                accept="application/pdf,image/png,image/jpeg,image/webp"
                onChange={(e) => setFile(e.target.files?.[0] ?? null)}
                className="block w-full text-sm file:mr-3 file:rounded-md file:border file:border-line-strong file:bg-card file:px-3 file:py-1.5 file:text-sm"
              />
            </div>
            <div>
              <label htmlFor={`doc-kind-${siteId}`} className="mb-1 block text-xs font-medium">
                Kind
              </label>
              <Select id={`doc-kind-${siteId}`} value={kind} onChange={(e) => setKind(e.target.value as DocumentKind)}>
                {DOCUMENT_KINDS.map((k) => (
                  <option key={k} value={k}>
                    {DOCUMENT_KIND_LABELS[k]}
                  </option>
                ))}
              </Select>
            </div>
            <div>
              <label htmlFor={`doc-title-${siteId}`} className="mb-1 block text-xs font-medium">
                Title
              </label>
              <Input id={`doc-title-${siteId}`} value={title} placeholder={file?.name ?? 'Like “Permit 2027”'} onChange={(e) => setTitle(e.target.value)} />
            </div>
            <label className="flex items-center gap-2 self-end text-sm">
              <input type="checkbox" className="size-4 accent-brass-600" checked={shared} onChange={(e) => setShared(e.target.checked)} />
              Share with the client
            </label>
          </div>
          {progress !== null && (
            <div className="h-2 w-full overflow-hidden rounded-md bg-slate-100" role="progressbar" aria-label="Upload progress" aria-valuemin={0} aria-valuemax={100} aria-valuenow={Math.round(progress * 100)}>
              <div className="h-full bg-brass-600" style={{ width: `${Math.round(progress * 100)}%` }} />
            </div>
          )}
          <Button variant="secondary" size="sm" onClick={send} busy={upload.isPending}>
            <Upload className="size-4" aria-hidden="true" /> Upload
          </Button>
        </div>
      )}
    </Card>
  );
}
