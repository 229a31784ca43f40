import { useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { Link, useNavigate, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { ArrowLeft } from 'lucide-react';
import { paths } from '@/config/paths';
import { PageHeader } from '@/components/ui/page-header';
import { useToast } from '@/components/ui/toast';
import { useSession } from '@/lib/auth';
import { siteQuery, useUpdateSite } from '@/features/sites/api/sites-queries';
import { SiteForm } from '@/features/sites/components/site-form';

export function loader(queryClient: QueryClient, { params }: LoaderFunctionArgs) {
  return queryClient.ensureQueryData(siteQuery(params.siteId ?? ''));
}

export default function EditSitePage() {
  const { siteId = '' } = useParams();
  const { data: site } = useSuspenseQuery(siteQuery(siteId));
  const { tenant } = useSession();
  const update = useUpdateSite(siteId);
  const navigate = useNavigate();
  const toast = useToast();
  return (
    <>
      <Link to={paths.firm.site(siteId)} className="mb-4 inline-flex items-center gap-1 text-sm text-slate-500 hover:text-ink">
        <ArrowLeft className="size-4" aria-hidden="true" /> {site.name}
      </Link>
      <PageHeader title={`Edit ${site.name}`} context={site.clientName} />
      <SiteForm
        clientId={site.clientId}
        site={site}
        defaultTimeZone={tenant?.timeZone ?? 'UTC'}
        busy={update.isPending}
        submitLabel="Save site"
        onCancel={() => void navigate(paths.firm.site(siteId))}
        onSubmit={({ clientId: _clientId, ...values }, { fail }) =>
          update.mutate(values, {
            onSuccess: () => {
              toast.success('Site saved.');
              void navigate(paths.firm.site(siteId));
            },
            onError: fail,
          })
        }
      />
    </>
  );
}
