import { useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { Download } from 'lucide-react';
import { EmptyState } from '@/components/ui/empty-state';
import { useSession } from '@/lib/auth';
import { formatDate } from '@/lib/format';
import { portalDocumentsQuery, portalSitesQuery } from '@/features/portal/api/portal-queries';
import { PortalTitle } from '@/features/portal/components/portal-parts';

export async function loader(queryClient: QueryClient, { params }: LoaderFunctionArgs) {
  await Promise.all([queryClient.ensureQueryData(portalDocumentsQuery(params.siteId ?? '')), queryClient.ensureQueryData(portalSitesQuery())]);
  return null;
}

function size(bytes: number): string {
  if (bytes < 1024) return `${bytes} B`;
  if (bytes < 1024 * 1024) return `${Math.round(bytes / 1024)} KB`;
  return `${(bytes / (1024 * 1024)).toFixed(1)} MB`;
}

/** The papers the firm shared: permits, contracts, certificates, visit reports and photos. */
export default function PortalDocumentsPage() {
  const { siteId = '' } = useParams();
  const { tenant } = useSession();
  const { data } = useSuspenseQuery(portalDocumentsQuery(siteId));
  const { data: sites } = useSuspenseQuery(portalSitesQuery());
  const timeZone = sites.find((s) => s.id === siteId)?.timeZone;
  return (
    <>
      <PortalTitle title="Documents" context={`What ${tenant?.name ?? 'your alarm firm'} has shared with you about this home.`} />
      {data.length === 0 ? (
        <EmptyState title="Nothing shared yet">Permits, certificates and visit reports appear here once your firm shares them.</EmptyState>
      ) : (
        <ul className="divide-y divide-line rounded-md border border-line bg-card" aria-label="Shared documents">
          {data.map((doc) => (
            <li key={doc.id}>
              <a href={doc.fileUrl} className="flex min-h-16 items-center justify-between gap-3 px-4 py-3 hover:bg-paper">
                <span className="min-w-0">
                  <span className="block font-medium break-words text-ink">{doc.title || doc.kindLabel}</span>
                  <span className="block text-sm text-slate-500">
                    {doc.kindLabel}
                    {doc.visit ? ` · ${doc.visit.kindLabel}${doc.visit.on ? `, ${formatDate(doc.visit.on, timeZone)}` : ''}` : ` · ${formatDate(doc.createdAt, timeZone)}`} · {size(doc.sizeBytes)}
                  </span>
                </span>
                <span className="flex shrink-0 items-center gap-1 text-sm font-medium text-brass-700">
                  <Download className="size-4" aria-hidden="true" /> Download
                </span>
              </a>
            </li>
          ))}
        </ul>
      )}
    </>
  );
}
